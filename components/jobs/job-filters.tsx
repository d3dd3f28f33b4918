// The jobs list's filters as a plain GET form: the choices go into the URL, so a filtered
// list can be bookmarked, shared and reloaded, and the form works without JavaScript. Enter in
// the search box applies everything; the sort stays, the page goes back to 1.
import { Button } from '@/components/ui/button';
import { InputField, SelectField } from '@/components/ui/field';
import { LinkButton } from '@/components/ui/link-button';
import { JOB_STATUS_LABELS, JOB_STATUSES } from '@/lib/validation/enums';
import { JOB_PAGE_SIZES, type JobListQuery } from '@/lib/validation/jobs';

interface Props {
  query: JobListQuery;
  customers: { id: number; name: string }[];
  machines: { id: number; name: string }[];
  errors: Record<string, string[]>;
}

export function JobFilters({ query, customers, machines, errors }: Props) {
  return (
    <form method="get" action="/jobs" role="search" aria-label="Filter jobs" className="mb-6 rounded-md border-2 border-rule bg-panel p-4">
      {query.sort !== 'updated' ? <input type="hidden" name="sort" value={query.sort} /> : null}
      {query.dir ? <input type="hidden" name="dir" value={query.dir} /> : null}
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-[2fr_1fr_1fr_1fr_auto]">
        <InputField id="filter-q" name="q" type="search" label="Search" hint="Words in the title, customer or notes." defaultValue={query.q ?? ''} errors={errors.q} />
        <SelectField
          id="filter-status"
          name="status"
          label="Status"
          defaultValue={query.status ?? ''}
          errors={errors.status}
          options={[{ value: '', label: 'Any status' }, ...JOB_STATUSES.map((s) => ({ value: s, label: JOB_STATUS_LABELS[s] }))]}
        />
        <SelectField
          id="filter-customer"
          name="customerId"
          label="Customer"
          defaultValue={query.customerId ? String(query.customerId) : ''}
          errors={errors.customerId}
          options={[{ value: '', label: 'Any customer' }, ...customers.map((c) => ({ value: String(c.id), label: c.name }))]}
        />
        <SelectField
          id="filter-machine"
          name="machineId"
          label="Machine"
          defaultValue={query.machineId ? String(query.machineId) : ''}
          errors={errors.machineId}
          options={[{ value: '', label: 'Any machine' }, ...machines.map((m) => ({ value: String(m.id), label: m.name }))]}
        />
        <SelectField
          id="filter-per-page"
          name="perPage"
          label="Jobs a page"
          defaultValue={String(query.perPage)}
          errors={errors.perPage}
          options={JOB_PAGE_SIZES.map((n) => ({ value: String(n), label: String(n) }))}
        />
      </div>
      <div className="mt-4 flex flex-wrap gap-3">
        <Button type="submit">Show jobs</Button>
        <LinkButton href="/jobs" variant="secondary">
          Clear filters
        </LinkButton>
      </div>
    </form>
  );
}
