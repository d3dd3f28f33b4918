// Addresses of the runs report and its export with the current filters, for links and the pager.
import type { RunListQuery } from '@/lib/validation/runs';

type Filters = Partial<RunListQuery>;

function params(query: Filters, withPage: boolean): URLSearchParams {
  const p = new URLSearchParams();
  const keys = ['machineId', 'operatorId', 'jobId', 'programId', 'version', 'status', 'from', 'to'] as const;
  for (const k of keys) if (query[k] !== undefined) p.set(k, String(query[k]));
  if (withPage) {
    if (query.perPage !== undefined && query.perPage !== 25) p.set('perPage', String(query.perPage));
    if (query.page !== undefined && query.page > 1) p.set('page', String(query.page));
  }
  return p;
}

export function runsReportHref(query: Filters, change: Filters = {}): string {
  const s = params({ ...query, ...change }, true).toString();
  return s ? `/runs?${s}` : '/runs';
}

export function runsExportHref(query: Filters): string {
  const s = params(query, false).toString();
  return s ? `/api/exports/runs.csv?${s}` : '/api/exports/runs.csv';
}
