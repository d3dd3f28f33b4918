// Program safety checks made move by move in the same pass as the cut graph: rapids in stock,
// feeding in stock with the spindle stopped, travel and sheet limits, depth into the
// spoilboard, feeds above the machine's limit, straight plunges, and the plunge points.
// A fault repeated on consecutive moves is reported once, at its first line.
import type { FindingSink } from './findings';
import { fmt } from './findings';
import type { MachineLimits, PlungePoint, SheetSpec } from './types';

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

export class ProgramChecks {
  readonly plungePoints: PlungePoint[] = [];
  private rapidRun = false;
  private spindleRun = false;
  private sheetRun = false;
  private spoilRun = false;
  private travelRun = false;
  private feedRunValue = -1;
  private plungeDepthMm = 0;
  private plungeReported = false;
  private minX = Infinity; private maxX = -Infinity;
  private minY = Infinity; private maxY = -Infinity;
  private minZ = Infinity; private maxZ = -Infinity;
  private travelLine = 0;
  // the tool rarely changes from one move to the next: keep its diameter rather than look it up per move
  private lastTool = NaN;
  private lastDiameterMm = 0;

  constructor(private readonly c: CheckContext, private readonly sink: FindingSink) {}

  private diameterOf(tool: number): number {
    if (tool !== this.lastTool) {
      this.lastTool = tool;
      this.lastDiameterMm = this.c.toolDiameter(tool);
    }
    return this.lastDiameterMm;
  }

  /**
   * The coordinates of the move being checked, written by the caller before motion(): the
   * start x0 y0 z0 (0–2), the end x1 y1 z1 (3–5), the XY extent minX minY maxX maxY (6–9), the
   * lowest Z (10) and the feed in mm/min (11). Numbers go through this array rather than as arguments, which a call
   * that is not inlined would box one by one on every move.
   */
  readonly m = new Float64Array(12);

  /**
   * one motion move (its numbers in `m`): kind 0 rapid, 1 feed, 2 arc; drilling is true for the
   * legs of a canned cycle, which plunge straight by design
   */
  motion(line: number, kind: number, spindleOn: boolean, tool: number, drilling: boolean): void {
    const m = this.m;
    const x0 = m[0], y0 = m[1], z0 = m[2], x1 = m[3], y1 = m[4], z1 = m[5];
    const bx0 = m[6], by0 = m[7], bx1 = m[8], by1 = m[9], zLo = m[10], feedMmPerMin = m[11];
    const c = this.c;
    const tol = c.toleranceMm;
    const top = c.topZ;
    const sheet = c.sheet;
    const overSheet = sheet === null || (bx1 >= -tol && bx0 <= sheet.widthMm + tol && by1 >= -tol && by0 <= sheet.lengthMm + tol);
    const inStockZ = top !== null && zLo < top - tol;
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
      if (z0 >= top - tol && z1 < top - tol) {
        this.plungePoints.push({ line, x: x1, y: y1, depthMm: top - z1, feedMmPerMin: kind === 0 ? 0 : feedMmPerMin, tool, ramp: movesXY, rapid: kind === 0 });
      }
      if (kind === 1 && !drilling && !movesXY && z1 < z0 - EPS && z1 < top - tol) {
        this.plungeDepthMm += Math.min(z0, top) - z1;
        const d = this.diameterOf(tool);
        if (!this.plungeReported && d > 0 && this.plungeDepthMm > d + tol) {
          this.plungeReported = true;
          straightPlunge(this.sink, line, this.plungeDepthMm, d, tool);
        }
      } else if (kind !== 1 || movesXY || z1 > z0 + EPS) {
        this.plungeDepthMm = 0;
        this.plungeReported = false;
      }
    }

    // cutting outside the sheet
    if (sheet !== null && kind !== 0) {
      const r = this.diameterOf(tool) / 2;
      const m = r + tol;
      const outside = inStockZ && (bx0 < -m || by0 < -m || bx1 > sheet.widthMm + m || by1 > sheet.lengthMm + m);
      if (outside && !this.sheetRun) {
        outsideSheet(this.sink, line, bx0 < -m ? bx0 : bx1, by0 < -m ? by0 : by1, sheet);
      }
      this.sheetRun = outside;
    }
    // too deep into the spoilboard
    const bottomZ = c.bottomZ;
    if (bottomZ !== null) {
      const deep = zLo < bottomZ - c.spoilboardAllowanceMm - tol;
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
        const out = bx0 + off.x < -tol || bx1 + off.x > mach.travel.x + tol || by0 + off.y < -tol || by1 + off.y > mach.travel.y + tol ||
          zLo + off.z < -mach.travel.z - tol || Math.max(z0, z1) + off.z > tol;
        if (out && !this.travelRun) {
          outsideTravel(this.sink, line, mach);
        }
        this.travelRun = out;
      } else {
        if (bx0 < this.minX) this.minX = bx0;
        if (bx1 > this.maxX) this.maxX = bx1;
        if (by0 < this.minY) this.minY = by0;
        if (by1 > this.maxY) this.maxY = by1;
        if (zLo < this.minZ) this.minZ = zLo;
        const zHi = z0 > z1 ? z0 : z1;
        if (zHi > this.maxZ) this.maxZ = zHi;
        if (this.travelLine === 0 && (this.maxX - this.minX > mach.travel.x + tol || this.maxY - this.minY > mach.travel.y + tol || this.maxZ - this.minZ > mach.travel.z + tol)) {
          this.travelLine = line;
        }
      }
      if (kind !== 0 && feedMmPerMin > 0) {
        let limit: number;
        if (kind === 1) {
          const dx = Math.abs(x1 - x0), dy = Math.abs(y1 - y0), dz = Math.abs(z1 - z0);
          const len = Math.sqrt(dx * dx + dy * dy + dz * dz);
          limit = Infinity;
          if (len > EPS) {
            if (dx > EPS) limit = Math.min(limit, (mach.maxFeed.x * len) / dx);
            if (dy > EPS) limit = Math.min(limit, (mach.maxFeed.y * len) / dy);
            if (dz > EPS) limit = Math.min(limit, (mach.maxFeed.z * len) / dz);
          }
        } else {
          limit = Math.min(mach.maxFeed.x, mach.maxFeed.y);
        }
        const clamped = feedMmPerMin > limit * (1 + 1e-6);
        if (clamped && this.feedRunValue !== feedMmPerMin) {
          feedClamped(this.sink, line, feedMmPerMin, limit);
        }
        this.feedRunValue = clamped ? feedMmPerMin : -1;
      }
    }
  }

  finish(): void {
    const mach = this.c.machine;
    if (mach && !mach.workOffset && this.travelLine > 0) {
      this.sink.add('outside-travel', 'error', this.travelLine,
        () => `The program spans ${fmt(this.maxX - this.minX, 0)} × ${fmt(this.maxY - this.minY, 0)} × ${fmt(this.maxZ - this.minZ, 0)} mm, more than the machine's travel of ${fmt(mach.travel.x, 0)} × ${fmt(mach.travel.y, 0)} × ${fmt(mach.travel.z, 0)} mm (first exceeded at line ${this.travelLine}): it cannot run wherever the work offset is set.`);
    }
  }
}

// The wording of each finding, in functions of their own: a closure inside motion() would make
// V8 allocate a context for its captured values on every call, found or not.

function rapidInStock(sink: FindingSink, line: number, zLo: number, top: number): void {
  sink.add('rapid-in-stock', 'error', line,
    () => `Rapid at line ${line} moves in XY at Z ${fmt(zLo, 3)} mm, ${fmt(top - zLo, 2)} mm below the stock top, over the sheet: a rapid through material can break the tool or throw the part. Retract above the stock top before a rapid, or make the move a feed.`);
}

function spindleOff(sink: FindingSink, line: number, zLo: number, top: number): void {
  sink.add('spindle-off', 'error', line,
    () => `Feed move at line ${line} cuts ${fmt(top - zLo, 2)} mm into the stock with the spindle stopped: start the spindle (M3/M4) before the tool enters the material.`);
}

function straightPlunge(sink: FindingSink, line: number, depthMm: number, d: number, tool: number): void {
  sink.add('straight-plunge', 'info', line,
    () => `Straight plunge at line ${line}: ${fmt(depthMm, 2)} mm into the stock with no ramp, more than the ${fmt(d, 2)} mm diameter of tool T${tool}. A ramp or helix entry spares the tool's end and lets chips out.`);
}

function outsideSheet(sink: FindingSink, line: number, x: number, y: number, sheet: SheetSpec): void {
  sink.add('outside-sheet', 'warning', line,
    () => `Feed move at line ${line} reaches X ${fmt(x, 2)}, Y ${fmt(y, 2)} mm below the stock top, beyond the ${fmt(sheet.widthMm, 0)} × ${fmt(sheet.lengthMm, 0)} mm sheet by more than the tool radius: check the sheet size and the work offset.`);
}

function spoilboardDepth(sink: FindingSink, line: number, zLo: number, bottomZ: number, allowanceMm: number): void {
  sink.add('spoilboard-depth', 'warning', line,
    () => `Move at line ${line} goes to Z ${fmt(zLo, 3)} mm, ${fmt(bottomZ - zLo, 2)} mm below the sheet bottom, deeper than the ${fmt(allowanceMm, 2)} mm spoilboard allowance: it cuts the spoilboard or the table.`);
}

function outsideTravel(sink: FindingSink, line: number, mach: MachineLimits): void {
  const off = mach.workOffset!;
  sink.add('outside-travel', 'error', line,
    () => `Move at line ${line} leaves the machine's travel (X 0–${fmt(mach.travel.x, 0)}, Y 0–${fmt(mach.travel.y, 0)}, Z −${fmt(mach.travel.z, 0)}–0 mm in machine coordinates with the work offset ${fmt(off.x, 1)}, ${fmt(off.y, 1)}, ${fmt(off.z, 1)}): the machine will stop on a limit or refuse the program.`);
}

function feedClamped(sink: FindingSink, line: number, feedMmPerMin: number, limit: number): void {
  sink.add('feed-clamped', 'info', line,
    () => `Feed F${fmt(feedMmPerMin, 0)} mm/min at line ${line} is above what the machine's axis limits allow along this move (${fmt(limit, 0)} mm/min): the controller runs it slower, and the estimate uses the lower feed.`);
}
