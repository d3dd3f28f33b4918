// The estimated-vs-actual figures of the runs report and the dashboard: which runs count,
// the chart points (actual against estimated, ratio over time), the summary (median and
// quartiles of actual ÷ estimate) overall and per machine. Pure; the median and quartiles
// are lib/runs/calibration.ts's (simple-statistics, Hyndman & Fan type 7), and the rule of
// which runs count is its countsInStatistics: interrupted, voided and open runs, and runs
// without an estimate, are shown but left out of every figure.
import { countsInStatistics, runRatio, spreadOf, type RunForStats } from '@/lib/runs/calibration';

/** One run as the report reads it: the calibration's fields plus what the table and charts name. */
export interface ReportRun extends RunForStats {
  machineId: number;
  machineName: string;
  startedAt: Date | string;
}

/** How a run appears in the report: counted, or why not. */
export type RunStanding = 'counted' | 'voided' | 'interrupted' | 'open' | 'no-estimate';

export function runStanding(r: RunForStats): RunStanding {
  if (r.voided) return 'voided';
  if (r.interrupted) return 'interrupted';
  if (r.finishedAt === null || r.actualSeconds === null) return 'open';
  if (!countsInStatistics(r)) return 'no-estimate';
  return 'counted';
}

export const STANDING_WORDS: Record<RunStanding, string> = {
  counted: 'Counted',
  voided: 'Voided: left out',
  interrupted: 'Interrupted: left out',
  open: 'Still open: left out',
  'no-estimate': 'No estimate: left out',
};

export interface ScatterPoint {
  id: number;
  machineId: number;
  estimatedS: number;
  actualS: number;
  ratio: number;
  standing: RunStanding;
}

/**
 * Points of the actual-against-estimated chart: every run with both times, counted or not
 * (the chart marks those left out with their own shape), so nothing is hidden from the reader.
 */
export function scatterPoints(runs: readonly ReportRun[]): ScatterPoint[] {
  const out: ScatterPoint[] = [];
  for (const r of runs) {
    const ratio = runRatio(r);
    if (ratio === null || r.actualSeconds === null || r.estimatedSeconds === null) continue;
    out.push({ id: r.id, machineId: r.machineId, estimatedS: r.estimatedSeconds, actualS: r.actualSeconds, ratio, standing: runStanding(r) });
  }
  return out;
}

export interface RatioPoint {
  id: number;
  machineId: number;
  /** ms since the epoch of the run's end (the chart's time axis) */
  atMs: number;
  ratio: number;
  standing: RunStanding;
}

/** Points of the ratio-over-time chart, oldest first, by when each run ended. */
export function ratioPoints(runs: readonly ReportRun[]): RatioPoint[] {
  const out: RatioPoint[] = [];
  for (const r of runs) {
    const ratio = runRatio(r);
    if (ratio === null || r.finishedAt === null) continue;
    out.push({ id: r.id, machineId: r.machineId, atMs: new Date(r.finishedAt).getTime(), ratio, standing: runStanding(r) });
  }
  return out.sort((a, b) => a.atMs - b.atMs || a.id - b.id);
}

export interface RatioSummary {
  /** runs that count */
  counted: number;
  /** runs shown but left out, by reason */
  leftOut: Record<Exclude<RunStanding, 'counted'>, number>;
  median: number | null;
  q1: number | null;
  q3: number | null;
  /** Σ actual ÷ Σ estimate of the counted runs: the factor that would have made the total right */
  totalRatio: number | null;
}

export function ratioSummary(runs: readonly RunForStats[]): RatioSummary {
  const leftOut = { voided: 0, interrupted: 0, open: 0, 'no-estimate': 0 };
  const ratios: number[] = [];
  let actual = 0;
  let estimated = 0;
  for (const r of runs) {
    const standing = runStanding(r);
    if (standing !== 'counted') {
      leftOut[standing]++;
      continue;
    }
    ratios.push(r.actualSeconds! / r.estimatedSeconds!);
    actual += r.actualSeconds!;
    estimated += r.estimatedSeconds!;
  }
  if (ratios.length === 0) return { counted: 0, leftOut, median: null, q1: null, q3: null, totalRatio: null };
  const s = spreadOf(ratios);
  return { counted: ratios.length, leftOut, median: s.median, q1: s.q1, q3: s.q3, totalRatio: actual / estimated };
}

export interface MachineSummary extends RatioSummary {
  machineId: number;
  machineName: string;
}

/** The summary per machine, in machine-name order; machines with runs only. */
export function summaryByMachine(runs: readonly ReportRun[]): MachineSummary[] {
  const groups = new Map<number, { name: string; runs: ReportRun[] }>();
  for (const r of runs) {
    const g = groups.get(r.machineId) ?? { name: r.machineName, runs: [] };
    g.runs.push(r);
    groups.set(r.machineId, g);
  }
  return [...groups.entries()]
    .map(([machineId, g]) => ({ machineId, machineName: g.name, ...ratioSummary(g.runs) }))
    .sort((a, b) => a.machineName.localeCompare(b.machineName) || a.machineId - b.machineId);
}

/** The runs that ended in the `days` days before `now` (the dashboard's last 30 days). */
export function endedWithin(runs: readonly ReportRun[], now: Date, days: number): ReportRun[] {
  const from = now.getTime() - days * 86_400_000;
  return runs.filter((r) => r.finishedAt !== null && new Date(r.finishedAt).getTime() > from && new Date(r.finishedAt).getTime() <= now.getTime());
}
