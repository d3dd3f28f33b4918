// Jobs list: filters, sort and page from the URL, one page of jobs read on the server
// (db/queries/jobs.ts does the filtering in SQL). A bad parameter in a hand-typed URL is named
// above the list and left out, instead of failing the page.
import type { Metadata } from 'next';
import { JobFilters } from '@/components/jobs/job-filters';
import { JobsTable } from '@/components/jobs/jobs-table';
import { Pager } from '@/components/jobs/pager';
import { LinkButton } from '@/components/ui/link-button';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { listFilterChoices, listJobs } from '@/db/queries/jobs';
import { whoMay } from '@/lib/auth/messages';
import { guardPage } from '@/lib/auth/page-guard';
import { canDo } from '@/lib/auth/roles';
import { jobsListHref } from '@/lib/jobs/list-url';
import { fieldErrors } from '@/lib/validation/form';
import { jobListQuerySchema, searchParamsToObject, type JobListQuery } from '@/lib/validation/jobs';

export const metadata: Metadata = { title: 'Jobs' };

type SearchParams = Promise<Record<string, string | string[] | undefined>>;

function readQuery(raw: Record<string, string | undefined>): { query: JobListQuery; errors: Record<string, string[]> } {
  const first = jobListQuerySchema.safeParse(raw);
  if (first.success) return { query: first.data, errors: {} };
  const errors = fieldErrors(first.error);
  const kept = Object.fromEntries(Object.entries(raw).filter(([key]) => !(key in errors)));
  return { query: jobListQuerySchema.parse(kept), errors };
}

export default async function JobsPage({ searchParams }: { searchParams: SearchParams }) {
  const user = await guardPage('jobs');
  const { query, errors } = readQuery(searchParamsToObject(await searchParams));
  const [page, options] = await Promise.all([listJobs(user.shopId, query), listFilterChoices(user.shopId)]);
  const mayCreate = canDo(user.role, 'jobs:write');
  const filtered = Boolean(query.status || query.customerId || query.machineId || query.q);
  const errorList = Object.values(errors).flat();

  return (
    <>
      <PageHeader
        title="Jobs"
        lead="Your shop's jobs. Filter, sort by a column head, and open a job for its programs and estimates."
        actions={mayCreate ? <LinkButton href="/jobs/new">New job</LinkButton> : null}
      />
      <JobFilters query={query} customers={options.customers} machines={options.machines} errors={errors} />
      {errorList.length > 0 ? (
        <div className="mb-4">
          <Notice tone="fault" title="Part of this address could not be used, so it was left out." role="alert">
            <ul>
              {errorList.map((m) => (
                <li key={m}>{m}</li>
              ))}
            </ul>
          </Notice>
        </div>
      ) : null}
      {page.total === 0 ? (
        filtered ? (
          <Notice tone="note" title="No job matches these filters." role="status">
            Change a filter or clear them to see every job.
          </Notice>
        ) : (
          <Notice tone="note" title="No jobs yet." role="status">
            {mayCreate ? 'Create the first one with “New job”.' : `${whoMay('jobs:write', true)} can create a job.`}
          </Notice>
        )
      ) : page.jobs.length === 0 ? (
        <Notice tone="note" title={`There is no page ${query.page}: the list has ${page.pageCount}.`} role="status">
          <a className="font-bold text-spruce underline underline-offset-4" href={jobsListHref(query, { page: page.pageCount })}>
            Go to the last page
          </a>
        </Notice>
      ) : (
        <>
          <JobsTable jobs={page.jobs} query={query} />
          <Pager query={query} total={page.total} pageCount={page.pageCount} />
        </>
      )}
    </>
  );
}
