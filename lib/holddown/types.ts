// The per-method through-cut analysis stored beside an estimate's report (the estimate
// worker writes it, lib/estimate/hold-methods.ts; the comparison reads it, compare.ts). Pure
// types, shared by the server and the browser. Lengths mm, areas mm², forces N, kPa below
// atmosphere.
import type { HoldBy, HoldDownMethod } from '@/lib/analysis/types';

export const HOLD_METHODS_DOC_VERSION = 1;

/** A way of holding the parts, as the comparison lists it: vacuum twice (the job's level, the machine's own). */
export type HoldOptionId = 'vacuum' | 'vacuum-machine' | 'tape-glue' | 'clamps' | 'tabs' | 'skin';

/** One part the program frees, as every method sees it (the geometry does not depend on the hold-down). */
export interface HoldPart {
  id: number;
  /** 1-based order the parts come free (the report's and the viewer's part number) */
  order: number;
  areaMm2: number;
  perimeterMm: number;
  widthMm: number;
  heightMm: number;
  tabs: number;
  skinMm: number;
  tool: number;
}

/** A finding that depends on the hold-down (unheld part, loose slug, sheet lift). */
export interface HoldFinding {
  kind: string;
  severity: 'error' | 'warning' | 'info';
  line: number;
  message: string;
  part?: number;
}

export interface HoldMethodAnalysis {
  id: HoldOptionId;
  holdDown: HoldDownMethod;
  /** the level analysed (vacuum options only) */
  vacuumKpa: number | null;
  /** where the level came from: the job, the machine, or the analysis's default */
  vacuumSource: 'job' | 'machine' | 'default' | null;
  /** per part, in the order of `parts`: what holds it under this method */
  holdBy: HoldBy[];
  /** the hold-down findings of this method's analysis (listed ones; the rest counted) */
  findings: HoldFinding[];
  counts: { errors: number; warnings: number; unheldParts: number; looseSlugs: number; sheetLift: number; suppressed: number };
  /** how long this method's analysis took, ms (0: the estimate's own analysis was reused) */
  analysisMs: number;
}

export interface HoldMethodsDoc {
  version: typeof HOLD_METHODS_DOC_VERSION;
  /** null: no sheet was given, so nothing was analysed */
  sheetThicknessMm: number | null;
  parts: HoldPart[];
  tools: Array<{ number: number; diameterMm: number; kind: string }>;
  /** the analysis settings the verdicts used (friction and side force, for the reasons' figures) */
  frictionMu: number;
  cuttingForceN: number;
  cuttingForceByToolN: Record<number, number>;
  /** the program's achieved cutting feed (the estimate's), for an onion-skin pass; null when it cut nothing */
  achievedCuttingFeedMmPerMin: number | null;
  /** findings of the program that no hold-down changes, by severity */
  programErrors: number;
  programWarnings: number;
  methods: HoldMethodAnalysis[];
}
