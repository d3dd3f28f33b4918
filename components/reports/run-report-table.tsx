// The runs report's table: job, program, estimate, actual, actual ÷ estimate, date, operator, and
// whether the run counts. Interrupted, voided and open runs are marked in words (and a glyph)
// in their own column and their ratio is struck through as left out, never only coloured.
import Link from 'next/link';
import { DataTable, type Column } from '@/components/ui/data-table';
import type { RunReportRow } from '@/db/queries/run-reports';
import { formatDuration, formatWhen } from '@/lib/jobs/format';
import { runStanding, STANDING_WORDS } from '@/lib/reports/run-stats';
import { runRatio } from '@/lib/runs/calibration';

const dash = <span aria-label="none">—</span>;

const COLUMNS: Column<RunReportRow>[] = [
  { key: 'date', header: 'Date', cell: (r) => <span className="whitespace-nowrap">{formatWhen(r.startedAt)}</span> },
  {
    key: 'job',
    header: 'Job',
    cell: (r) => (
      <Link className="font-bold text-spruce underline underline-offset-4" href={`/jobs/${r.jobId}`}>
        {r.jobTitle}
      </Link>
    ),
  },
  {
    key: 'program',
    header: 'Program',
    cell: (r) => (
      <span>
        {r.programName} <span className="text-ink-soft">v{r.programVersion}</span>
      </span>
    ),
  },
  { key: 'machine', header: 'Machine', cell: (r) => r.machineName },
  { key: 'estimate', header: 'Estimate', numeric: true, cell: (r) => (r.estimatedSeconds === null ? dash : formatDuration(r.estimatedSeconds)) },
  { key: 'actual', header: 'Actual', numeric: true, cell: (r) => (r.actualSeconds === null ? dash : formatDuration(r.actualSeconds)) },
  {
    key: 'ratio',
    header: 'Actual ÷ estimate',
    numeric: true,
    cell: (r) => {
      const ratio = runRatio(r);
      if (ratio === null) return dash;
      return runStanding(r) === 'counted' ? ratio.toFixed(3) : <s className="text-ink-faint">{ratio.toFixed(3)}</s>;
    },
  },
  { key: 'operator', header: 'Operator', cell: (r) => r.operatorName },
  {
    key: 'standing',
    header: 'In the figures',
    cell: (r) => {
      const s = runStanding(r);
      return (
        <span className={s === 'counted' ? '' : 'font-bold text-caution'} data-standing={s}>
          <span aria-hidden="true">{s === 'counted' ? '✓ ' : '✕ '}</span>
          {STANDING_WORDS[s]}
        </span>
      );
    },
  },
];

export function RunReportTable({ rows }: { rows: RunReportRow[] }) {
  return <DataTable caption="Runs, newest first" columns={COLUMNS} rows={rows} rowKey={(r) => r.id} />;
}
