// One estimate from one program text: interpret (lib/gcode), plan (lib/kinematics), check
// (lib/analysis), assembled into the report the CLI prints and the server will store. Pure, so
// the CLI, a Node worker thread and the browser worker give the same answer for the same input.
// The analysis's polygon library is WebAssembly loaded asynchronously: a caller awaits
// loadAnalysis() (lib/analysis) once before the first runEstimate(), which stays synchronous.
import { analyze, type AnalysisResult, type HoldDownMethod } from '../analysis';
import { interpret, type InterpretResult } from '../gcode';
import { buildEstimateReport, estimate, stockTopZ, type Estimate, type EstimateReport } from '../kinematics';
import { r6 } from '../kinematics/estimate-report';
import type { MachineProfile } from '../validation/machine-profile';

export interface EstimateJob {
  /** W × L × T in mm; null when the sheet is not known (through-cut checks are then skipped) */
  sheet: { widthMm: number; lengthMm: number; thicknessMm: number } | null;
  zero: 'top' | 'table';
  /** null: nothing named, so only what the program leaves (tabs, skin) counts as holding a part */
  hold: HoldDownMethod | null;
  vacuumKpa: number | null;
}

export interface EstimateFile {
  name: string;
  sha256: string;
}

export interface EstimateRun {
  report: EstimateReport;
  interpretation: InterpretResult;
  estimate: Estimate;
  checks: AnalysisResult;
}

/** The stages runEstimate has finished, in order; the server's worker turns them into progress. */
export type EstimateStage = 'interpreted' | 'planned' | 'checked';

/** Finer progress inside the stages (the browser worker's bar): lines interpreted, moves planned. */
export interface EstimateProgress {
  onLines?: (linesDone: number, totalLines: number) => void;
  onMoves?: (movesDone: number, totalMoves: number) => void;
}

export function runEstimate(
  text: string,
  profile: MachineProfile,
  job: EstimateJob,
  file: EstimateFile,
  onStage?: (stage: EstimateStage) => void,
  progress?: EstimateProgress,
): EstimateRun {
  const interpretation = interpret(text, { home: profile.homeMm, ...(progress?.onLines ? { onProgress: progress.onLines } : {}) });
  onStage?.('interpreted');
  const est = estimate(interpretation.moves, profile, {
    stockTopZ: stockTopZ(job.zero, job.sheet?.thicknessMm),
    ...(progress?.onMoves ? { onProgress: progress.onMoves } : {}),
  });
  onStage?.('planned');
  const checks = analyze(interpretation.moves, {
    sheet: job.sheet,
    zZero: job.zero,
    // null: the cautious reading, no part is called held by a hold-down nobody named
    holdDown: job.hold,
    vacuumKpa: job.vacuumKpa ?? undefined,
    tools: profile.tools.map((t) => ({ number: t.number, diameterMm: t.diameterMm, flutes: t.flutes, kind: t.kind })),
    machine: { travelMm: profile.travelMm, maxFeedMmPerMin: profile.maxFeedMmPerMin },
  });
  onStage?.('checked');
  // the settings are the shop's, not the program's: they stay out of the per-program report
  const { settings: _settings, ...summary } = checks.summary;
  void _settings;
  const report = buildEstimateReport({
    file: { name: file.name, sha256: file.sha256, lines: interpretation.facts.lineCount, units: interpretation.facts.units },
    estimate: est,
    diagnostics: interpretation.diagnostics,
    extraFindings: checks.findings,
    // lengths rounded to the nm like every other length in the report
    parts: checks.parts.map((p) => ({ ...p, perimeterMm: r6(p.perimeterMm) })),
    checks: {
      ...summary,
      // the counts cover every finding listed, the interpreter's as well as the checks' own
      ...countBySeverity(interpretation.diagnostics, checks.findings),
      holdDownAssumed: job.hold === null,
      plungePoints: checks.plungePoints.toArray(),
    },
  });
  return { report, interpretation, estimate: est, checks };
}

function countBySeverity(...lists: ReadonlyArray<{ severity: string }>[]): { errors: number; warnings: number; infos: number } {
  const n = { errors: 0, warnings: 0, infos: 0 };
  for (const list of lists) {
    for (const f of list) {
      if (f.severity === 'error') n.errors++;
      else if (f.severity === 'warning') n.warnings++;
      else n.infos++;
    }
  }
  return n;
}
