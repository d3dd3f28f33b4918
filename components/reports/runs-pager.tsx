// Page links under the runs table: previous, next, and where the reader is ("Runs 26–50 of 120").
import Link from 'next/link';
import { runsReportHref } from '@/lib/reports/runs-url';
import type { RunListQuery } from '@/lib/validation/runs';

const linkClass = 'inline-flex min-h-target items-center rounded-md border-2 border-rule bg-panel px-4 font-bold hover:bg-ground';

export function RunsPager({ query, total, pageCount }: { query: RunListQuery; total: number; pageCount: number }) {
  const first = total === 0 ? 0 : (query.page - 1) * query.perPage + 1;
  const last = Math.min(total, query.page * query.perPage);
  return (
    <nav aria-label="Pages of the runs table" className="mt-4 flex flex-wrap items-center justify-between gap-3">
      <p className="text-ink-soft" data-testid="runs-range">
        {total === 0 ? 'No runs' : `Runs ${first}–${last} of ${total}`} · page {query.page} of {pageCount}
      </p>
      <div className="flex gap-3">
        {query.page > 1 ? (
          <Link rel="prev" href={runsReportHref(query, { page: Math.min(query.page - 1, pageCount) })} className={linkClass}>
            <span aria-hidden="true">←&nbsp;</span>Previous page
          </Link>
        ) : null}
        {query.page < pageCount ? (
          <Link rel="next" href={runsReportHref(query, { page: query.page + 1 })} className={linkClass}>
            Next page<span aria-hidden="true">&nbsp;→</span>
          </Link>
        ) : null}
      </div>
    </nav>
  );
}
