// The points where the tool enters the stock, kept in columns: a nested sheet has a plunge
// for every pass of every loop (about 150,000 in the generated 1,000,000-line program), and an
// object with four boxed numbers for each would sit on the heap through every collection the
// analysis pays for. Read them with at() or for…of; JSON.stringify and toArray() give the
// list of PlungePoint objects the stored estimate and the CLI print.
import { grownF64, grownI32 } from '../typed-arrays';
import type { PlungePoint } from '../types';

const RAMP = 1, RAPID = 2;

/**
 * The slots of PlungePoints.io, the numbers of the point push() records: where it enters, mm,
 * its depth below the stock top, mm, and its feed, mm/min. Passed through this array rather
 * than as arguments, which a call that is not inlined boxes.
 */
export const PlungeSlot = { x: 0, y: 1, depthMm: 2, feedMmPerMin: 3, size: 4 } as const;
const P_X = PlungeSlot.x, P_Y = PlungeSlot.y, P_DEPTH = PlungeSlot.depthMm, P_FEED = PlungeSlot.feedMmPerMin;

export class PlungePoints implements Iterable<PlungePoint> {
  private n = 0;
  private lines = new Int32Array(256);
  private tools = new Int32Array(256);
  private flags = new Int32Array(256);
  private xs = new Float64Array(256);
  private ys = new Float64Array(256);
  private depths = new Float64Array(256);
  private feeds = new Float64Array(256);
  /** the numbers of the point for push(), in the slots of PlungeSlot */
  readonly io = new Float64Array(PlungeSlot.size);

  get length(): number {
    return this.n;
  }

  /** records the point in io, entered at `line` with `tool`, as a ramp and/or a rapid */
  push(line: number, tool: number, ramp: boolean, rapid: boolean): void {
    const i = this.n++;
    if (i === this.lines.length) this.grow();
    const io = this.io;
    this.lines[i] = line;
    this.tools[i] = tool;
    this.flags[i] = (ramp ? RAMP : 0) | (rapid ? RAPID : 0);
    this.xs[i] = io[P_X];
    this.ys[i] = io[P_Y];
    this.depths[i] = io[P_DEPTH];
    this.feeds[i] = io[P_FEED];
  }

  /** the i-th point (negative i counts from the end, as Array.prototype.at), or undefined */
  at(i: number): PlungePoint | undefined {
    const k = i < 0 ? this.n + i : i;
    if (!(k >= 0 && k < this.n)) return undefined;
    const f = this.flags[k];
    return {
      line: this.lines[k], x: this.xs[k], y: this.ys[k], depthMm: this.depths[k], feedMmPerMin: this.feeds[k],
      tool: this.tools[k], ramp: (f & RAMP) !== 0, rapid: (f & RAPID) !== 0,
    };
  }

  *[Symbol.iterator](): Iterator<PlungePoint> {
    for (let i = 0; i < this.n; i++) yield this.at(i)!;
  }

  toArray(): PlungePoint[] {
    const out: PlungePoint[] = new Array(this.n);
    for (let i = 0; i < this.n; i++) out[i] = this.at(i)!;
    return out;
  }

  toJSON(): PlungePoint[] {
    return this.toArray();
  }

  private grow(): void {
    const n = 2 * this.lines.length;
    this.lines = grownI32(this.lines, n);
    this.tools = grownI32(this.tools, n);
    this.flags = grownI32(this.flags, n);
    this.xs = grownF64(this.xs, n);
    this.ys = grownF64(this.ys, n);
    this.depths = grownF64(this.depths, n);
    this.feeds = grownF64(this.feeds, n);
  }
}
