// Through-cut and program checks: from the move list (lib/gcode), the job's sheet, Z zero,
// tools and hold-down method to the parts a program frees, whether each is held, the order
// they come free, plunge points, and findings with line numbers. The result is an aid for the
// programmer and the operator, not a guarantee. The polygon work runs in WebAssembly
// (geometry/polygons.ts), loaded once by loadAnalysis(); analyze() itself stays synchronous.
//
// The stages, in the order analyze() runs them (folder/file: what it does, input → output):
//
// | stage               | module                                  | input                                   | output                                  |
// |---------------------|-----------------------------------------|-----------------------------------------|-----------------------------------------|
// | 1 move pass         | pass/scan.ts (arc-chords.ts)            | MoveList, ScanLevels                    | ScanResult: CutGraph, first lines/tool  |
// |   program checks    | checks/program-checks.ts (in the pass)  | one move at a time, MoveSlot            | findings, PlungePoints                  |
// |   band              | graph/band.ts (in the pass)             | chords near the sheet bottom            | pieces and arcs added to the CutGraph   |
// | 2 cut graph         | graph/cut-graph.ts, edge-arcs.ts        | pieces, arcs                            | CutGraph (vertices, edges, EdgeArcs)    |
// | 3 prune, crossings  | graph/faces.ts prune, graph/crossings.ts| CutGraph                                | PrunedGraph, Crossing[]                 |
// | 4 loops             | graph/faces.ts extractLoops             | CutGraph, PrunedGraph                   | GraphLoop[] (closed, counter-clockwise) |
// | 5 loop shapes       | shapes/loops.ts, loop-shapes.ts         | GraphLoop                               | LoopInfo (shared LoopShape + origin)    |
// | 6 nesting           | shapes/nesting.ts                       | LoopInfo[]                              | LoopNode[] (parts and their holes)      |
// | 7 parts             | shapes/parts.ts, shape-cache.ts         | LoopNode[], hold-down                   | BuiltPart[] → AnalysisPart[]            |
// |   hold verdicts     | checks/hold.ts (from parts)             | a part's area, tabs, skin, hold-down    | held or not, by what                    |
// | 8 cut order         | checks/cut-order.ts                     | MoveList, BuiltPart[]                   | findings                                |
// | 9 sheet lift        | checks/sheet-lift.ts                    | sheet, tools, first through cut by tool | findings                                |
// | findings            | checks/findings.ts                      | every stage's findings                  | Finding[] sorted, counts per kind       |
//
// Shared by the stages: geometry/ (Clipper rings and paths, small vector helpers), types.ts
// (the public input and output), settings.ts (the tunable limits), units.ts, typed-arrays.ts.
import type { MoveList } from '@/lib/gcode/move-list';
import { findCrossings } from './graph/crossings';
import { checkCutOrder } from './checks/cut-order';
import { extractLoops, prune, type GraphLoop } from './graph/faces';
import { FindingSink, fmt } from './checks/findings';
import { sheetLift } from './checks/sheet-lift';
import { loadClipper, loadedClipper } from './geometry/polygons';
import { LoopShapes } from './shapes/loop-shapes';
import { describeLoop } from './shapes/loops';
import { nestLoops } from './shapes/nesting';
import { buildParts } from './shapes/parts';
import { ProgramChecks } from './checks/program-checks';
import { scanMoves } from './pass/scan';
import { resolveSettings } from './settings';
import type { CutGraph } from './graph/cut-graph';
import type { AnalysisSettings } from './settings';
import type { AnalysisInput, AnalysisPart, AnalysisResult, HoldDownMethod, SheetSpec, ToolSpec } from './types';

export type * from './types';
export { DEFAULT_SETTINGS, resolveSettings, type AnalysisSettings } from './settings';
export { vacuumLateralHoldN, vacuumNormalForceN } from './checks/hold';
export { PlungePoints } from './checks/plunge-points';

export const ANALYSIS_NOTE =
  'These checks are an aid, not a guarantee: the operator, the machine\'s manual, the shop\'s safety rules and local codes decide whether a program is safe to run.';

/** loads what analyze() needs (Clipper in WebAssembly); idempotent, every call shares one promise */
export function loadAnalysis(): Promise<void> {
  return loadClipper();
}

/** throws, naming loadAnalysis(), when it has not been awaited */
export function analyze(moves: MoveList, input: AnalysisInput): AnalysisResult {
  loadedClipper(); // fail at the start, not only for programs that reach the offsets
  const s = resolveSettings(input.settings);
  const sink = new FindingSink(s.maxFindingsPerKind);
  const sheet = validSheet(input.sheet, sink);
  const tools = new Map<number, ToolSpec>();
  for (const t of input.tools ?? []) if (Number.isFinite(t.diameterMm) && t.diameterMm >= 0) tools.set(t.number, t);
  const toolDiameter = (t: number) => tools.get(t)?.diameterMm ?? 0;
  const tol = s.bottomToleranceMm;
  const topZ = sheet ? (input.zZero === 'table' ? sheet.thicknessMm : 0) : input.zZero === 'top' ? 0 : null;
  const bottomZ = sheet ? (input.zZero === 'table' ? 0 : -sheet.thicknessMm) : null;
  const vacuumKpa = input.vacuumKpa !== undefined && Number.isFinite(input.vacuumKpa) && input.vacuumKpa > 0 ? input.vacuumKpa : s.defaultVacuumKpa;
  if (!sheet && input.sheet === null) {
    sink.add('checks-skipped', 'info', 0, 'No sheet was given, so the through-cut, hold-down, cut-order and sheet checks were not made; give the sheet size and thickness to run them.');
  }

  const checks = new ProgramChecks({ sheet, topZ, bottomZ, machine: input.machine, spoilboardAllowanceMm: s.spoilboardAllowanceMm, toleranceMm: tol, toolDiameter }, sink);
  const scan = scanMoves(moves, {
    throughZ: bottomZ !== null ? bottomZ + tol : null,
    bandTopZ: bottomZ !== null ? bottomZ + s.skinMaxMm : null,
    stockTopZ: topZ,
    chainToleranceMm: s.chainToleranceMm,
    chordToleranceMm: s.chordToleranceMm,
    tabMaxLengthMm: s.tabMaxLengthMm,
  }, checks);

  unknownTools(scan.toolFirstLine, tools, sink);
  const through = sheet && bottomZ !== null && topZ !== null && scan.graph
    ? throughCuts(moves, scan.graph, { bottomZ, topZ, holdDown: input.holdDown, vacuumKpa, toolDiameter }, s, sink)
    : null;
  const parts = through?.parts ?? [];
  if (through && sheet) sheetLift(sheet, input.holdDown, tools, scan.firstThroughByTool, moves.line, s.thinSheetMm, sink);

  const findings = sink.sorted();
  const count = (sev: string) => findings.filter((f) => f.severity === sev).length;
  const suppressedTotal = Object.values(sink.suppressed).reduce((a, b) => a + (b ?? 0), 0);
  return {
    parts,
    findings,
    plungePoints: checks.plungePoints,
    summary: {
      parts: parts.length,
      partsHeld: parts.filter((p) => p.held).length,
      partsUnheld: parts.filter((p) => !p.held).length,
      holes: through?.holes ?? 0,
      looseSlugs: through?.looseSlugs ?? 0,
      errors: count('error'),
      warnings: count('warning'),
      infos: count('info'),
      suppressed: sink.suppressed,
      stockTopZ: topZ,
      sheetBottomZ: bottomZ,
      holdDown: input.holdDown,
      vacuumKpa: input.holdDown === 'vacuum' ? vacuumKpa : null,
      settings: s,
      note: suppressedTotal > 0 ? `${ANALYSIS_NOTE} ${suppressedTotal} further findings of kinds already listed are counted, not listed.` : ANALYSIS_NOTE,
    },
  };
}

function touchesCrossing(loop: GraphLoop, crossed: Uint8Array): boolean {
  const { edges, start, length } = loop;
  for (let i = start; i < start + length; i++) if (crossed[edges[i]] === 1) return true;
  return false;
}

const SHEET_FIELD_WORDS = { widthMm: 'width', lengthMm: 'length', thicknessMm: 'thickness' } as const;

function validSheet(sheet: SheetSpec | null, sink: FindingSink): SheetSpec | null {
  if (!sheet) return null;
  for (const field of ['widthMm', 'lengthMm', 'thicknessMm'] as const) {
    const v = sheet[field];
    if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) {
      sink.add('checks-skipped', 'warning', 0, `The sheet's ${SHEET_FIELD_WORDS[field]} (sheet.${field}) must be a positive number of millimetres, not ${String(v)}, so the through-cut and sheet checks were not made.`);
      return null;
    }
  }
  return sheet;
}

function unknownTools(toolFirstLine: Map<number, number>, tools: Map<number, ToolSpec>, sink: FindingSink): void {
  for (const [t, line] of toolFirstLine) {
    if (tools.has(t)) continue;
    sink.add('unknown-tool', 'warning', line, t === 0
      ? 'Cutting moves from this line on run with no tool selected (T0): the checks take its diameter as 0 mm, so kerf, plunge and hold results for those cuts are approximate.'
      : `Tool T${t}, cutting from this line on, is not in the tool library: the checks take its diameter as 0 mm, so kerf, plunge and hold results for it are approximate. Add it to the library.`);
  }
}

interface ThroughCutJob {
  bottomZ: number;
  topZ: number;
  holdDown: HoldDownMethod | null;
  vacuumKpa: number;
  toolDiameter: (tool: number) => number;
}

/**
 * Stages 2–8 of the table above: the cut graph the move pass filled → crossings → closed loops
 * → their shapes → nesting → parts with hold verdicts → the cut-order check.
 */
function throughCuts(moves: MoveList, g: CutGraph, job: ThroughCutJob, s: AnalysisSettings, sink: FindingSink): { parts: AnalysisPart[]; holes: number; looseSlugs: number } {
  const { bottomZ, topZ, toolDiameter } = job;
  const tol = s.bottomToleranceMm;
  g.zipOverlaps();
  const pruned = prune(g);
  const { crossed, crossings } = findCrossings(g, s.chainToleranceMm, pruned.alive);
  for (const c of crossings) {
    const la = moves.line[g.eFirstNear[c.edgeA]], lb = moves.line[g.eFirstNear[c.edgeB]];
    sink.add('crossing-cuts', 'warning', Math.max(la, lb),
      `${la === lb ? 'This through cut crosses itself' : `This through cut crosses the one at line ${Math.min(la, lb)}`} at X ${fmt(c.x, 2)}, Y ${fmt(c.y, 2)}: two profiles overlap or one runs through another part. The loops there are left out of the part list; check the nest.`);
  }
  const shapes = new LoopShapes();
  const loops = extractLoops(g, pruned)
    .filter((l) => !touchesCrossing(l, crossed))
    .map((l) => describeLoop(g, l, bottomZ, bottomZ + tol, moves.line, s.chordToleranceMm, shapes));
  const nodes = nestLoops(loops, (t) => toolDiameter(t) / 2, s.chainToleranceMm);
  const built = buildParts(nodes, { method: job.holdDown, vacuumKpa: job.vacuumKpa, settings: s, line: moves.line }, sink);
  checkCutOrder(moves, built.parts, topZ, tol, sink);
  const parts = built.parts.map((b) => b.part).sort((a, b) => a.id - b.id);
  return { parts, holes: built.holes, looseSlugs: built.looseSlugs };
}
