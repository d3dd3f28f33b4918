// Links of the jobs list: they must parse back (URLSearchParams, WHATWG URL Standard
// §6 "application/x-www-form-urlencoded") into the same query through the list's own schema,
// and leave out what the schema would default anyway.
import { describe, expect, it } from 'vitest';
import { jobsListHref, sortHref } from '@/lib/jobs/list-url';
import { jobListQuerySchema, searchParamsToObject, sortDirection } from '@/lib/validation/jobs';

const parseHref = (href: string) => jobListQuerySchema.parse(searchParamsToObject(new URL(href, 'http://kerfcast.invalid').searchParams));

describe('jobsListHref', () => {
  it('is /jobs for the default list', () => {
    expect(jobsListHref(jobListQuerySchema.parse({}))).toBe('/jobs');
  });

  it('round-trips filters, text with spaces and & and the page', () => {
    const query = jobListQuerySchema.parse({ status: 'scheduled', customerId: '4', machineId: '2', q: 'brackets & sides', sort: 'due', page: '2', perPage: '100' });
    expect(parseHref(jobsListHref(query))).toEqual(query);
  });
});

describe('sortHref', () => {
  it('sorts by a new column from page 1 in its natural order, and turns the order round on the second press', () => {
    const query = jobListQuerySchema.parse({ page: '4' });
    const byTitle = parseHref(sortHref(query, 'title'));
    expect(byTitle).toMatchObject({ sort: 'title', page: 1 });
    expect(sortDirection(byTitle)).toBe('asc');
    const turned = parseHref(sortHref(byTitle, 'title'));
    expect(sortDirection(turned)).toBe('desc');
    expect(sortDirection(parseHref(sortHref(turned, 'title')))).toBe('asc');
  });
});
