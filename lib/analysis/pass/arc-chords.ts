// Arcs of the move list (centre, radius, signed sweep, plane) turned into chords for the XY
// analysis. Chord count for a tolerance e: n = ⌈θ / (2·acos(1 − e/r))⌉ (sagitta of a chord,
// h = r(1 − cos(θ/2)); see docs/references.md, Motion). Points advance by a fixed rotation, so a
// chord costs a few multiplications, not a sine and a cosine.
import type { ArcTable } from '@/lib/gcode/move-list';
import { MoveSlot } from '../checks/program-checks';

const X0 = MoveSlot.x0, Y0 = MoveSlot.y0, Z0 = MoveSlot.z0, X1 = MoveSlot.x1, Y1 = MoveSlot.y1, Z1 = MoveSlot.z1;

export class ArcChords {
  x = new Float64Array(256);
  y = new Float64Array(256);
  z = new Float64Array(256);
  /** number of points, the start point included */
  count = 0;

  private ensure(n: number) {
    if (n <= this.x.length) return;
    let len = this.x.length;
    while (len < n) len *= 2;
    this.x = new Float64Array(len);
    this.y = new Float64Array(len);
    this.z = new Float64Array(len);
  }

  /**
   * flattens row `arc` of the arc table, from its move's start to its end given in `move` (the
   * move pass's buffer, MoveSlot x0 … z1), within toleranceMm (the points come in an array: as
   * arguments they would be boxed on every call)
   */
  flatten(arcs: ArcTable, arc: number, move: Float64Array, toleranceMm: number): void {
    const x0 = move[X0], y0 = move[Y0], z0 = move[Z0], x1 = move[X1], y1 = move[Y1], z1 = move[Z1];
    const r = arcs.radius[arc];
    const sweep = arcs.sweep[arc];
    const plane = arcs.plane[arc];
    const theta = Math.abs(sweep);
    let n = 1;
    if (r > toleranceMm && theta > 1e-9) {
      const step = 2 * Math.acos(1 - toleranceMm / r);
      n = Math.max(1, Math.ceil(theta / step));
    } else if (theta > 1e-9) {
      n = Math.max(1, Math.ceil(theta / (Math.PI / 2)));
    }
    if (n > 100000) n = 100000;
    this.ensure(n + 1);
    // in-plane coordinates (u, v) and the normal coordinate w, per RS274/NGC plane selection
    let u0: number, v0: number, w0: number, w1: number, cu: number, cv: number;
    if (plane === 0) {
      u0 = x0; v0 = y0; w0 = z0; w1 = z1; cu = arcs.cx[arc]; cv = arcs.cy[arc];
    } else if (plane === 1) {
      u0 = z0; v0 = x0; w0 = y0; w1 = y1; cu = arcs.cz[arc]; cv = arcs.cx[arc];
    } else {
      u0 = y0; v0 = z0; w0 = x0; w1 = x1; cu = arcs.cy[arc]; cv = arcs.cz[arc];
    }
    const d = sweep / n;
    const c = Math.cos(d);
    const s = Math.sin(d);
    let du = u0 - cu;
    let dv = v0 - cv;
    const xs = this.x, ys = this.y, zs = this.z;
    xs[0] = x0; ys[0] = y0; zs[0] = z0;
    for (let i = 1; i < n; i++) {
      const nu = du * c - dv * s;
      dv = du * s + dv * c;
      du = nu;
      const w = w0 + ((w1 - w0) * i) / n;
      const u = cu + du, v = cv + dv;
      if (plane === 0) { xs[i] = u; ys[i] = v; zs[i] = w; }
      else if (plane === 1) { zs[i] = u; xs[i] = v; ys[i] = w; }
      else { ys[i] = u; zs[i] = v; xs[i] = w; }
    }
    // the last point is the programmed end, exactly, so loops close on the same key
    xs[n] = x1; ys[n] = y1; zs[n] = z1;
    this.count = n + 1;
  }
}
