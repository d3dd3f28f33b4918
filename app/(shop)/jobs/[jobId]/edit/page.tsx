// Edit a job (admins and programmers) until it is done or cancelled.
import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { JobForm } from '@/components/jobs/job-form';
import { LinkButton } from '@/components/ui/link-button';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { getJob, jobFormOptions } from '@/db/queries/jobs';
import { guardAction } from '@/lib/auth/page-guard';
import { jobFormValues } from '@/lib/jobs/form-values';
import { isEditable } from '@/lib/jobs/status-moves';
import { idSchema } from '@/lib/validation/ids';
import { JOB_STATUS_LABELS } from '@/lib/validation/enums';
import { updateJobAction } from '../../actions';

export const metadata: Metadata = { title: 'Edit job' };

export default async function EditJobPage({ params }: { params: Promise<{ jobId: string }> }) {
  const raw = (await params).jobId;
  const user = await guardAction('jobs:write', `/jobs/${raw}/edit`);
  const id = idSchema.safeParse(raw);
  if (!id.success || !/^\d+$/.test(raw)) notFound();
  const job = await getJob(user.shopId, id.data);
  if (!job) notFound();
  const options = await jobFormOptions(user.shopId, job.machineId);
  return (
    <>
      <PageHeader title={`Edit “${job.title}”`} lead="Changes are listed in the job's history. Estimates made before stay as they were." />
      {isEditable(job.status) ? (
        <JobForm mode="edit" jobId={job.id} options={options} initial={jobFormValues(job)} action={updateJobAction} />
      ) : (
        <Notice tone="note" title={`This job is ${JOB_STATUS_LABELS[job.status].toLowerCase()}, so its record is kept as it was.`} role="status">
          <LinkButton href={`/jobs/${job.id}`} variant="secondary" className="mt-2">
            Back to the job
          </LinkButton>
        </Notice>
      )}
    </>
  );
}
