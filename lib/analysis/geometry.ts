// Polygon work for the through-cut analysis, delegated to Clipper 6 (`clipper-lib`): offsets
// by the tool radius (round joins, so the result is the region a round cutter leaves),
// boolean differences, signed areas and point-in-polygon. Clipper works on integer points, so
// millimetres are scaled to micrometres here and back.
import ClipperLib from 'clipper-lib';
import type { IntPoint, Path, Paths } from 'clipper-lib';
import type { BBox } from './types';

/** integer units per mm (1 µm resolution) */
export const SCALE = 1000;
const ARC_TOLERANCE_UNITS = 5; // 5 µm between a rounded join and its chords

export type { Path, Paths };

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

export function unionPaths(paths: Paths): Paths {
  const c = new ClipperLib.Clipper();
  c.AddPaths(paths, ClipperLib.PolyType.ptSubject, true);
  const out: Paths = [];
  c.Execute(ClipperLib.ClipType.ctUnion, out, ClipperLib.PolyFillType.pftNonZero, ClipperLib.PolyFillType.pftNonZero);
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

/** the point lies within distMm of the path's boundary */
export function nearPath(xMm: number, yMm: number, path: Path, distMm: number): boolean {
  const px = xMm * SCALE, py = yMm * SCALE, d2 = (distMm * SCALE) ** 2;
  const n = path.length;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const ax = path[j].X, ay = path[j].Y, dx = path[i].X - ax, dy = path[i].Y - ay;
    const len2 = dx * dx + dy * dy;
    let t = len2 > 0 ? ((px - ax) * dx + (py - ay) * dy) / len2 : 0;
    t = t < 0 ? 0 : t > 1 ? 1 : t;
    const ex = ax + t * dx - px, ey = ay + t * dy - py;
    if (ex * ex + ey * ey <= d2) return true;
  }
  return false;
}

export function pathsBBox(paths: Paths): BBox | null {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const p of paths) {
    for (const q of p) {
      if (q.X < minX) minX = q.X;
      if (q.X > maxX) maxX = q.X;
      if (q.Y < minY) minY = q.Y;
      if (q.Y > maxY) maxY = q.Y;
    }
  }
  if (minX > maxX) return null;
  return { minX: minX / SCALE, minY: minY / SCALE, maxX: maxX / SCALE, maxY: maxY / SCALE };
}

export function pathPerimeterMm(path: Path): number {
  let len = 0;
  const n = path.length;
  for (let i = 0; i < n; i++) {
    const a = path[i];
    const b = path[(i + 1) % n];
    len += Math.hypot(b.X - a.X, b.Y - a.Y);
  }
  return len / SCALE;
}
