// Jobs list. The table loads in the browser from GET /api/jobs.
import type { Metadata } from 'next';
import { JobsList } from '@/components/jobs/jobs-list';
import { PageHeader } from '@/components/ui/page-header';
import { guardPage } from '@/lib/auth/page-guard';

export const metadata: Metadata = { title: 'Jobs' };

export default async function JobsPage() {
  await guardPage('jobs');
  return (
    <>
      <PageHeader title="Jobs" lead="All your shop's jobs, with the latest changes at the top." />
      <JobsList />
    </>
  );
}
