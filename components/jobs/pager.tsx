// Page links under the jobs list: previous, next, and where the reader is ("Jobs 26–50 of 1000").
import Link from 'next/link';
import { jobsListHref } from '@/lib/jobs/list-url';
import type { JobListQuery } from '@/lib/validation/jobs';

const linkClass = 'inline-flex min-h-target items-center rounded-md border-2 border-rule bg-panel px-4 font-bold hover:bg-ground';

export function Pager({ query, total, pageCount }: { query: JobListQuery; total: number; pageCount: number }) {
  const first = total === 0 ? 0 : (query.page - 1) * query.perPage + 1;
  const last = Math.min(total, query.page * query.perPage);
  return (
    <nav aria-label="Pages of the jobs list" className="mt-4 flex flex-wrap items-center justify-between gap-3">
      <p className="text-ink-soft" data-testid="jobs-range">
        {total === 0 ? 'No jobs' : `Jobs ${first}–${last} of ${total}`} · page {query.page} of {pageCount}
      </p>
      <div className="flex gap-3">
        {query.page > 1 ? (
          <Link rel="prev" href={jobsListHref(query, { page: Math.min(query.page - 1, pageCount) })} className={linkClass}>
            <span aria-hidden="true">←&nbsp;</span>Previous page
          </Link>
        ) : null}
        {query.page < pageCount ? (
          <Link rel="next" href={jobsListHref(query, { page: query.page + 1 })} className={linkClass}>
            Next page<span aria-hidden="true">&nbsp;→</span>
          </Link>
        ) : null}
      </div>
    </nav>
  );
}
