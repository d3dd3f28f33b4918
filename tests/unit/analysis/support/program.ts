// A small writer of move lists for the analysis tests: fills the typed arrays of the move-list
// contract (lib/gcode/move-list.ts) directly, with one source line per move, and draws the
// shapes the fixtures need (rectangles and circles in passes, with tabs), so the analysis can
// be tested apart from the interpreter.
import { MoveFlag, MoveKind, type MoveList } from '@/lib/gcode/move-list';

export interface TabSpec {
  /** tabs per side of a rectangle, or per circle */
  perSide: number;
  lengthMm: number;
  heightMm: number;
}

export class ProgramWriter {
  private rows: number[][] = [];
  private arcRows: number[][] = [];
  x = 0; y = 0; z = 10;
  tool = 1;
  rpm = 18000;
  line = 0;
  safeZ = 5;
  feedMmPerMin = 3000;

  constructor(start: { x: number; y: number; z: number } = { x: 0, y: 0, z: 10 }) {
    this.x = start.x; this.y = start.y; this.z = start.z;
    this.start = { ...start };
  }
  private start: { x: number; y: number; z: number };

  private push(kind: number, x: number, y: number, z: number, feed: number, aux = 0): number {
    this.line++;
    const flags = this.rpm > 0 ? MoveFlag.spindleOn : 0;
    this.rows.push([kind, x, y, z, feed, flags, this.tool, this.rpm, aux, this.line]);
    this.x = x; this.y = y; this.z = z;
    return this.rows.length - 1;
  }

  rapid(x: number, y: number, z: number): this { this.push(MoveKind.rapid, x, y, z, 0); return this; }
  feed(x: number, y: number, z: number, f = this.feedMmPerMin): this { this.push(MoveKind.feed, x, y, z, f); return this; }
  toolChange(t: number): this { this.tool = t; this.push(MoveKind.toolChange, this.x, this.y, this.z, 0); return this; }
  spindleOff(): this { this.rpm = 0; this.push(MoveKind.spindleStop, this.x, this.y, this.z, 0); return this; }
  spindleOn(rpm = 18000): this { this.rpm = rpm; this.push(MoveKind.spindleStart, this.x, this.y, this.z, 0); return this; }

  /** XY arc about (cx, cy) to (x, y, z); clockwise = G2. End equal to start is a full circle. */
  arc(x: number, y: number, z: number, cx: number, cy: number, clockwise: boolean, f = this.feedMmPerMin): this {
    const r = Math.hypot(this.x - cx, this.y - cy);
    const a0 = Math.atan2(this.y - cy, this.x - cx);
    const a1 = Math.atan2(y - cy, x - cx);
    let sweep = a1 - a0;
    if (clockwise) { while (sweep >= -1e-12) sweep -= 2 * Math.PI; }
    else { while (sweep <= 1e-12) sweep += 2 * Math.PI; }
    const zStart = this.z;
    const i = this.push(MoveKind.arc, x, y, z, f);
    this.arcRows.push([i, cx, cy, zStart, r, sweep, 0]);
    return this;
  }

  retract(): this { return this.rapid(this.x, this.y, this.safeZ); }

  /** rectangle (x0,y0)–(x1,y1), counter-clockwise unless cw, one lap per depth; tabs on the last lap */
  rect(x0: number, y0: number, x1: number, y1: number, depths: number[], opts: { cw?: boolean; tabs?: TabSpec } = {}): this {
    const corners = opts.cw ? [[x0, y0], [x0, y1], [x1, y1], [x1, y0]] : [[x0, y0], [x1, y0], [x1, y1], [x0, y1]];
    this.rapid(this.x, this.y, this.safeZ).rapid(x0, y0, this.safeZ);
    depths.forEach((d, pass) => {
      this.feed(x0, y0, d, 600);
      const last = pass === depths.length - 1;
      for (let c = 1; c <= 4; c++) {
        const [ax, ay] = corners[c - 1];
        const [bx, by] = corners[c % 4];
        if (last && opts.tabs) this.sideWithTabs(ax, ay, bx, by, d, opts.tabs);
        else this.feed(bx, by, d);
      }
    });
    return this.retract();
  }

  private sideWithTabs(ax: number, ay: number, bx: number, by: number, d: number, t: TabSpec): void {
    const len = Math.hypot(bx - ax, by - ay);
    for (let k = 0; k < t.perSide; k++) {
      const mid = ((k + 0.5) * len) / t.perSide;
      const s0 = (mid - t.lengthMm / 2) / len, s1 = (mid + t.lengthMm / 2) / len;
      const p = (s: number) => [ax + (bx - ax) * s, ay + (by - ay) * s];
      const [px0, py0] = p(s0);
      const [px1, py1] = p(s1);
      this.feed(px0, py0, d).feed(px0, py0, d + t.heightMm).feed(px1, py1, d + t.heightMm).feed(px1, py1, d);
    }
    this.feed(bx, by, d);
  }

  /** circle of radius r about (cx, cy) from its rightmost point, G2 halves, one lap per depth */
  circle(cx: number, cy: number, r: number, depths: number[], opts: { ccw?: boolean } = {}): this {
    this.rapid(this.x, this.y, this.safeZ).rapid(cx + r, cy, this.safeZ);
    const cw = !opts.ccw;
    for (const d of depths) {
      this.feed(cx + r, cy, d, 600);
      this.arc(cx - r, cy, d, cx, cy, cw).arc(cx + r, cy, d, cx, cy, cw);
    }
    return this.retract();
  }

  build(): MoveList {
    const n = this.rows.length;
    const m = this.arcRows.length;
    const ml: MoveList = {
      count: n, startX: this.start.x, startY: this.start.y, startZ: this.start.z,
      x: new Float64Array(n), y: new Float64Array(n), z: new Float64Array(n),
      kind: new Uint8Array(n), flags: new Uint8Array(n), tool: new Uint16Array(n),
      feed: new Float32Array(n), spindle: new Float32Array(n), aux: new Float32Array(n), line: new Uint32Array(n),
      arcs: { count: m, move: new Uint32Array(m), cx: new Float64Array(m), cy: new Float64Array(m), cz: new Float64Array(m), radius: new Float64Array(m), sweep: new Float64Array(m), plane: new Uint8Array(m) },
    };
    this.rows.forEach((r, i) => {
      ml.kind[i] = r[0]; ml.x[i] = r[1]; ml.y[i] = r[2]; ml.z[i] = r[3]; ml.feed[i] = r[4];
      ml.flags[i] = r[5]; ml.tool[i] = r[6]; ml.spindle[i] = r[7]; ml.aux[i] = r[8]; ml.line[i] = r[9];
    });
    this.arcRows.forEach((a, k) => {
      ml.arcs.move[k] = a[0]; ml.arcs.cx[k] = a[1]; ml.arcs.cy[k] = a[2]; ml.arcs.cz[k] = a[3];
      ml.arcs.radius[k] = a[4]; ml.arcs.sweep[k] = a[5]; ml.arcs.plane[k] = a[6];
    });
    return ml;
  }
}

/** the same program moved by (dx, dy) and, if mirrorAt is given, mirrored about x = mirrorAt/2 (x → mirrorAt − x) */
export function transformMoves(src: MoveList, dx: number, dy: number, mirrorAt?: number): MoveList {
  const fx = (v: number) => (mirrorAt !== undefined ? mirrorAt - v : v) + dx;
  const out: MoveList = { ...src, x: src.x.map(fx), y: src.y.map((v) => v + dy), startX: fx(src.startX), startY: src.startY + dy,
    arcs: { ...src.arcs, cx: src.arcs.cx.map(fx), cy: src.arcs.cy.map((v) => v + dy), sweep: mirrorAt !== undefined ? src.arcs.sweep.map((v) => -v) : src.arcs.sweep.slice() } };
  return out;
}
