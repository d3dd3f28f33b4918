// Arc geometry for G2/G3 in planes G17 (XY), G18 (ZX) and G19 (YZ), after NISTIR 6556
// §3.5.3: the centre from I J K offsets or from a signed radius R, the signed sweep, the
// helix length (feed is along the helix, §2.1.2.5) and chord flattening within a tolerance
// e: n = ceil(θ / (2·acos(1 − e/r))) chords, each with sagitta ≤ e (docs/references.md, Motion).
//
// In-plane coordinates (a, b) follow the standard's axis order: G17 (X, Y), G18 (Z, X),
// G19 (Y, Z); the normal axis is Z, Y, X. A positive sweep turns counter-clockwise seen from
// the normal's positive side, which is G3.
import type { MoveList, Xyz } from './move-list';

export const TWO_PI = 2 * Math.PI;

/** signed sweep from start angle to end angle; full turn when the ends coincide */
export function arcSweep(sa: number, sb: number, ea: number, eb: number, ca: number, cb: number, ccw: boolean, fullTurnIfClosed: boolean): number {
  const a0 = Math.atan2(sb - cb, sa - ca);
  const a1 = Math.atan2(eb - cb, ea - ca);
  let d = a1 - a0;
  const closed = Math.abs(ea - sa) < 1e-9 && Math.abs(eb - sb) < 1e-9;
  if (closed) return fullTurnIfClosed ? (ccw ? TWO_PI : -TWO_PI) : 0;
  if (ccw) {
    while (d <= 0) d += TWO_PI;
    while (d > TWO_PI) d -= TWO_PI;
  } else {
    while (d >= 0) d -= TWO_PI;
    while (d < -TWO_PI) d += TWO_PI;
  }
  return d;
}

export interface RadiusCentre {
  ok: boolean;
  ca: number;
  cb: number;
  /** the |R| actually used (half the chord when R fell short within tolerance) */
  radius: number;
}

/**
 * Centre of a radius-format arc (§3.5.3.1): positive R turns ≤ 180°, negative R > 180°.
 * Fails when |R| is shorter than half the chord by more than `tol`.
 */
export function centreFromRadius(sa: number, sb: number, ea: number, eb: number, r: number, ccw: boolean, tol: number, out: RadiusCentre): RadiusCentre {
  const da = ea - sa;
  const db = eb - sb;
  const d = Math.hypot(da, db);
  const half = d / 2;
  const ar = Math.abs(r);
  out.ok = true;
  out.radius = ar;
  if (d === 0) {
    out.ok = false;
    return out;
  }
  let h: number;
  if (ar < half) {
    if (half - ar > tol) {
      out.ok = false;
      return out;
    }
    h = 0;
    out.radius = half;
  } else {
    h = Math.sqrt(ar * ar - half * half);
  }
  // left-hand normal of the chord; a CCW short arc has its centre on the left
  const na = -db / d;
  const nb = da / d;
  const side = (ccw ? 1 : -1) * (r < 0 ? -1 : 1);
  out.ca = sa + da / 2 + side * h * na;
  out.cb = sb + db / 2 + side * h * nb;
  return out;
}

/** length along the helix: √((r·θ)² + h²) */
export function helixLength(radius: number, sweepRad: number, rise: number): number {
  const s = radius * Math.abs(sweepRad);
  return rise === 0 ? s : Math.sqrt(s * s + rise * rise);
}

/** chords needed so that no chord's sagitta exceeds toleranceMm */
export function arcChordCount(radius: number, sweepRad: number, toleranceMm: number): number {
  const t = Math.abs(sweepRad);
  if (!(radius > 0) || t === 0) return 1;
  if (!(toleranceMm > 0)) return Math.max(1, Math.ceil(t / (Math.PI / 180)));
  const step = 2 * Math.acos(Math.max(-1, 1 - toleranceMm / radius));
  return Math.max(1, Math.ceil(t / step - 1e-12));
}

/** index in moves.arcs of the arc written by move `moveIndex`, or -1 */
export function arcIndexOfMove(moves: MoveList, moveIndex: number): number {
  const a = moves.arcs.move;
  let lo = 0;
  let hi = moves.arcs.count - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const v = a[mid];
    if (v === moveIndex) return mid;
    if (v < moveIndex) lo = mid + 1;
    else hi = mid - 1;
  }
  return -1;
}

function startOf(moves: MoveList, i: number, out: Xyz): Xyz {
  if (i === 0) {
    out.x = moves.startX;
    out.y = moves.startY;
    out.z = moves.startZ;
  } else {
    out.x = moves.x[i - 1];
    out.y = moves.y[i - 1];
    out.z = moves.z[i - 1];
  }
  return out;
}

const tmpStart: Xyz = { x: 0, y: 0, z: 0 };

/** point at fraction t (0…1) of arc `arcIndex`, written to out */
export function arcPoint(moves: MoveList, arcIndex: number, t: number, out: Xyz): Xyz {
  const a = moves.arcs;
  const i = a.move[arcIndex];
  const s = startOf(moves, i, tmpStart);
  const plane = a.plane[arcIndex];
  const r = a.radius[arcIndex];
  const sweep = a.sweep[arcIndex];
  const ex = moves.x[i];
  const ey = moves.y[i];
  const ez = moves.z[i];
  if (plane === 0) {
    const a0 = Math.atan2(s.y - a.cy[arcIndex], s.x - a.cx[arcIndex]) + sweep * t;
    out.x = a.cx[arcIndex] + r * Math.cos(a0);
    out.y = a.cy[arcIndex] + r * Math.sin(a0);
    out.z = s.z + (ez - s.z) * t;
  } else if (plane === 1) {
    const a0 = Math.atan2(s.x - a.cx[arcIndex], s.z - a.cz[arcIndex]) + sweep * t;
    out.z = a.cz[arcIndex] + r * Math.cos(a0);
    out.x = a.cx[arcIndex] + r * Math.sin(a0);
    out.y = s.y + (ey - s.y) * t;
  } else {
    const a0 = Math.atan2(s.z - a.cz[arcIndex], s.y - a.cy[arcIndex]) + sweep * t;
    out.y = a.cy[arcIndex] + r * Math.cos(a0);
    out.z = a.cz[arcIndex] + r * Math.sin(a0);
    out.x = s.x + (ex - s.x) * t;
  }
  if (t === 1) {
    // the commanded end, exactly, so chains stay contiguous
    out.x = ex;
    out.y = ey;
    out.z = ez;
  }
  return out;
}

const tmpPoint: Xyz = { x: 0, y: 0, z: 0 };

/**
 * Flattens arc `arcIndex` into chords within toleranceMm. Appends the chord end points
 * (x, y, z triples, the arc's start excluded, its exact end last) to `out`; returns the
 * number of chords.
 */
export function flattenArc(moves: MoveList, arcIndex: number, toleranceMm: number, out: number[]): number {
  const a = moves.arcs;
  const n = arcChordCount(a.radius[arcIndex], a.sweep[arcIndex], toleranceMm);
  for (let k = 1; k <= n; k++) {
    const p = arcPoint(moves, arcIndex, k / n, tmpPoint);
    out.push(p.x, p.y, p.z);
  }
  return n;
}

/** length of arc `arcIndex` along its helix, mm */
export function arcLength(moves: MoveList, arcIndex: number): number {
  const a = moves.arcs;
  const i = a.move[arcIndex];
  const s = startOf(moves, i, tmpStart);
  const plane = a.plane[arcIndex];
  const rise = plane === 0 ? moves.z[i] - s.z : plane === 1 ? moves.y[i] - s.y : moves.x[i] - s.x;
  return helixLength(a.radius[arcIndex], a.sweep[arcIndex], rise);
}

/** length of move i (arcs along the helix, records at rest 0), mm */
export function moveLength(moves: MoveList, i: number): number {
  const k = moves.kind[i];
  if (k === 2) return arcLength(moves, arcIndexOfMove(moves, i));
  if (k > 2) return 0;
  const s = startOf(moves, i, tmpStart);
  return Math.hypot(moves.x[i] - s.x, moves.y[i] - s.y, moves.z[i] - s.z);
}
