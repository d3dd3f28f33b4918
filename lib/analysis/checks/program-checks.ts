// Program safety checks made move by move in the same pass as the cut graph: rapids in stock,
// feeding in stock with the spindle stopped, travel and sheet limits, depth into the
// spoilboard, feeds above the machine's limit, straight plunges, and the plunge points.
// A fault repeated on consecutive moves is reported once, at its first line.
import type { FindingSink } from './findings';
import { fmt, THROWN_PIECE } from './findings';
import { PlungePoints, PlungeSlot } from './plunge-points';
import type { MachineLimits, SheetSpec } from '../types';

const EPS = 1e-6;

export interface CheckContext {
  sheet: SheetSpec | null;
  /** Z of the stock top, null when unknown */
  topZ: number | null;
  bottomZ: number | null;
  machine?: MachineLimits;
  spoilboardAllowanceMm: number;
  toleranceMm: number;
  toolDiameter: (tool: number) => number;
}

/**
 * The slots of ProgramChecks.m, the move being checked, written by the move pass (pass/scan.ts)
 * before each motion(): its start and end, mm; the XY extent of its path; its lowest Z; its
 * feed; and, for coarseBoxSuffices(), a box known to hold the path. Numbers go through this
 * array rather than as arguments, which a call that is not inlined would box one by one on
 * every move. (A module that indexes m in a hot loop copies the slots it uses into constants of
 * its own: an imported binding is read through an accessor on every use.)
 */
export const MoveSlot = {
  x0: 0, y0: 1, z0: 2,
  x1: 3, y1: 4, z1: 5,
  /** XY extent of the move's path */
  minX: 6, minY: 7, maxX: 8, maxY: 9,
  /** lowest Z along the path */
  zLo: 10,
  feedMmPerMin: 11,
  /** a box that holds the path (the square about an arc's circle with its end points) */
  coarseMinX: 12, coarseMinY: 13, coarseMaxX: 14, coarseMaxY: 15,
  /** the number of slots */
  size: 16,
} as const;
const M_X0 = MoveSlot.x0, M_Y0 = MoveSlot.y0, M_Z0 = MoveSlot.z0, M_X1 = MoveSlot.x1, M_Y1 = MoveSlot.y1, M_Z1 = MoveSlot.z1;
const M_MIN_X = MoveSlot.minX, M_MIN_Y = MoveSlot.minY, M_MAX_X = MoveSlot.maxX, M_MAX_Y = MoveSlot.maxY, M_Z_LO = MoveSlot.zLo, M_FEED = MoveSlot.feedMmPerMin;
const M_COARSE_MIN_X = MoveSlot.coarseMinX, M_COARSE_MIN_Y = MoveSlot.coarseMinY, M_COARSE_MAX_X = MoveSlot.coarseMaxX, M_COARSE_MAX_Y = MoveSlot.coarseMaxY;
const P_X = PlungeSlot.x, P_Y = PlungeSlot.y, P_DEPTH = PlungeSlot.depthMm, P_FEED = PlungeSlot.feedMmPerMin;

// Slots of ProgramChecks.running, the checks' running numbers, and of ProgramChecks.limits, the limits
// worked out once. Kept in typed arrays rather than fields: the pass stores into them on most
// moves, and a double in an array is written in place, never boxed.
const S_MIN_X = 0, S_MAX_X = 1, S_MIN_Y = 2, S_MAX_Y = 3, S_MIN_Z = 4, S_MAX_Z = 5;
const S_PLUNGE = 6, S_FEED_RUN = 7, S_DIAMETER = 8;
const K_TOL = 0, K_STOCK = 1, K_SHEET_LO = 2, K_SHEET_W = 3, K_SHEET_L = 4, K_SPOIL = 5;
const K_FEED_X = 6, K_FEED_Y = 7, K_FEED_Z = 8, K_FEED_LOW = 9, K_ARC_FEED = 10;
const K_SPAN_X = 11, K_SPAN_Y = 12, K_SPAN_Z = 13;
const K_SIDE_LO = 14, K_SIDE_W = 15, K_SIDE_L = 16;

export class ProgramChecks {
  readonly plungePoints = new PlungePoints();
  private rapidRun = false;
  private spindleRun = false;
  private sheetRun = false;
  private spoilRun = false;
  private travelRun = false;
  private plungeReported = false;
  private travelLine = 0;
  // the tool rarely changes from one move to the next: keep its diameter (and the sheet limits
  // that depend on it) rather than look it up per move
  private lastTool = -1;
  private readonly running = new Float64Array(9);
  private readonly limits = new Float64Array(17);

  constructor(private readonly c: CheckContext, private readonly sink: FindingSink) {
    const run = this.running, lim = this.limits;
    run[S_MIN_X] = Infinity; run[S_MAX_X] = -Infinity;
    run[S_MIN_Y] = Infinity; run[S_MAX_Y] = -Infinity;
    run[S_MIN_Z] = Infinity; run[S_MAX_Z] = -Infinity;
    run[S_FEED_RUN] = -1;
    const tol = c.toleranceMm;
    lim[K_TOL] = tol;
    if (c.topZ !== null) lim[K_STOCK] = c.topZ - tol;
    if (c.sheet) {
      lim[K_SHEET_LO] = -tol;
      lim[K_SHEET_W] = c.sheet.widthMm + tol;
      lim[K_SHEET_L] = c.sheet.lengthMm + tol;
    }
    if (c.bottomZ !== null) lim[K_SPOIL] = c.bottomZ - c.spoilboardAllowanceMm - tol;
    const mach = c.machine;
    if (mach) {
      lim[K_FEED_X] = mach.maxFeedMmPerMin.x; lim[K_FEED_Y] = mach.maxFeedMmPerMin.y; lim[K_FEED_Z] = mach.maxFeedMmPerMin.z;
      lim[K_FEED_LOW] = Math.min(mach.maxFeedMmPerMin.x, mach.maxFeedMmPerMin.y, mach.maxFeedMmPerMin.z);
      lim[K_ARC_FEED] = Math.min(mach.maxFeedMmPerMin.x, mach.maxFeedMmPerMin.y);
      lim[K_SPAN_X] = mach.travelMm.x + tol; lim[K_SPAN_Y] = mach.travelMm.y + tol; lim[K_SPAN_Z] = mach.travelMm.z + tol;
    }
  }

  /** the tool's diameter, and with a sheet the limits of cutting beyond it by more than its radius */
  private diameterOf(tool: number): number {
    if (tool !== this.lastTool) {
      this.lastTool = tool;
      const d = this.c.toolDiameter(tool);
      this.running[S_DIAMETER] = d;
      const sheet = this.c.sheet;
      if (sheet) {
        const m = d / 2 + this.c.toleranceMm;
        this.limits[K_SIDE_LO] = -m;
        this.limits[K_SIDE_W] = sheet.widthMm + m;
        this.limits[K_SIDE_L] = sheet.lengthMm + m;
      }
    }
    return this.running[S_DIAMETER];
  }

  /** the move being checked, in the slots of MoveSlot (written by the caller before motion()) */
  readonly m = new Float64Array(MoveSlot.size);

  /**
   * Whether motion() would find the same with the coarse box in m (MoveSlot.coarse…) as with the move's
   * exact XY extent, for a move whose end points' box (MoveSlot.minX … maxY) lies within the coarse box and
   * the exact extent between the two: true when the end points alone already move in XY, and
   * the coarse box lies within the sheet (so within reach of every sheet check) and within the
   * travel box seen so far (so the span does not grow). Then either box gives every check the
   * same answer, and the caller need not work out the exact one.
   */
  coarseBoxSuffices(tool: number): boolean {
    const m = this.m, lim = this.limits, run = this.running, c = this.c;
    const tol = lim[K_TOL];
    if (!(m[M_MAX_X] - m[M_MIN_X] > tol || m[M_MAX_Y] - m[M_MIN_Y] > tol)) return false;
    const x0 = m[M_COARSE_MIN_X], y0 = m[M_COARSE_MIN_Y], x1 = m[M_COARSE_MAX_X], y1 = m[M_COARSE_MAX_Y];
    if (c.sheet !== null) {
      if (!(x0 >= lim[K_SHEET_LO] && y0 >= lim[K_SHEET_LO] && x1 <= lim[K_SHEET_W] && y1 <= lim[K_SHEET_L])) return false;
      if (tool !== this.lastTool) this.diameterOf(tool);
      if (!(x0 >= lim[K_SIDE_LO] && y0 >= lim[K_SIDE_LO] && x1 <= lim[K_SIDE_W] && y1 <= lim[K_SIDE_L])) return false;
    }
    const mach = c.machine;
    if (mach) {
      if (mach.workOffset) return false;
      if (!(x0 >= run[S_MIN_X] && y0 >= run[S_MIN_Y] && x1 <= run[S_MAX_X] && y1 <= run[S_MAX_Y])) return false;
    }
    return true;
  }

  /**
   * one motion move (its numbers in `m`, MoveSlot): kind 0 rapid, 1 feed, 2 arc; drilling is true for the
   * legs of a canned cycle, which plunge straight by design. One method on purpose, its checks
   * marked by comments: split into a method per check (tried, issue 16), the move pass ran about
   * 7% slower on the generated 1,000,000-line program (best of 16 interleaved rounds, 346 against
   * 292 ms), as V8 no longer inlined all of them into the per-move call.
   */
  motion(line: number, kind: number, spindleOn: boolean, tool: number, drilling: boolean): void {
    const m = this.m, lim = this.limits, run = this.running;
    const z0 = m[M_Z0], z1 = m[M_Z1];
    const bx0 = m[M_MIN_X], by0 = m[M_MIN_Y], bx1 = m[M_MAX_X], by1 = m[M_MAX_Y], zLo = m[M_Z_LO];
    const c = this.c;
    const tol = lim[K_TOL];
    const top = c.topZ;
    const sheet = c.sheet;
    const overSheet = sheet === null || (bx1 >= lim[K_SHEET_LO] && bx0 <= lim[K_SHEET_W] && by1 >= lim[K_SHEET_LO] && by0 <= lim[K_SHEET_L]);
    const stock = lim[K_STOCK];
    const inStockZ = top !== null && zLo < stock;
    const movesXY = bx1 - bx0 > tol || by1 - by0 > tol;

    if (top !== null) {
      // rapid in stock
      const bad = kind === 0 && movesXY && inStockZ && overSheet;
      if (bad && !this.rapidRun) {
        rapidInStock(this.sink, line, zLo, top);
      }
      this.rapidRun = bad;
      // spindle off while feeding in stock
      const dry = kind !== 0 && inStockZ && overSheet && !spindleOn;
      if (dry && !this.spindleRun) {
        spindleOff(this.sink, line, zLo, top);
      }
      this.spindleRun = dry;
      // entering the stock: plunge points and straight plunges
      if (z0 >= stock && z1 < stock) {
        const pp = this.plungePoints, io = pp.io;
        io[P_X] = m[M_X1]; io[P_Y] = m[M_Y1]; io[P_DEPTH] = top - z1; io[P_FEED] = kind === 0 ? 0 : m[M_FEED];
        pp.push(line, tool, movesXY, kind === 0);
      }
      if (kind === 1 && !drilling && !movesXY && z1 < z0 - EPS && z1 < stock) {
        run[S_PLUNGE] += Math.min(z0, top) - z1;
        const d = this.diameterOf(tool);
        if (!this.plungeReported && d > 0 && run[S_PLUNGE] > d + tol) {
          this.plungeReported = true;
          straightPlunge(this.sink, line, run[S_PLUNGE], d, tool);
        }
      } else if (kind !== 1 || movesXY || z1 > z0 + EPS) {
        run[S_PLUNGE] = 0;
        this.plungeReported = false;
      }
    }

    // cutting outside the sheet
    if (sheet !== null && kind !== 0) {
      if (tool !== this.lastTool) this.diameterOf(tool);
      const outside = inStockZ && (bx0 < lim[K_SIDE_LO] || by0 < lim[K_SIDE_LO] || bx1 > lim[K_SIDE_W] || by1 > lim[K_SIDE_L]);
      if (outside && !this.sheetRun) {
        outsideSheet(this.sink, line, bx0 < lim[K_SIDE_LO] ? bx0 : bx1, by0 < lim[K_SIDE_LO] ? by0 : by1, sheet);
      }
      this.sheetRun = outside;
    }
    // too deep into the spoilboard
    const bottomZ = c.bottomZ;
    if (bottomZ !== null) {
      const deep = zLo < lim[K_SPOIL];
      if (deep && !this.spoilRun) {
        spoilboardDepth(this.sink, line, zLo, bottomZ, c.spoilboardAllowanceMm);
      }
      this.spoilRun = deep;
    }
    // travel and feed limits
    const mach = c.machine;
    if (mach) {
      const off = mach.workOffset;
      if (off) {
        const out = bx0 + off.x < -tol || bx1 + off.x > mach.travelMm.x + tol || by0 + off.y < -tol || by1 + off.y > mach.travelMm.y + tol ||
          zLo + off.z < -mach.travelMm.z - tol || Math.max(z0, z1) + off.z > tol;
        if (out && !this.travelRun) {
          outsideTravel(this.sink, line, mach);
        }
        this.travelRun = out;
      } else {
        // the span only grows: it can first exceed the travel only on a move that widens it
        let grew = false;
        if (bx0 < run[S_MIN_X]) { run[S_MIN_X] = bx0; grew = true; }
        if (bx1 > run[S_MAX_X]) { run[S_MAX_X] = bx1; grew = true; }
        if (by0 < run[S_MIN_Y]) { run[S_MIN_Y] = by0; grew = true; }
        if (by1 > run[S_MAX_Y]) { run[S_MAX_Y] = by1; grew = true; }
        if (zLo < run[S_MIN_Z]) { run[S_MIN_Z] = zLo; grew = true; }
        const zHi = z0 > z1 ? z0 : z1;
        if (zHi > run[S_MAX_Z]) { run[S_MAX_Z] = zHi; grew = true; }
        if (grew && this.travelLine === 0 && (run[S_MAX_X] - run[S_MIN_X] > lim[K_SPAN_X] || run[S_MAX_Y] - run[S_MIN_Y] > lim[K_SPAN_Y] || run[S_MAX_Z] - run[S_MIN_Z] > lim[K_SPAN_Z])) {
          this.travelLine = line;
        }
      }
      const feedMmPerMin = m[M_FEED];
      if (kind !== 0 && feedMmPerMin > 0) {
        if (feedMmPerMin <= lim[K_FEED_LOW] || (feedMmPerMin <= lim[K_ARC_FEED] && (kind === 2 || Math.abs(z1 - z0) <= EPS))) {
          // at most the lowest axis limit, or the lower XY limit on an arc or a level move: no
          // direction of the move can limit it (each axis' limit along the move, maxFeedMmPerMin·len/|d|
          // with |d| ≤ len, is at least that axis' own; a level move's Z part counts as none)
          run[S_FEED_RUN] = -1;
        } else {
          this.feedLimit(line, kind, feedMmPerMin);
        }
      }
    }
  }

  /** the feed check of motion() past its fast path: the limit along the move in m */
  private feedLimit(line: number, kind: number, feedMmPerMin: number): void {
    const m = this.m, lim = this.limits;
    let limit: number;
    if (kind === 1) {
      const dx = Math.abs(m[M_X1] - m[M_X0]), dy = Math.abs(m[M_Y1] - m[M_Y0]), dz = Math.abs(m[M_Z1] - m[M_Z0]);
      const len = Math.sqrt(dx * dx + dy * dy + dz * dz);
      limit = Infinity;
      if (len > EPS) {
        if (dx > EPS) limit = Math.min(limit, (lim[K_FEED_X] * len) / dx);
        if (dy > EPS) limit = Math.min(limit, (lim[K_FEED_Y] * len) / dy);
        if (dz > EPS) limit = Math.min(limit, (lim[K_FEED_Z] * len) / dz);
      }
    } else {
      limit = lim[K_ARC_FEED];
    }
    const clamped = feedMmPerMin > limit * (1 + 1e-6);
    if (clamped && this.running[S_FEED_RUN] !== feedMmPerMin) {
      feedClamped(this.sink, line, feedMmPerMin, limit);
    }
    this.running[S_FEED_RUN] = clamped ? feedMmPerMin : -1;
  }

  finish(): void {
    const mach = this.c.machine;
    const run = this.running;
    if (mach && !mach.workOffset && this.travelLine > 0) {
      const spanX = run[S_MAX_X] - run[S_MIN_X], spanY = run[S_MAX_Y] - run[S_MIN_Y], spanZ = run[S_MAX_Z] - run[S_MIN_Z];
      this.sink.add('outside-travel', 'error', this.travelLine,
        () => `The program spans ${fmt(spanX, 0)} × ${fmt(spanY, 0)} × ${fmt(spanZ, 0)} mm, more than the machine's travel of ${fmt(mach.travelMm.x, 0)} × ${fmt(mach.travelMm.y, 0)} × ${fmt(mach.travelMm.z, 0)} mm (this move is the first to exceed it), so it cannot run wherever the work offset is set: the machine may stop on a limit or hit its frame.`);
    }
  }
}

// The wording of each finding, in functions of their own: a closure inside motion() would make
// V8 allocate a context for its captured values on every call, found or not. Each builds its
// text only when the finding will be listed; a repeated fault past the kind's limit is only counted.

function rapidInStock(sink: FindingSink, line: number, zLo: number, top: number): void {
  if (sink.listing('rapid-in-stock')) sink.add('rapid-in-stock', 'error', line, `A rapid moves in XY at Z ${fmt(zLo, 3)} mm, ${fmt(top - zLo, 2)} mm below the stock top, over the sheet: a rapid through material can break the tool or throw the part. ${THROWN_PIECE} Retract above the stock top before a rapid, or make the move a feed.`);
  else sink.count('rapid-in-stock');
}

function spindleOff(sink: FindingSink, line: number, zLo: number, top: number): void {
  if (sink.listing('spindle-off')) sink.add('spindle-off', 'error', line, `A feed move cuts ${fmt(top - zLo, 2)} mm into the stock with the spindle stopped: a tool that is not turning can break, and the part or the broken tool can be thrown. ${THROWN_PIECE} Start the spindle (M3/M4) before the tool enters the material.`);
  else sink.count('spindle-off');
}

function straightPlunge(sink: FindingSink, line: number, depthMm: number, d: number, tool: number): void {
  if (sink.listing('straight-plunge')) sink.add('straight-plunge', 'info', line, `A straight plunge goes ${fmt(depthMm, 2)} mm into the stock with no ramp, more than the ${fmt(d, 2)} mm diameter of tool T${tool}. A ramp or helix entry spares the tool's end and lets chips out.`);
  else sink.count('straight-plunge');
}

function outsideSheet(sink: FindingSink, line: number, x: number, y: number, sheet: SheetSpec): void {
  if (sink.listing('outside-sheet')) sink.add('outside-sheet', 'warning', line, `A feed move reaches X ${fmt(x, 2)}, Y ${fmt(y, 2)} mm below the stock top, beyond the ${fmt(sheet.widthMm, 0)} × ${fmt(sheet.lengthMm, 0)} mm sheet by more than the tool radius: check the sheet size and the work offset.`);
  else sink.count('outside-sheet');
}

function spoilboardDepth(sink: FindingSink, line: number, zLo: number, bottomZ: number, allowanceMm: number): void {
  if (sink.listing('spoilboard-depth')) sink.add('spoilboard-depth', 'warning', line, `A move goes to Z ${fmt(zLo, 3)} mm, ${fmt(bottomZ - zLo, 2)} mm below the sheet bottom, deeper than the ${fmt(allowanceMm, 2)} mm spoilboard allowance: it cuts into the spoilboard or the table.`);
  else sink.count('spoilboard-depth');
}

function outsideTravel(sink: FindingSink, line: number, mach: MachineLimits): void {
  const off = mach.workOffset!;
  if (sink.listing('outside-travel')) sink.add('outside-travel', 'error', line, `A move leaves the machine's travel (X 0–${fmt(mach.travelMm.x, 0)}, Y 0–${fmt(mach.travelMm.y, 0)}, Z −${fmt(mach.travelMm.z, 0)}–0 mm in machine coordinates with the work offset ${fmt(off.x, 1)}, ${fmt(off.y, 1)}, ${fmt(off.z, 1)}): the machine may stop on a limit, refuse the program or hit its frame.`);
  else sink.count('outside-travel');
}

function feedClamped(sink: FindingSink, line: number, feedMmPerMin: number, limit: number): void {
  if (sink.listing('feed-clamped')) sink.add('feed-clamped', 'info', line, `Feed F${fmt(feedMmPerMin, 0)} mm/min is above what the machine's axis limits allow along this move (${fmt(limit, 0)} mm/min): the controller runs it slower, and the estimate uses the lower feed.`);
  else sink.count('feed-clamped');
}
