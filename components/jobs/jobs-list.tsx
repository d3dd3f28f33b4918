'use client';
// The jobs table, fetched from GET /api/jobs with SWR and the shared fetcher, with
// its three other states: loading, empty and error (the error's own message).
import useSWR from 'swr';
import { DataTable, type Column } from '@/components/ui/data-table';
import { Notice } from '@/components/ui/notice';
import { Button } from '@/components/ui/button';
import type { AppError } from '@/lib/errors';
import { fetcher } from '@/lib/fetcher';
import { HOLD_DOWN_LABELS, type HoldDown, type JobStatus, type ZZero } from '@/lib/validation/enums';
import { JobStatusBadge } from './job-status-badge';

export interface JobListItem {
  id: number;
  title: string;
  customerName: string;
  materialName: string | null;
  sheetWidthMm: number;
  sheetLengthMm: number;
  sheetThicknessMm: number;
  zZero: ZZero;
  holdDown: HoldDown;
  vacuumKpa: number | null;
  quantity: number;
  status: JobStatus;
}

const mm = (v: number) => (Number.isInteger(v) ? String(v) : v.toFixed(1));

const columns: Column<JobListItem>[] = [
  { key: 'title', header: 'Job', cell: (j) => <span className="font-bold">{j.title}</span> },
  { key: 'customer', header: 'Customer', cell: (j) => j.customerName },
  { key: 'material', header: 'Material', cell: (j) => j.materialName ?? <span className="text-ink-soft">not set</span> },
  {
    key: 'sheet',
    header: 'Sheet W × L × T (mm)',
    cell: (j) => (
      <span className="figure whitespace-nowrap">
        {mm(j.sheetWidthMm)} × {mm(j.sheetLengthMm)} × {mm(j.sheetThicknessMm)}
      </span>
    ),
  },
  {
    key: 'hold',
    header: 'Hold-down',
    cell: (j) => (
      <>
        {HOLD_DOWN_LABELS[j.holdDown]}
        {j.holdDown === 'vacuum' && j.vacuumKpa !== null ? <span className="figure text-ink-soft"> {mm(j.vacuumKpa)} kPa</span> : null}
      </>
    ),
  },
  { key: 'zero', header: 'Z zero', cell: (j) => (j.zZero === 'top' ? 'Top of stock' : 'Table surface') },
  { key: 'qty', header: 'Qty', numeric: true, cell: (j) => j.quantity },
  { key: 'status', header: 'Status', cell: (j) => <span className="whitespace-nowrap"><JobStatusBadge status={j.status} /></span> },
];

export function JobsList() {
  const { data, error, isLoading, mutate } = useSWR<{ jobs: JobListItem[] }, AppError>('/api/jobs', fetcher);

  if (error) {
    return (
      <Notice tone="fault" title="The jobs could not be loaded." role="alert">
        <p>{error.message}</p>
        <Button variant="secondary" className="mt-3" onClick={() => mutate()}>
          Try again
        </Button>
      </Notice>
    );
  }
  if (isLoading || !data) {
    return (
      <div role="status" aria-live="polite" className="flex items-center gap-3 rounded-md border-2 border-dashed border-rule p-6 text-ink-soft">
        <span aria-hidden="true" className="h-5 w-5 animate-spin rounded-full border-4 border-rule-light border-t-spruce" />
        Loading jobs…
      </div>
    );
  }
  if (data.jobs.length === 0) {
    return <Notice tone="note" title="No jobs yet." role="status">A new job appears here as soon as it is created.</Notice>;
  }
  return <DataTable caption="Your shop's jobs" columns={columns} rows={data.jobs} rowKey={(j) => j.id} />;
}
