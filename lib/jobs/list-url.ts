// Links of the jobs list: the current query with one thing changed (a sort, a page), written
// as URL search params without the defaults, so the address stays short and shareable.
import { sortDirection, type JobListQuery, type JobSort } from '@/lib/validation/jobs';

export function jobsListHref(query: JobListQuery, change: Partial<JobListQuery> = {}): string {
  const q = { ...query, ...change };
  const params = new URLSearchParams();
  if (q.status) params.set('status', q.status);
  if (q.customerId) params.set('customerId', String(q.customerId));
  if (q.machineId) params.set('machineId', String(q.machineId));
  if (q.q) params.set('q', q.q);
  if (q.sort !== 'updated') params.set('sort', q.sort);
  if (q.dir && q.dir !== sortDirection({ sort: q.sort })) params.set('dir', q.dir);
  if (q.page > 1) params.set('page', String(q.page));
  if (q.perPage !== 25) params.set('perPage', String(q.perPage));
  const text = params.toString();
  return text ? `/jobs?${text}` : '/jobs';
}

/** The link of a column header: sort by it, or turn the order round if it is the sort already; back to page 1. */
export function sortHref(query: JobListQuery, sort: JobSort): string {
  const current = sortDirection(query);
  if (query.sort === sort) return jobsListHref(query, { sort, dir: current === 'asc' ? 'desc' : 'asc', page: 1 });
  return jobsListHref(query, { sort, dir: undefined, page: 1 });
}
