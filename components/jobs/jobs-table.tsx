// One page of the jobs list as a table. Column heads are links that sort the list on the
// server (aria-sort says which one and which way); the job's title links to its page.
import Link from 'next/link';
import type { JobRow } from '@/db/queries/jobs';
import { formatMm } from '@/lib/jobs/format';
import { sortHref } from '@/lib/jobs/list-url';
import { HOLD_DOWN_LABELS } from '@/lib/validation/enums';
import { sortDirection, type JobListQuery, type JobSort } from '@/lib/validation/jobs';
import { JobStatusBadge } from './job-status-badge';

interface Column {
  key: string;
  header: string;
  sort?: JobSort;
  numeric?: boolean;
  cell: (job: JobRow) => React.ReactNode;
}

const COLUMNS: Column[] = [
  {
    key: 'title',
    header: 'Job',
    sort: 'title',
    cell: (j) => (
      <Link href={`/jobs/${j.id}`} className="inline-block min-w-52 font-bold text-spruce underline underline-offset-4">
        {j.title}
      </Link>
    ),
  },
  { key: 'customer', header: 'Customer', sort: 'customer', cell: (j) => <span className="inline-block min-w-40">{j.customerName}</span> },
  { key: 'machine', header: 'Machine', sort: 'machine', cell: (j) => j.machineName ?? <span className="text-ink-soft">not set</span> },
  { key: 'material', header: 'Material', cell: (j) => (j.materialName ? <span className="inline-block min-w-36">{j.materialName}</span> : <span className="text-ink-soft">not set</span>) },
  {
    key: 'sheet',
    header: 'Sheet X × Y × T (mm)',
    cell: (j) => <span className="figure whitespace-nowrap">{`${formatMm(j.sheetWidthMm)} × ${formatMm(j.sheetLengthMm)} × ${formatMm(j.sheetThicknessMm)}`}</span>,
  },
  {
    key: 'hold',
    header: 'Hold-down',
    cell: (j) => (
      <>
        {HOLD_DOWN_LABELS[j.holdDown]}
        {j.holdDown === 'vacuum' && j.vacuumKpa !== null ? <span className="figure whitespace-nowrap text-ink-soft"> {formatMm(j.vacuumKpa)} kPa</span> : null}
      </>
    ),
  },
  { key: 'qty', header: 'Qty', sort: 'quantity', numeric: true, cell: (j) => j.quantity },
  { key: 'due', header: 'Due', sort: 'due', cell: (j) => (j.dueDate ? <span className="figure whitespace-nowrap">{j.dueDate}</span> : <span className="text-ink-soft">—</span>) },
  { key: 'status', header: 'Status', sort: 'status', cell: (j) => <span className="whitespace-nowrap"><JobStatusBadge status={j.status} /></span> },
];

function SortHead({ column, query }: { column: Column; query: JobListQuery }) {
  const active = column.sort !== undefined && query.sort === column.sort;
  const direction = sortDirection(query);
  const ariaSort = active ? (direction === 'asc' ? 'ascending' : 'descending') : undefined;
  return (
    <th scope="col" aria-sort={ariaSort} className={`px-4 py-2 font-bold ${column.numeric ? 'text-right' : ''}`}>
      {column.sort ? (
        <Link
          href={sortHref(query, column.sort)}
          className={`inline-flex min-h-target items-center gap-1 underline-offset-4 hover:underline focus-visible:outline-spruce-light ${active ? 'underline decoration-2' : ''}`}
        >
          {column.header}
          <span aria-hidden="true" className="figure text-sm">{active ? (direction === 'asc' ? '▲' : '▼') : '↕'}</span>
          <span className="sr-only">{active ? `, sorted ${direction === 'asc' ? 'ascending' : 'descending'}; press to turn round` : ', press to sort'}</span>
        </Link>
      ) : (
        column.header
      )}
    </th>
  );
}

export function JobsTable({ jobs, query }: { jobs: JobRow[]; query: JobListQuery }) {
  return (
    <div className="overflow-x-auto rounded-md border-2 border-rule bg-panel">
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">Your shop&apos;s jobs</caption>
        <thead className="bg-night text-white">
          <tr>
            {COLUMNS.map((c) => (
              <SortHead key={c.key} column={c} query={query} />
            ))}
          </tr>
        </thead>
        <tbody>
          {jobs.map((job) => (
            <tr key={job.id} className="border-t border-rule-light even:bg-ground">
              {COLUMNS.map((c) => (
                <td key={c.key} className={`px-4 py-3 align-top ${c.numeric ? 'figure text-right' : ''}`}>
                  {c.cell(job)}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
