// The estimate as one plain JSON object: what the CLI prints with --json and what the server
// stores with a job. Kept in one place so that every consumer gets the same fields; the
// through-cut analysis adds its findings and parts through `extraFindings` and `parts`.
// Every key whose value has a unit names it (totalSeconds, distanceMm, feedDistanceMm,
// commandedMmPerMin); a finding's message is a full sentence and leaves its own line number to
// the `line` field (0: the whole program).

import type { Diagnostic, Severity } from '../gcode/move-list';
import type { Estimate } from './types';
import { ENGINE_VERSION } from './version';

export interface ReportFinding {
  kind: string;
  severity: Severity;
  line: number;
  message: string;
  /** the part a through-cut finding concerns */
  part?: number;
}

export interface ReportInput {
  file: { name: string; sha256: string; lines: number; units: 'mm' | 'inch' };
  estimate: Estimate;
  /** the interpreter's diagnostics; their code becomes the finding's kind */
  diagnostics: readonly Diagnostic[];
  /** findings of other checks (through-cut analysis), appended after the diagnostics */
  extraFindings?: readonly ReportFinding[];
  /** parts found by the through-cut analysis, passed through as they are */
  parts?: readonly unknown[];
  /** the through-cut analysis summary and plunge points, passed through as they are */
  checks?: unknown;
}

export interface EstimateReport {
  engine: string;
  file: { name: string; sha256: string; lines: number; units: 'mm' | 'inch' };
  totalSeconds: number;
  calibratedSeconds: number;
  breakdownSeconds: { cutting: number; air: number; rapid: number; plunge: number; dwell: number; toolChange: number; spindle: number };
  programStops: number;
  moves: number;
  distanceMm: { feed: number; rapid: number };
  tools: { tool: number; seconds: number; feedDistanceMm: number }[];
  /** cutting moves only: the feed asked for and the feed reached, and the share of time lost */
  cuttingFeed: { commandedMmPerMin: number; achievedMmPerMin: number; lostShare: number };
  findings: ReportFinding[];
  parts: unknown[];
  checks?: unknown;
}

/** Rounds for output only: µs for times, nm for distances, keeps the JSON stable and short. */
export const r6 = (v: number) => Math.round(v * 1e6) / 1e6;
const r4 = (v: number) => Math.round(v * 10000) / 10000;

export function buildEstimateReport(input: ReportInput): EstimateReport {
  const e = input.estimate;
  const b = e.breakdownSeconds;
  const findings: ReportFinding[] = input.diagnostics.map((d) => ({ kind: d.code, severity: d.severity, line: d.line, message: d.message }));
  if (input.extraFindings) findings.push(...input.extraFindings);
  // one list in program order, the way a programmer reads it against the file (stable sort:
  // findings of one line keep the order their checks gave them); whole-program ones (line 0) first
  findings.sort((f, g) => f.line - g.line);
  return {
    engine: ENGINE_VERSION,
    file: { ...input.file },
    totalSeconds: r6(e.totalSeconds),
    calibratedSeconds: r6(e.calibratedSeconds),
    breakdownSeconds: {
      cutting: r6(b.cutting),
      air: r6(b.air),
      rapid: r6(b.rapid),
      plunge: r6(b.plunge),
      dwell: r6(b.dwell),
      toolChange: r6(b.toolChange),
      spindle: r6(b.spindle),
    },
    programStops: e.programStops,
    moves: e.moves,
    distanceMm: { feed: r6(e.distanceMm.feed), rapid: r6(e.distanceMm.rapid) },
    tools: e.tools.map((t) => ({ tool: t.tool, seconds: r6(t.seconds), feedDistanceMm: r6(t.feedDistanceMm) })),
    cuttingFeed: {
      commandedMmPerMin: r6(e.cuttingFeed.commandedMmPerMin),
      achievedMmPerMin: r6(e.cuttingFeed.achievedMmPerMin),
      lostShare: r4(e.cuttingFeed.lostShare),
    },
    findings,
    parts: input.parts ? [...input.parts] : [],
    ...(input.checks === undefined ? {} : { checks: input.checks }),
  };
}
