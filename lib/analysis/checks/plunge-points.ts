// The points where the tool enters the stock, kept in columns: a nested sheet has a plunge
// for every pass of every loop (about 150,000 in the generated 1,000,000-line program), and an
// object with four boxed numbers for each would sit on the heap through every collection the
// analysis pays for. Read them with at() or for…of; JSON.stringify and toArray() give the
// list of PlungePoint objects the stored estimate and the CLI print.
import { grownF64, grownI32 } from '../typed-arrays';
import type { PlungePoint } from '../types';

const RAMP = 1, RAPID = 2;

export class PlungePoints implements Iterable<PlungePoint> {
  private n = 0;
  private lines = new Int32Array(256);
  private tools = new Int32Array(256);
  private flags = new Int32Array(256);
  private xs = new Float64Array(256);
  private ys = new Float64Array(256);
  private depths = new Float64Array(256);
  private feeds = new Float64Array(256);
  /**
   * the numbers of the point for push(): x, y, depth below the stock top (mm), feed (mm/min).
   * Passed through this array rather than as arguments, which a call that is not inlined boxes.
   */
  readonly io = new Float64Array(4);

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
    this.xs[i] = io[0];
    this.ys[i] = io[1];
    this.depths[i] = io[2];
    this.feeds[i] = io[3];
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
