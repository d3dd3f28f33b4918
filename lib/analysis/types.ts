// Input and output shapes of the through-cut and program checks (lib/analysis). Lengths mm,
// areas mm², forces N, pressure kPa below atmosphere.
import type { HOLD_DOWNS } from '@/lib/validation/enums';
import type { PlungePoints } from './checks/plunge-points';
import type { AnalysisSettings } from './settings';

/** the hold-down methods a job can name: the one list is HOLD_DOWNS in lib/validation/enums.ts */
export type HoldDownMethod = (typeof HOLD_DOWNS)[number];
export type HoldBy = 'tabs' | 'skin' | 'vacuum' | 'tape-glue' | 'none';
export type FindingSeverity = 'error' | 'warning' | 'info';
export type FindingKind =
  | 'unheld-part'
  | 'cut-order'
  | 'loose-slug'
  | 'sheet-lift'
  | 'rapid-in-stock'
  | 'spindle-off'
  | 'outside-travel'
  | 'outside-sheet'
  | 'spoilboard-depth'
  | 'feed-clamped'
  | 'straight-plunge'
  | 'unknown-tool'
  | 'crossing-cuts'
  | 'checks-skipped';

export interface SheetSpec {
  /** along X, mm; the sheet lies on [0, widthMm] × [0, lengthMm] of the work frame */
  widthMm: number;
  /** along Y, mm */
  lengthMm: number;
  thicknessMm: number;
}

export interface ToolSpec {
  number: number;
  diameterMm: number;
  flutes: number;
  /** up-cut, down-cut, compression, straight, V, ball (spelling and case are free) */
  kind: string;
}

export interface MachineLimits {
  /** travel per axis: machine X and Y in [0, travel], Z in [−travel, 0] (Z home at the top) */
  travelMm: { x: number; y: number; z: number };
  /** fastest cutting feed per axis */
  maxFeedMmPerMin: { x: number; y: number; z: number };
  /** G54 origin in machine coordinates, mm; without it the travel is checked as a span */
  workOffset?: { x: number; y: number; z: number };
}

export interface AnalysisInput {
  sheet: SheetSpec | null;
  zZero: 'top' | 'table';
  /** null: none was named, so only the tabs or onion skin the program leaves hold a part */
  holdDown: HoldDownMethod | null;
  /** vacuum level, kPa below atmosphere */
  vacuumKpa?: number;
  tools: ToolSpec[];
  machine?: MachineLimits;
  settings?: Partial<AnalysisSettings>;
}

/** a box in mm, work frame: the one box type that passes between the stages and leaves the analysis (grid boxes stay inside the shape stages) */
export interface BBox {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

export interface TabDetail {
  lengthMm: number;
  heightMm: number;
  /** line of the move that leaves the bottom for the tab */
  line: number;
}

export interface AnalysisPart {
  id: number;
  /** 1-based: the order parts are freed (parts held by tabs or skin follow, by the line that completes them) */
  order: number;
  /** the finished part, after the kerf */
  bbox: BBox;
  /** finished part: the loop's interior shrunk by the tool radius, minus its holes grown by it */
  areaMm2: number;
  /** outer edge of the finished part, mm */
  perimeterMm: number;
  holes: number;
  tabs: number;
  tabDetails: TabDetail[];
  /** thinnest onion skin left under the profile, mm; 0 when none */
  skinMm: number;
  held: boolean;
  holdBy: HoldBy;
  /** line that cuts the last of the outside profile through; null while tabs or skin keep it attached */
  freedAtLine: number | null;
  /** tool of the outside profile's final pass */
  tool: number;
}

export interface Finding {
  kind: FindingKind;
  severity: FindingSeverity;
  line: number;
  message: string;
  part?: number;
}

export interface PlungePoint {
  line: number;
  x: number;
  y: number;
  /** depth below the stock top at the end of the entering move, mm */
  depthMm: number;
  feedMmPerMin: number;
  tool: number;
  /** true when the entry moves in XY (a ramp), false for a straight plunge or a rapid */
  ramp: boolean;
  rapid: boolean;
}

export interface AnalysisSummary {
  parts: number;
  partsHeld: number;
  partsUnheld: number;
  holes: number;
  looseSlugs: number;
  errors: number;
  warnings: number;
  infos: number;
  /** findings beyond settings.maxFindingsPerKind, counted per kind */
  suppressed: Partial<Record<FindingKind, number>>;
  stockTopZ: number | null;
  sheetBottomZ: number | null;
  holdDown: HoldDownMethod | null;
  vacuumKpa: number | null;
  settings: AnalysisSettings;
  note: string;
}

export interface AnalysisResult {
  parts: AnalysisPart[];
  findings: Finding[];
  /** in columns (see plunge-points.ts): at(i), for…of, toArray(), JSON.stringify */
  plungePoints: PlungePoints;
  summary: AnalysisSummary;
}
