// The interpreter's modal state (NISTIR 6556 §3.7 "current state") and the helpers every
// motion uses: program coordinates → the G54 work frame in mm, the flags a move carries,
// the feed a move gets. Inside, every length is mm; `scale` turns program units into mm
// (G20: 1 in = 25.4 mm exactly, NIST SP 811 Appendix B).
import { DiagnosticSink } from './diagnostic-sink';
import { LineWords, L as LETTERS } from './line-words';
import { MoveFlag as MOVE_FLAG, type InterpretOptions, type Xyz } from './move-list';
import { createMoveListBuilder, type MoveListBuilder } from './move-list-builder';

// imported bindings are read through getters once transpiled to CommonJS; local copies keep
// the per-line path free of them
const L = { ...LETTERS };
const MoveFlag = { ...MOVE_FLAG };


export const INCH_MM = 25.4;
/** NISTIR 6556 §3.5.3.2: start/end radius tolerance, in program units */
export const ARC_END_RADIUS_TOLERANCE_MM = 0.002;
export const ARC_END_RADIUS_TOLERANCE_IN = 0.0002;

export class Interp {
  readonly moves: MoveListBuilder;
  readonly diag = new DiagnosticSink();
  readonly w = new LineWords();
  readonly home: Xyz;
  readonly home2: Xyz;
  readonly offset: Xyz;
  readonly continueAfterEnd: boolean;

  // position in the G54 work frame, mm
  x: number;
  y: number;
  z: number;
  inch: boolean;
  scale: number;
  declaredUnits: 'mm' | 'inch' | null = null;
  absolute = true;
  arcAbsolute = false;
  plane: 0 | 1 | 2 = 0;
  /** motion mode as G code × 10; NIST starts in G80 (no motion) */
  motion = 800;
  inverseTime = false;
  feedMmPerMin = 0;
  spindleRpm = 0;
  spindleOn = false;
  spindleCcw = false;
  coolant = false;
  selectedTool = -1;
  tool = 0;
  exactStop = false;
  /** G98 (retract to the Z before the cycle) rather than G99 (to R) */
  retractOldZ = true;
  // G92 offsets, mm: work = program × scale + g92
  g92x = 0;
  g92y = 0;
  g92z = 0;
  // sticky canned-cycle words, mm (P in seconds); NaN until given
  cycZ = NaN;
  cycR = NaN;
  cycP = NaN;
  cycQ = NaN;
  ended = false;

  // the line being interpreted
  lineNo = 0;
  src = '';
  lineStart = 0;
  lineEnd = 0;

  /** the current line's text, sliced only when a diagnostic needs it */
  get lineText(): string {
    return this.src.slice(this.lineStart, this.lineEnd);
  }

  constructor(options: InterpretOptions, chunkSize?: number) {
    const start = options.start ?? { x: 0, y: 0, z: 0 };
    this.moves = createMoveListBuilder(start, chunkSize);
    this.x = start.x;
    this.y = start.y;
    this.z = start.z;
    this.home = options.home ?? { x: 0, y: 0, z: 0 };
    this.home2 = options.home2 ?? this.home;
    this.offset = options.workOffset ?? { x: 0, y: 0, z: 0 };
    this.inch = options.defaultUnits === 'inch';
    this.scale = this.inch ? INCH_MM : 1;
    this.continueAfterEnd = options.continueAfterEnd === true;
  }

  get arcEndRadiusToleranceMm(): number {
    return this.inch ? ARC_END_RADIUS_TOLERANCE_IN * INCH_MM : ARC_END_RADIUS_TOLERANCE_MM;
  }

  flags(): number {
    return (this.exactStop ? MoveFlag.exactStop : 0) | (this.spindleOn ? MoveFlag.spindleOn : 0) | (this.coolant ? MoveFlag.coolant : 0) | (this.spindleCcw ? MoveFlag.spindleCcw : 0);
  }

  rpm(): number {
    return this.spindleOn ? this.spindleRpm : 0;
  }

  /** target of one axis in the work frame from the line's word, in the distance mode in force */
  targetX(): number {
    const w = this.w;
    if (!w.has(L.X)) return this.x;
    return this.absolute ? w.value[L.X] * this.scale + this.g92x : this.x + w.value[L.X] * this.scale;
  }
  targetY(): number {
    const w = this.w;
    if (!w.has(L.Y)) return this.y;
    return this.absolute ? w.value[L.Y] * this.scale + this.g92y : this.y + w.value[L.Y] * this.scale;
  }
  targetZ(): number {
    const w = this.w;
    if (!w.has(L.Z)) return this.z;
    return this.absolute ? w.value[L.Z] * this.scale + this.g92z : this.z + w.value[L.Z] * this.scale;
  }

  hasAxisWords(): boolean {
    const w = this.w;
    return w.has(L.X) || w.has(L.Y) || w.has(L.Z);
  }

  /**
   * Feed for a feed move of lengthMm, mm/min. G93 (NISTIR 6556 §3.5.19): the move takes 1/F
   * minutes, so feed = length × F, and F must be on the line. 0 when the program gave none.
   */
  feedFor(lengthMm: number): number {
    if (this.inverseTime) {
      if (!this.w.has(L.F)) {
        this.diag.add('inverse-time-feed-missing', this.lineNo, 'G93 inverse time needs an F word on every feed move; the move is kept with feed 0', this.lineText);
        return 0;
      }
      return lengthMm * this.w.value[L.F];
    }
    if (this.feedMmPerMin <= 0) this.diag.add('feed-missing', this.lineNo, 'feed move with no F in force; the move is kept with feed 0', this.lineText);
    return this.feedMmPerMin;
  }

  /** a straight move to (x, y, z) in the work frame */
  line(kind: 0 | 1, x: number, y: number, z: number, feed: number, extraFlags = 0): void {
    this.moves.push(kind, x, y, z, feed, this.lineNo, this.flags() | extraFlags | (kind === 1 && this.inverseTime ? MoveFlag.inverseTime : 0), this.tool, this.rpm(), 0);
    this.x = x;
    this.y = y;
    this.z = z;
  }

  /** a record that keeps the position (dwell, tool change, spindle, stop, end) */
  atRest(kind: 3 | 4 | 5 | 6 | 7 | 8, aux = 0, extraFlags = 0): void {
    this.moves.push(kind, this.x, this.y, this.z, 0, this.lineNo, this.flags() | extraFlags, this.tool, this.rpm(), aux);
  }
}
