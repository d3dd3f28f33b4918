// The figures beside the charts: per machine and overall, how many runs count, the median actual
// ÷ estimate with its quartiles, and how many runs were left out and why.
import { DataTable, type Column } from '@/components/ui/data-table';
import type { MachineSummary, RatioSummary } from '@/lib/reports/run-stats';

type Row = RatioSummary & { key: string; label: string };

const f3 = (v: number | null) => (v === null ? '—' : v.toFixed(3));

function leftOutWords(s: RatioSummary): string {
  const parts = [
    s.leftOut.interrupted ? `${s.leftOut.interrupted} interrupted` : '',
    s.leftOut.voided ? `${s.leftOut.voided} voided` : '',
    s.leftOut.open ? `${s.leftOut.open} still open` : '',
    s.leftOut['no-estimate'] ? `${s.leftOut['no-estimate']} without an estimate` : '',
  ].filter(Boolean);
  return parts.length ? parts.join(', ') : 'none';
}

const COLUMNS: Column<Row>[] = [
  { key: 'label', header: 'Machine', cell: (r) => <span className={r.key === 'all' ? 'font-bold' : ''}>{r.label}</span> },
  { key: 'counted', header: 'Runs counted', numeric: true, cell: (r) => r.counted },
  { key: 'median', header: 'Median actual ÷ estimate', numeric: true, cell: (r) => f3(r.median) },
  { key: 'iqr', header: 'Middle half (Q1–Q3)', numeric: true, cell: (r) => (r.q1 === null ? '—' : `${f3(r.q1)}–${f3(r.q3)}`) },
  { key: 'left', header: 'Left out', cell: (r) => leftOutWords(r) },
];

export function RatioFigures({ machines, overall }: { machines: MachineSummary[]; overall: RatioSummary }) {
  const rows: Row[] = [...machines.map((m) => ({ ...m, key: String(m.machineId), label: m.machineName })), ...(machines.length > 1 ? [{ ...overall, key: 'all', label: 'All machines' }] : [])];
  return <DataTable caption="Actual ÷ estimate per machine" columns={COLUMNS} rows={rows} rowKey={(r) => r.key} />;
}
