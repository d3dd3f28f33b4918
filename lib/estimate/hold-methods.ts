// The through-cut analysis once per hold-down method, for the hold-down comparison
// (lib/holddown/compare.ts): vacuum at the job's level and at the machine's own level, tape and
// glue, screws or clamps, the program's own tabs, onion skin. Pure, like runEstimate: it takes
// the move list the estimate already interpreted (nothing is interpreted or planned again)
// and calls the analysis's public analyze() with only the hold-down changed; the estimate's
// own analysis is reused for the method the job names. The part geometry is the same under
// every method, so it is kept once; each method keeps what holds each part and its hold-down
// findings (unheld parts, loose slugs, sheet lift).
//
// Run only as far as needed: a whole analysis per method doubled the estimate of the
// 1,000,000-line nest (2.4 s → 5.4 s). Tape and glue, tabs and onion skin add nothing the
// analysis of screws or clamps does not already decide, by the engine's own hold rules
// (lib/analysis/checks/hold.ts, sheet-lift.ts): for none of clamps, tabs and skin does the
// hold-down hold a freed part or slug, so their verdicts are the same and only the reason's
// words differ (taken from the engine's freedPieceHold); sheet lift is found for clamps and
// tabs alike, never for skin; tape and glue holds every freed part and slug and lifts no
// sheet. Those three are therefore derived from the clamps analysis (or the job's own, when
// the job is held by clamps or tabs), and tests/unit/estimate/hold-methods.test.ts checks
// every derived method against a full analysis of it, so a change of the engine's rules shows.
import { freedPieceHold } from '../analysis/checks/hold';
import { analyze, resolveSettings, type AnalysisInput, type AnalysisResult, type HoldDownMethod } from '../analysis';
import type { MoveList } from '../gcode/move-list';
import { HOLD_METHODS_DOC_VERSION, type HoldFinding, type HoldMethodAnalysis, type HoldMethodsDoc, type HoldOptionId } from '../holddown/types';
import type { MachineProfile } from '../validation/machine-profile';
import type { EstimateJob } from './run-estimate';

/** the findings a hold-down method changes; every other finding is the program's whatever the method */
export const HOLD_FINDING_KINDS = new Set(['unheld-part', 'loose-slug', 'sheet-lift']);

export interface HoldMethodsJob extends EstimateJob {
  /** the level the machine's own vacuum table holds (machines.default_vacuum_kpa); null: not known */
  machineVacuumKpa: number | null;
}

export interface Planned {
  id: HoldOptionId;
  holdDown: HoldDownMethod;
  vacuumKpa: number | null;
  vacuumSource: HoldMethodAnalysis['vacuumSource'];
}

const same = (a: number, b: number) => Math.abs(a - b) < 1e-9;

/** The methods to analyse, with the vacuum levels: the job's (else the machine's, else the default) and the machine's when it differs. */
export function plannedMethods(job: HoldMethodsJob): Planned[] {
  const fallback = resolveSettings().defaultVacuumKpa;
  const jobKpa = job.hold === 'vacuum' && job.vacuumKpa !== null && job.vacuumKpa > 0 ? job.vacuumKpa : null;
  const machineKpa = job.machineVacuumKpa !== null && job.machineVacuumKpa > 0 ? job.machineVacuumKpa : null;
  const first: Planned = jobKpa !== null
    ? { id: 'vacuum', holdDown: 'vacuum', vacuumKpa: jobKpa, vacuumSource: 'job' }
    : machineKpa !== null
      ? { id: 'vacuum', holdDown: 'vacuum', vacuumKpa: machineKpa, vacuumSource: 'machine' }
      : { id: 'vacuum', holdDown: 'vacuum', vacuumKpa: fallback, vacuumSource: 'default' };
  const list: Planned[] = [first];
  if (machineKpa !== null && !same(machineKpa, first.vacuumKpa!)) list.push({ id: 'vacuum-machine', holdDown: 'vacuum', vacuumKpa: machineKpa, vacuumSource: 'machine' });
  for (const m of ['tape-glue', 'clamps', 'tabs', 'skin'] as const) list.push({ id: m, holdDown: m, vacuumKpa: null, vacuumSource: null });
  return list;
}

/** The analysis input runEstimate gives analyze(), with another hold-down. */
function analysisInput(profile: MachineProfile, job: EstimateJob, holdDown: HoldDownMethod, vacuumKpa: number | null): AnalysisInput {
  return {
    sheet: job.sheet,
    zZero: job.zero,
    holdDown,
    vacuumKpa: vacuumKpa ?? undefined,
    tools: profile.tools.map((t) => ({ number: t.number, diameterMm: t.diameterMm, flutes: t.flutes, kind: t.kind })),
    machine: { travelMm: profile.travelMm, maxFeedMmPerMin: profile.maxFeedMmPerMin },
  };
}

/** whether the estimate's own analysis is the one this method would run */
function reusable(base: AnalysisResult, job: EstimateJob, p: Planned): boolean {
  if (job.hold !== p.holdDown) return false;
  return p.holdDown !== 'vacuum' || (base.summary.vacuumKpa !== null && same(base.summary.vacuumKpa, p.vacuumKpa!));
}

/** what holds each of the base analysis's parts under this result (the same parts, matched by id) */
function holdByOf(result: AnalysisResult, base: AnalysisResult): HoldMethodAnalysis['holdBy'] {
  if (result === base) return base.parts.map((part) => part.holdBy);
  const byId = new Map(result.parts.map((part) => [part.id, part.holdBy]));
  return base.parts.map((part) => byId.get(part.id) ?? 'none');
}

function methodOf(p: Planned, result: AnalysisResult, base: AnalysisResult, analysisMs: number): HoldMethodAnalysis {
  const findings: HoldFinding[] = [];
  let errors = 0, warnings = 0, sheetLift = 0, suppressed = 0;
  for (const f of result.findings) {
    if (!HOLD_FINDING_KINDS.has(f.kind)) continue;
    findings.push(f.part === undefined ? { kind: f.kind, severity: f.severity, line: f.line, message: f.message } : { kind: f.kind, severity: f.severity, line: f.line, message: f.message, part: f.part });
    if (f.severity === 'error') errors++;
    else if (f.severity === 'warning') warnings++;
    if (f.kind === 'sheet-lift') sheetLift++;
  }
  // findings past the listing limit are counted; unheld parts are errors, slugs and lift warnings
  const s = result.summary.suppressed;
  errors += s['unheld-part'] ?? 0;
  warnings += (s['loose-slug'] ?? 0) + (s['sheet-lift'] ?? 0);
  sheetLift += s['sheet-lift'] ?? 0;
  suppressed = (s['unheld-part'] ?? 0) + (s['loose-slug'] ?? 0) + (s['sheet-lift'] ?? 0);
  return {
    id: p.id,
    holdDown: p.holdDown,
    vacuumKpa: p.vacuumKpa,
    vacuumSource: p.vacuumSource,
    holdBy: holdByOf(result, base),
    findings,
    counts: { errors, warnings, unheldParts: result.summary.partsUnheld, looseSlugs: result.summary.looseSlugs, sheetLift, suppressed },
    analysisMs: Math.round(analysisMs),
  };
}

/** the words sheet-lift.ts uses for how the sheet is held, by edge-held method */
const LIFT_HELD: Partial<Record<HoldDownMethod, string>> = { clamps: 'clamps at the sheet edge', tabs: 'tabs only' };

/**
 * A method decided by the clamps (or tabs) analysis, by the engine's hold rules (see the
 * header): the same verdicts, the engine's reason for this method, sheet lift as it applies.
 */
export function deriveMethod(p: Planned, source: HoldMethodAnalysis, settings: AnalysisResult['summary']['settings']): HoldMethodAnalysis {
  const base = { id: p.id, holdDown: p.holdDown, vacuumKpa: null, vacuumSource: null, analysisMs: 0 } as const;
  if (p.holdDown === 'tape-glue') {
    return {
      ...base,
      holdBy: source.holdBy.map((h) => (h === 'none' ? 'tape-glue' : h)),
      findings: [],
      counts: { errors: 0, warnings: 0, unheldParts: 0, looseSlugs: 0, sheetLift: 0, suppressed: 0 },
    };
  }
  const from = freedPieceHold(source.holdDown, 0, 0, 0, settings).reason;
  const to = freedPieceHold(p.holdDown, 0, 0, 0, settings).reason;
  const liftFrom = LIFT_HELD[source.holdDown];
  const liftTo = LIFT_HELD[p.holdDown];
  const findings: HoldFinding[] = [];
  for (const f of source.findings) {
    if (f.kind === 'sheet-lift') {
      if (liftFrom && liftTo) findings.push({ ...f, message: f.message.replace(`with ${liftFrom} to hold it`, `with ${liftTo} to hold it`) });
      continue;
    }
    findings.push({ ...f, message: f.message.replace(from, to) });
  }
  const lift = liftTo ? source.counts.sheetLift : 0;
  return {
    ...base,
    holdBy: source.holdBy.slice(),
    findings,
    counts: { ...source.counts, sheetLift: lift, warnings: source.counts.warnings - (source.counts.sheetLift - lift) },
  };
}

export interface HoldMethodsInput {
  moves: MoveList;
  profile: MachineProfile;
  job: HoldMethodsJob;
  /** the estimate's own analysis (runEstimate's `checks`), reused for the job's method */
  base: AnalysisResult;
  achievedCuttingFeedMmPerMin: number | null;
  /** a clock for the figures (performance.now in the worker); none: 0 ms recorded */
  now?: () => number;
}

export function holdMethods(input: HoldMethodsInput): HoldMethodsDoc {
  const { moves, profile, job, base } = input;
  const now = input.now ?? (() => 0);
  const settings = base.summary.settings;
  const planned = plannedMethods(job);
  const run = (p: Planned): HoldMethodAnalysis => {
    if (reusable(base, job, p)) return methodOf(p, base, base, 0);
    const t0 = now();
    const result = analyze(moves, analysisInput(profile, job, p.holdDown, p.vacuumKpa));
    return methodOf(p, result, base, now() - t0);
  };
  const byId = new Map<HoldOptionId, HoldMethodAnalysis>();
  for (const p of planned) if (p.holdDown === 'vacuum') byId.set(p.id, run(p));
  // the edge-held source: the job's own analysis when it is clamps or tabs, else clamps
  const sourcePlan = planned.find((p) => p.id === (job.hold === 'tabs' ? 'tabs' : 'clamps'))!;
  const source = run(sourcePlan);
  byId.set(sourcePlan.id, source);
  for (const p of planned) {
    if (byId.has(p.id)) continue;
    byId.set(p.id, reusable(base, job, p) ? methodOf(p, base, base, 0) : deriveMethod(p, source, settings));
  }
  const methods = planned.map((p) => byId.get(p.id)!);
  let programErrors = 0, programWarnings = 0;
  for (const f of base.findings) {
    if (HOLD_FINDING_KINDS.has(f.kind)) continue;
    if (f.severity === 'error') programErrors++;
    else if (f.severity === 'warning') programWarnings++;
  }
  return {
    version: HOLD_METHODS_DOC_VERSION,
    sheetThicknessMm: job.sheet?.thicknessMm ?? null,
    parts: base.parts.map((p) => ({
      id: p.id,
      order: p.order,
      areaMm2: p.areaMm2,
      perimeterMm: p.perimeterMm,
      widthMm: p.bbox.maxX - p.bbox.minX,
      heightMm: p.bbox.maxY - p.bbox.minY,
      tabs: p.tabs,
      skinMm: p.skinMm,
      tool: p.tool,
    })),
    tools: profile.tools.map((t) => ({ number: t.number, diameterMm: t.diameterMm, kind: t.kind })),
    frictionMu: settings.frictionMu,
    cuttingForceN: settings.cuttingForceN,
    cuttingForceByToolN: { ...settings.cuttingForceByToolN },
    achievedCuttingFeedMmPerMin: input.achievedCuttingFeedMmPerMin,
    programErrors,
    programWarnings,
    methods,
  };
}
