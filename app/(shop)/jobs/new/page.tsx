// Create a job (admins and programmers): the form starts on the shop's first machine.
import type { Metadata } from 'next';
import { JobForm } from '@/components/jobs/job-form';
import { LinkButton } from '@/components/ui/link-button';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { jobFormOptions } from '@/db/queries/jobs';
import { guardAction } from '@/lib/auth/page-guard';
import { newJobValues } from '@/lib/jobs/form-values';
import { createJobAction } from '../actions';

export const metadata: Metadata = { title: 'New job' };

export default async function NewJobPage() {
  const user = await guardAction('jobs:write', '/jobs/new');
  const options = await jobFormOptions(user.shopId);
  return (
    <>
      <PageHeader title="New job" lead="Who it is for, which machine and sheet, and how the parts are held. Programs are uploaded on the job's page." />
      {options.customers.length === 0 ? (
        <Notice tone="caution" title="Add a customer first." role="status">
          A job is always for a customer.{' '}
          <LinkButton href="/customers" variant="secondary" className="mt-2">
            Go to customers
          </LinkButton>
        </Notice>
      ) : (
        <JobForm mode="create" options={options} initial={newJobValues(options)} action={createJobAction} />
      )}
    </>
  );
}
