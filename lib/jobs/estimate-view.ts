// What the job page reads from an estimate: the answer of GET /api/estimates/[estimateId]
// (status, progress, and when done the stored report, which is the CLI's --json), and the
// summaries the page shows of it: findings counted by severity, parts by what holds them.
// Pure, so the summaries are unit-tested without a browser.
import type { EstimateStatus } from '@/lib/validation/enums';
import type { EstimateView as ServerEstimateView } from '@/db/queries/estimates';

export interface ReportFindingView {
  kind: string;
  severity: 'error' | 'warning' | 'info';
  line: number;
  message: string;
  part?: number;
}

export interface ReportPartView {
  id: number;
  order: number;
  bbox: { minX: number; minY: number; maxX: number; maxY: number };
  areaMm2: number;
  holes: number;
  tabs: number;
  skinMm: number;
  held: boolean;
  holdBy: 'tabs' | 'skin' | 'vacuum' | 'tape-glue' | 'none';
  freedAtLine: number | null;
  tool: number;
}

export interface ReportView {
  engine: string;
  file: { name: string; lines: number; units: 'mm' | 'inch' };
  totalSeconds: number;
  calibratedSeconds: number;
  findings: ReportFindingView[];
  parts: ReportPartView[];
  checks?: { errors?: number; warnings?: number; infos?: number; note?: string; holdDownAssumed?: boolean; suppressed?: Record<string, number> };
}

/** GET /api/estimates/:id as the job page reads it: the server's view (db/queries/estimates.ts) with its report. */
export type EstimateView = Pick<
  ServerEstimateView,
  'id' | 'status' | 'programId' | 'programVersion' | 'machineId' | 'machineVersion' | 'engineVersion' | 'computeMs' | 'progress' | 'error'
> & { report?: ReportView };

/** Poll every 1.5 s while the estimate waits or runs; stop once it is done or failed. */
export function pollInterval(status: EstimateStatus | undefined): number {
  return status === 'pending' || status === 'running' ? 1500 : 0;
}

export interface FindingCounts {
  errors: number;
  warnings: number;
  notes: number;
  /** findings counted in the report's checks but not listed (kinds already listed often) */
  unlisted: number;
}

/**
 * Counts by severity. The report's own counts (checks.errors …) cover every finding, listed or
 * not; when they are missing, the listed findings are counted.
 */
export function countFindings(report: ReportView): FindingCounts {
  const listed = { errors: 0, warnings: 0, notes: 0 };
  for (const f of report.findings) {
    if (f.severity === 'error') listed.errors++;
    else if (f.severity === 'warning') listed.warnings++;
    else listed.notes++;
  }
  const c = report.checks;
  const errors = c?.errors ?? listed.errors;
  const warnings = c?.warnings ?? listed.warnings;
  const notes = c?.infos ?? listed.notes;
  return { errors, warnings, notes, unlisted: Math.max(0, errors + warnings + notes - report.findings.length) };
}

export const HELD_BY_WORDS: Record<ReportPartView['holdBy'], string> = {
  vacuum: 'held by the vacuum',
  'tape-glue': 'held by tape and glue',
  tabs: 'held by tabs',
  skin: 'held by an onion skin',
  none: 'held by nothing',
};

export interface HoldSummary {
  count: number;
  unheld: number;
  /** e.g. [{ holdBy: 'vacuum', count: 3 }, { holdBy: 'tabs', count: 1 }], most first */
  groups: { holdBy: ReportPartView['holdBy']; held: boolean; count: number }[];
}

export function summarizeParts(parts: readonly ReportPartView[]): HoldSummary {
  const groups = new Map<string, { holdBy: ReportPartView['holdBy']; held: boolean; count: number }>();
  for (const p of parts) {
    const key = `${p.held}:${p.holdBy}`;
    const g = groups.get(key) ?? { holdBy: p.holdBy, held: p.held, count: 0 };
    g.count++;
    groups.set(key, g);
  }
  return {
    count: parts.length,
    unheld: parts.filter((p) => !p.held).length,
    groups: [...groups.values()].sort((a, b) => Number(a.held) - Number(b.held) || b.count - a.count),
  };
}

/** "4 parts: 3 held by the vacuum, 1 held by nothing". */
export function holdSentence(summary: HoldSummary): string {
  if (summary.count === 0) return 'No parts cut free of the sheet were found.';
  const head = `${summary.count} ${summary.count === 1 ? 'part' : 'parts'}`;
  return `${head}: ${summary.groups.map((g) => `${g.count} ${g.held ? HELD_BY_WORDS[g.holdBy] : 'held by nothing'}`).join(', ')}.`;
}
