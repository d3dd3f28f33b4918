// Polygon work for the through-cut analysis, delegated to Clipper 6 (`clipper-lib`): offsets
// by the tool radius (round joins, so the result is the region a round cutter leaves),
// boolean differences, signed areas and point-in-polygon. Clipper works on integer points, so
// millimetres are scaled to micrometres here and back.
import ClipperLib from 'clipper-lib';
import type { IntPoint, Path, Paths } from 'clipper-lib';
import type { BBox } from './types';
import { len2 } from './vec';

/** integer units per mm (1 µm resolution) */
export const SCALE = 1000;
const ARC_TOLERANCE_UNITS = 5; // 5 µm between a rounded join and its chords

export type { Path, Paths };

/**
 * A closed polygon on the same integer grid as Clipper's paths (SCALE units per mm), kept in two
 * typed arrays: the nesting of thousands of loops reads rings without making an object per
 * point, and a Clipper path is made from a ring only for the offsets and differences.
 */
export interface Ring {
  x: Float64Array;
  y: Float64Array;
}

/** the ring of points given in mm, rounded to the grid as toPath rounds them */
export function toRing(xs: ArrayLike<number>, ys: ArrayLike<number>): Ring {
  const n = xs.length;
  const x = new Float64Array(n), y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    x[i] = Math.round(xs[i] * SCALE);
    y[i] = Math.round(ys[i] * SCALE);
  }
  return { x, y };
}

export function ringToPath(r: Ring): Path {
  const n = r.x.length;
  const path: Path = new Array(n);
  for (let i = 0; i < n; i++) path[i] = { X: r.x[i], Y: r.y[i] };
  return path;
}

/** reverses the ring in place */
export function reverseRing(r: Ring): void {
  r.x.reverse();
  r.y.reverse();
}

/**
 * signed area in mm², positive counter-clockwise: the shoelace sum on the integer grid, the sum
 * Clipper.Area forms (tests hold the two equal)
 */
export function ringAreaMm2(r: Ring): number {
  const { x, y } = r;
  const n = x.length;
  if (n < 3) return 0;
  let a = 0;
  for (let i = 0, j = n - 1; i < n; j = i++) a += (x[j] + x[i]) * (y[j] - y[i]);
  return -a * 0.5 / (SCALE * SCALE);
}

export function ringPerimeterMm(r: Ring): number {
  const { x, y } = r;
  const n = x.length;
  let len = 0;
  for (let i = 0, j = n - 1; i < n; j = i++) len += len2(x[i] - x[j], y[i] - y[j]);
  return len / SCALE;
}

/**
 * 1 inside, 0 outside, −1 on the boundary, for a grid point (px, py): the winding-parity walk
 * of Hormann and Agathos ("The point in polygon problem for arbitrary polygons", Computational
 * Geometry 20, 2001, algorithm 6), which decides boundary points exactly on integer points.
 */
export function pointInRing(px: number, py: number, r: Ring): number {
  const { x, y } = r;
  const n = x.length;
  if (n < 3) return 0;
  let result = 0;
  let ix = x[0], iy = y[0];
  for (let i = 1; i <= n; i++) {
    const nx = i === n ? x[0] : x[i], ny = i === n ? y[0] : y[i];
    if (ny === py && (nx === px || (iy === py && (nx > px) === (ix < px)))) return -1;
    if ((iy < py) !== (ny < py)) {
      if (ix >= px) {
        if (nx > px) result = 1 - result;
        else {
          const d = (ix - px) * (ny - py) - (nx - px) * (iy - py);
          if (d === 0) return -1;
          if ((d > 0) === (ny > iy)) result = 1 - result;
        }
      } else if (nx > px) {
        const d = (ix - px) * (ny - py) - (nx - px) * (iy - py);
        if (d === 0) return -1;
        if ((d > 0) === (ny > iy)) result = 1 - result;
      }
    }
    ix = nx;
    iy = ny;
  }
  return result;
}

/** the grid point (px, py) lies within distMm of the ring's boundary */
export function nearRing(px: number, py: number, r: Ring, distMm: number): boolean {
  const { x, y } = r;
  const d2 = (distMm * SCALE) ** 2;
  const n = x.length;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const ax = x[j], ay = y[j], dx = x[i] - ax, dy = y[i] - ay;
    const l2 = dx * dx + dy * dy;
    let t = l2 > 0 ? ((px - ax) * dx + (py - ay) * dy) / l2 : 0;
    t = t < 0 ? 0 : t > 1 ? 1 : t;
    const ex = ax + t * dx - px, ey = ay + t * dy - py;
    if (ex * ex + ey * ey <= d2) return true;
  }
  return false;
}

export function toPath(xs: ArrayLike<number>, ys: ArrayLike<number>): Path {
  const n = xs.length;
  const path: Path = new Array(n);
  for (let i = 0; i < n; i++) path[i] = { X: Math.round(xs[i] * SCALE), Y: Math.round(ys[i] * SCALE) };
  return path;
}

/** signed area in mm²: positive counter-clockwise */
export function pathAreaMm2(path: Path): number {
  return ClipperLib.Clipper.Area(path) / (SCALE * SCALE);
}

export function pathsAreaMm2(paths: Paths): number {
  let a = 0;
  for (const p of paths) a += ClipperLib.Clipper.Area(p);
  return a / (SCALE * SCALE);
}

/** grows (delta > 0) or shrinks (delta < 0) closed polygons, with round joins */
export function offsetPaths(paths: Paths, deltaMm: number): Paths {
  if (deltaMm === 0) return paths.map((p) => p.slice());
  const co = new ClipperLib.ClipperOffset(2, ARC_TOLERANCE_UNITS);
  co.AddPaths(paths, ClipperLib.JoinType.jtRound, ClipperLib.EndType.etClosedPolygon);
  const out: Paths = [];
  co.Execute(out, deltaMm * SCALE);
  return out;
}

export function differencePaths(subject: Paths, clip: Paths): Paths {
  if (clip.length === 0 || subject.length === 0) return subject;
  const c = new ClipperLib.Clipper();
  c.AddPaths(subject, ClipperLib.PolyType.ptSubject, true);
  c.AddPaths(clip, ClipperLib.PolyType.ptClip, true);
  const out: Paths = [];
  c.Execute(ClipperLib.ClipType.ctDifference, out, ClipperLib.PolyFillType.pftNonZero, ClipperLib.PolyFillType.pftNonZero);
  return out;
}

/** true when every turn of the closed path goes the same way (collinear points allowed) */
export function isConvex(path: Path): boolean {
  const n = path.length;
  if (n < 3) return false;
  let sign = 0;
  for (let i = 0; i < n; i++) {
    const a = path[i], b = path[(i + 1) % n], c = path[(i + 2) % n];
    const cross = (b.X - a.X) * (c.Y - b.Y) - (b.Y - a.Y) * (c.X - b.X);
    if (cross === 0) continue;
    const s = cross > 0 ? 1 : -1;
    if (sign === 0) sign = s;
    else if (s !== sign) return false;
  }
  return sign !== 0;
}

/** every point of `inner` strictly inside `outer` */
export function pathInside(inner: Path, outer: Path): boolean {
  for (const p of inner) if (ClipperLib.Clipper.PointInPolygon(p, outer) !== 1) return false;
  return true;
}

const probe: IntPoint = { X: 0, Y: 0 };
/** 1 inside, 0 outside, −1 on the boundary (to the micrometre) */
export function pointInPath(xMm: number, yMm: number, path: Path): number {
  probe.X = Math.round(xMm * SCALE);
  probe.Y = Math.round(yMm * SCALE);
  return ClipperLib.Clipper.PointInPolygon(probe, path);
}

/** inside the region made of outer paths (positive) and hole paths (negative), Clipper's output convention */
export function pointInRegion(xMm: number, yMm: number, region: Paths, areas: number[]): boolean {
  let winding = 0;
  for (let i = 0; i < region.length; i++) {
    if (pointInPath(xMm, yMm, region[i]) === 1) winding += areas[i] > 0 ? 1 : -1;
  }
  return winding > 0;
}

/** integer bounding box [minX, minY, maxX, maxY] of paths in grid units, null when empty */
export function pathsGridBox(paths: Paths): number[] | null {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const p of paths) {
    for (const q of p) {
      if (q.X < minX) minX = q.X;
      if (q.X > maxX) maxX = q.X;
      if (q.Y < minY) minY = q.Y;
      if (q.Y > maxY) maxY = q.Y;
    }
  }
  return minX > maxX ? null : [minX, minY, maxX, maxY];
}

export function pathsBBox(paths: Paths): BBox | null {
  const b = pathsGridBox(paths);
  return b && { minX: b[0] / SCALE, minY: b[1] / SCALE, maxX: b[2] / SCALE, maxY: b[3] / SCALE };
}

export function pathPerimeterMm(path: Path): number {
  let len = 0;
  const n = path.length;
  for (let i = 0; i < n; i++) {
    const a = path[i];
    const b = path[(i + 1) % n];
    len += len2(b.X - a.X, b.Y - a.Y);
  }
  return len / SCALE;
}
