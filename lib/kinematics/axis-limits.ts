// Per-axis projection of a machine's limits onto a direction of travel.
//
// Each axis has its own feed, rapid and acceleration limit. Moving along the unit vector u,
// axis i runs at |u_i| times the path speed, so the path may go no faster than limit_i/|u_i|
// for any moving axis: limit(u) = min over axes with u_i ≠ 0 of limit_i/|u_i|. The same holds
// for acceleration. (Straight-line interpolation of rapids is assumed: all axes arrive together.)

const EPS = 1e-12;

/** min over moving axes of limit_i/|u_i|; Infinity when no axis moves. */
export function limitAlong(ux: number, uy: number, uz: number, lx: number, ly: number, lz: number): number {
  let m = Infinity;
  const ax = ux < 0 ? -ux : ux;
  const ay = uy < 0 ? -uy : uy;
  const az = uz < 0 ? -uz : uz;
  if (ax > EPS) m = lx / ax;
  if (ay > EPS) { const v = ly / ay; if (v < m) m = v; }
  if (az > EPS) { const v = lz / az; if (v < m) m = v; }
  return m;
}

export const accelAlong = limitAlong;
