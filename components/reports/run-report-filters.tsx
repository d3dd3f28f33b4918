// The runs report's filters as a plain GET form (the choices go into the URL, so a filtered
// report can be bookmarked and works without JavaScript): machine, operator, status, the days
// the runs started (UTC), and rows a page.
import { Button } from '@/components/ui/button';
import { InputField, SelectField } from '@/components/ui/field';
import { LinkButton } from '@/components/ui/link-button';
import { RUN_STATUSES } from '@/lib/validation/enums';
import { RUN_PAGE_SIZES, type RunListQuery } from '@/lib/validation/runs';

const STATUS_LABELS: Record<(typeof RUN_STATUSES)[number], string> = { running: 'Running', paused: 'Paused', finished: 'Finished', voided: 'Voided' };

interface Props {
  query: RunListQuery;
  machines: { id: number; name: string }[];
  operators: { id: number; name: string }[];
  errors: Record<string, string[]>;
}

export function RunReportFilters({ query, machines, operators, errors }: Props) {
  return (
    <form method="get" action="/runs" role="search" aria-label="Filter runs" className="mb-6 rounded-md border-2 border-rule bg-panel p-4">
      {query.jobId ? <input type="hidden" name="jobId" value={query.jobId} /> : null}
      {query.programId ? <input type="hidden" name="programId" value={query.programId} /> : null}
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-6">
        <SelectField
          id="runs-machine"
          name="machineId"
          label="Machine"
          defaultValue={query.machineId ? String(query.machineId) : ''}
          errors={errors.machineId}
          options={[{ value: '', label: 'Every machine' }, ...machines.map((m) => ({ value: String(m.id), label: m.name }))]}
        />
        <SelectField
          id="runs-operator"
          name="operatorId"
          label="Operator"
          defaultValue={query.operatorId ? String(query.operatorId) : ''}
          errors={errors.operatorId}
          options={[{ value: '', label: 'Anyone' }, ...operators.map((o) => ({ value: String(o.id), label: o.name }))]}
        />
        <SelectField
          id="runs-status"
          name="status"
          label="Status"
          defaultValue={query.status ?? ''}
          errors={errors.status}
          options={[{ value: '', label: 'Any status' }, ...RUN_STATUSES.map((s) => ({ value: s, label: STATUS_LABELS[s] }))]}
        />
        <InputField id="runs-from" name="from" type="date" label="Started from" hint="Day, UTC" defaultValue={query.from ?? ''} errors={errors.from} />
        <InputField id="runs-to" name="to" type="date" label="Started to" hint="Day, UTC, included" defaultValue={query.to ?? ''} errors={errors.to} />
        <SelectField
          id="runs-per-page"
          name="perPage"
          label="Runs a page"
          defaultValue={String(query.perPage)}
          errors={errors.perPage}
          options={RUN_PAGE_SIZES.map((n) => ({ value: String(n), label: String(n) }))}
        />
      </div>
      <div className="mt-4 flex flex-wrap gap-3">
        <Button type="submit">Show runs</Button>
        <LinkButton href="/runs" variant="secondary">
          Clear filters
        </LinkButton>
      </div>
    </form>
  );
}
