// Calibration of a machine's time factor from its runs (issue 15, PRODUCT.md: Learn).
// The suggestion is the median of actual ÷ uncalibrated estimate over the machine's last N
// uninterrupted, not voided runs, with the interquartile range beside it. The median and
// quartiles are simple-statistics' (linear interpolation between order statistics,
// Hyndman & Fan 1996 type 7, numpy's and R's default), so one long or short run moves the
// suggestion little. Fewer runs than the shop's minimum: no suggestion, and the note says why.
import { median, quantileSorted } from 'simple-statistics';

export interface RunForStats {
  id: number;
  /** seconds the timer ran (or typed for a run entered by hand); null while open */
  actualSeconds: number | null;
  /** the machine time of the estimate the run is measured against, before any time factor, for the whole run */
  estimatedSeconds: number | null;
  interrupted: boolean;
  voided: boolean;
  /** when the run ended; the order for "the last N" */
  finishedAt: Date | string | null;
}

/** A run counts in the statistics when it finished uninterrupted, is not voided, and has both times. */
export function countsInStatistics(r: RunForStats): boolean {
  return !r.voided && !r.interrupted && r.finishedAt !== null && r.actualSeconds !== null && r.actualSeconds > 0 && r.estimatedSeconds !== null && r.estimatedSeconds > 0;
}

/** actual ÷ estimate, or null for a run without both. */
export function runRatio(r: Pick<RunForStats, 'actualSeconds' | 'estimatedSeconds'>): number | null {
  if (r.actualSeconds === null || r.estimatedSeconds === null || r.estimatedSeconds <= 0) return null;
  return r.actualSeconds / r.estimatedSeconds;
}

export interface Spread {
  median: number;
  q1: number;
  q3: number;
  /** q3 − q1 */
  iqr: number;
}

/** Median and quartiles of a non-empty list. */
export function spreadOf(values: readonly number[]): Spread {
  if (values.length === 0) throw new Error('the spread of no values is undefined');
  const sorted = [...values].sort((a, b) => a - b);
  const q1 = quantileSorted(sorted, 0.25);
  const q3 = quantileSorted(sorted, 0.75);
  return { median: median(sorted), q1, q3, iqr: q3 - q1 };
}

export interface Calibration {
  /** the suggested time factor, rounded to 3 decimals; null below the minimum */
  suggestedFactor: number | null;
  /** how many runs the figures come from */
  runs: number;
  /** the interquartile range of the ratios (q1, q3 and their difference), null without runs */
  iqr: { q1: number; q3: number; range: number } | null;
  minimumRuns: number;
  /** the runs the figures used, newest first */
  runIds: number[];
  message: string;
}

const round3 = (v: number) => Math.round(v * 1000) / 1000;
const pct = (factor: number) => Math.round(Math.abs(factor - 1) * 100);

/** Words for what a factor means, e.g. "runs take about 12 % longer than estimated". */
export function factorInWords(factor: number): string {
  const p = pct(factor);
  if (p === 0) return 'runs take about as long as estimated';
  return factor > 1 ? `runs take about ${p} % longer than estimated` : `runs take about ${p} % less time than estimated`;
}

export interface CalibrationSettings {
  /** how many of the latest counting runs to use (shop_settings.calibration_runs) */
  lastRuns: number;
  /** how many it needs before suggesting (shop_settings.calibration_min_runs) */
  minimumRuns: number;
  /** the machine's time factor now, for the note */
  currentFactor?: number;
}

export function calibrate(all: readonly RunForStats[], settings: CalibrationSettings): Calibration {
  const counting = all
    .filter(countsInStatistics)
    .sort((a, b) => new Date(b.finishedAt!).getTime() - new Date(a.finishedAt!).getTime() || b.id - a.id)
    .slice(0, Math.max(1, settings.lastRuns));
  const ratios = counting.map((r) => r.actualSeconds! / r.estimatedSeconds!);
  const base = { runs: counting.length, minimumRuns: settings.minimumRuns, runIds: counting.map((r) => r.id) };
  const spread = ratios.length > 0 ? spreadOf(ratios) : null;
  const iqr = spread ? { q1: round3(spread.q1), q3: round3(spread.q3), range: round3(spread.iqr) } : null;
  if (!spread || counting.length < settings.minimumRuns) {
    const missing = settings.minimumRuns - counting.length;
    return {
      ...base,
      suggestedFactor: null,
      iqr,
      message: `${counting.length === 0 ? 'No' : `Only ${counting.length}`} finished, uninterrupted run${counting.length === 1 ? '' : 's'} with an estimate: a suggestion needs at least ${settings.minimumRuns}, so ${missing} more.`,
    };
  }
  const factor = round3(spread.median);
  const lead = `Over the last ${counting.length} uninterrupted runs, ${factorInWords(spread.median)} (median actual ÷ estimate ${factor.toFixed(3)}).`;
  const band = `Half of these runs fall between ${iqr!.q1.toFixed(3)} and ${iqr!.q3.toFixed(3)}${iqr!.range > 0.2 ? ': a wide spread, so look at the runs before trusting the factor' : ''}.`;
  const now =
    settings.currentFactor === undefined
      ? ''
      : Math.abs(settings.currentFactor - factor) < 0.0005
        ? ` The machine already uses ${factor.toFixed(3)}.`
        : ` Applying it sets the time factor from ${settings.currentFactor.toFixed(3)} to ${factor.toFixed(3)} in a new machine version; quotes already made keep their figures.`;
  return { ...base, suggestedFactor: factor, iqr, message: `${lead} ${band}${now}` };
}
