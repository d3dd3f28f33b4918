// One estimate from one program text: interpret (lib/gcode), plan (lib/kinematics), check
// (lib/analysis), assembled into the report the CLI prints and the server will store. Pure, so
// the CLI, a Node worker thread and the browser worker give the same answer for the same input.
// The analysis's polygon library is WebAssembly loaded asynchronously: a caller awaits
// loadAnalysis() (lib/analysis) once before the first runEstimate(), which stays synchronous.
import { analyze, type AnalysisResult, type HoldDownMethod } from '../analysis';
import { interpret, type InterpretResult } from '../gcode';
import { buildEstimateReport, estimate, stockTopZ, type Estimate, type EstimateReport } from '../kinematics';
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

export function runEstimate(text: string, profile: MachineProfile, job: EstimateJob, file: EstimateFile): EstimateRun {
  const interpretation = interpret(text, { home: profile.home });
  const est = estimate(interpretation.moves, profile, { stockTopZ: stockTopZ(job.zero, job.sheet?.thicknessMm) });
  const checks = analyze(interpretation.moves, {
    sheet: job.sheet,
    zZero: job.zero,
    // the cautious reading when no hold-down was named: no part is called held by one
    holdDown: job.hold ?? 'tabs',
    vacuumKpa: job.vacuumKpa ?? undefined,
    tools: profile.tools.map((t) => ({ number: t.number, diameter: t.diameter, flutes: t.flutes, kind: t.kind })),
    machine: { travel: profile.travel, maxFeed: profile.maxFeed },
  });
  // the settings are the shop's, not the program's: they stay out of the per-program report
  const { settings: _settings, ...summary } = checks.summary;
  void _settings;
  const report = buildEstimateReport({
    file: { name: file.name, sha256: file.sha256, lines: interpretation.facts.lineCount, units: interpretation.facts.units },
    estimate: est,
    diagnostics: interpretation.diagnostics,
    extraFindings: checks.findings,
    parts: checks.parts,
    checks: { ...summary, holdDownAssumed: job.hold === null, plungePoints: checks.plungePoints.toArray() },
  });
  return { report, interpretation, estimate: est, checks };
}
