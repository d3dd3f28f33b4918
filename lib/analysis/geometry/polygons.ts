// Polygon work for the through-cut analysis, delegated to Clipper 6.4.2 compiled to WebAssembly
// (`js-angusj-clipper`): offsets by the tool radius (round joins, so the result is the region a
// round cutter leaves), boolean differences, signed areas and point-in-polygon. Clipper works on
// integer points, so millimetres are scaled to micrometres here and back. The WebAssembly module
// loads asynchronously: loadClipper() once, then every helper here is synchronous.
import {
  ClipperError, ClipType, EndType, JoinType, loadNativeClipperLibInstanceAsync, NativeClipperLibRequestedFormat, PolyFillType,
  type ClipParams, type ClipperLibWrapper, type IntPoint, type Path, type Paths,
} from 'js-angusj-clipper';
import type { BBox } from '../types';
import { len2 } from './vec';

/** integer units per mm (1 µm resolution) */
export const SCALE = 1000;
const ARC_TOLERANCE_UNITS = 5; // 5 µm between a rounded join and its chords
/** Clipper's default and smallest miter limit; only square and miter joins read it */
const MITER_LIMIT = 2;

export type { Path, Paths };

let clipper: ClipperLibWrapper | null = null;
let loading: Promise<void> | null = null;

/**
 * Loads the WebAssembly build once (one shared promise). WebAssembly only, no asm.js fallback:
 * every Node and browser the product supports runs WebAssembly; the asm.js build is 2–2.5×
 * slower (the package's own benchmarks), so falling back would hide a failure as a slowdown;
 * and the package's fallback only catches a loader that throws at once, while a WebAssembly
 * load fails later, by rejecting, so it would not engage anyway.
 */
export function loadClipper(): Promise<void> {
  return (loading ??= loadNativeClipperLibInstanceAsync(NativeClipperLibRequestedFormat.WasmOnly).then((lib) => {
    clipper = lib;
  }));
}

/** the loaded library; throws when loadClipper() has not finished (analyze() calls it first) */
export function loadedClipper(): ClipperLibWrapper {
  if (clipper) return clipper;
  throw new Error('The through-cut analysis uses Clipper compiled to WebAssembly, which is not loaded yet: `await loadAnalysis()` (from lib/analysis) once before calling analyze() or the geometry helpers.');
}

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
  for (let i = 0; i < n; i++) path[i] = { x: r.x[i], y: r.y[i] };
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
  for (let i = 0; i < n; i++) path[i] = { x: Math.round(xs[i] * SCALE), y: Math.round(ys[i] * SCALE) };
  return path;
}

/** signed area in mm²: positive counter-clockwise */
export function pathAreaMm2(path: Path): number {
  return loadedClipper().area(path) / (SCALE * SCALE);
}

export function pathsAreaMm2(paths: Paths): number {
  const lib = loadedClipper();
  let a = 0;
  for (const p of paths) a += lib.area(p);
  return a / (SCALE * SCALE);
}

/** grows (delta > 0) or shrinks (delta < 0) closed polygons, with round joins */
export function offsetPaths(paths: Paths, deltaMm: number): Paths {
  const lib = loadedClipper();
  if (deltaMm === 0) return paths.map((p) => p.slice());
  const out = lib.offsetToPaths({
    delta: deltaMm * SCALE,
    arcTolerance: ARC_TOLERANCE_UNITS,
    miterLimit: MITER_LIMIT,
    // one input of all the paths: the library copies them into WebAssembly memory in one block
    offsetInputs: [{ data: paths, joinType: JoinType.Round, endType: EndType.ClosedPolygon }],
  });
  if (!out) throw new Error(`Clipper could not offset ${paths.length} paths by ${deltaMm} mm`);
  return out;
}

/** subject minus clip, non-zero fill on both */
export function differencePaths(subject: Paths, clip: Paths): Paths {
  const lib = loadedClipper();
  if (clip.length === 0 || subject.length === 0) return subject;
  const subjectInputs = [{ data: subject, closed: true }];
  const nonZero = PolyFillType.NonZero;
  // the wrapper refuses a side none of whose paths Clipper takes (all degenerate: no three
  // points off one line), where Clipper itself, as clipper-lib, clips without it: the subject's
  // union when the clip is empty, nothing when the subject is
  return clipOrNull(lib, { clipType: ClipType.Difference, subjectInputs, clipInputs: [{ data: clip }], subjectFillType: nonZero, clipFillType: nonZero })
    ?? clipOrNull(lib, { clipType: ClipType.Union, subjectInputs, subjectFillType: nonZero })
    ?? [];
}

function clipOrNull(lib: ClipperLibWrapper, params: ClipParams): Paths | null {
  try {
    return lib.clipToPaths(params);
  } catch (err) {
    if (err instanceof ClipperError && err.message === 'invalid paths') return null;
    throw err;
  }
}

/** true when every turn of the closed path goes the same way (collinear points allowed) */
export function isConvex(path: Path): boolean {
  const n = path.length;
  if (n < 3) return false;
  let sign = 0;
  for (let i = 0; i < n; i++) {
    const a = path[i], b = path[(i + 1) % n], c = path[(i + 2) % n];
    const cross = (b.x - a.x) * (c.y - b.y) - (b.y - a.y) * (c.x - b.x);
    if (cross === 0) continue;
    const s = cross > 0 ? 1 : -1;
    if (sign === 0) sign = s;
    else if (s !== sign) return false;
  }
  return sign !== 0;
}

/** every point of `inner` strictly inside `outer` */
export function pathInside(inner: Path, outer: Path): boolean {
  const lib = loadedClipper();
  for (const p of inner) if (lib.pointInPolygon(p, outer) !== 1) return false;
  return true;
}

const probe: IntPoint = { x: 0, y: 0 };
/** 1 inside, 0 outside, −1 on the boundary (to the micrometre) */
export function pointInPath(xMm: number, yMm: number, path: Path): number {
  probe.x = Math.round(xMm * SCALE);
  probe.y = Math.round(yMm * SCALE);
  return loadedClipper().pointInPolygon(probe, path);
}

/** inside the region made of outer paths (positive) and hole paths (negative), Clipper's output convention */
export function pointInRegion(xMm: number, yMm: number, region: Paths, areas: number[]): boolean {
  let winding = 0;
  for (let i = 0; i < region.length; i++) {
    if (pointInPath(xMm, yMm, region[i]) === 1) winding += areas[i] > 0 ? 1 : -1;
  }
  return winding > 0;
}

/**
 * A box on Clipper's integer grid (SCALE units per mm): minX, minY, maxX, maxY. The one grid box
 * type; it stays inside the shape stages, and leaves them as a BBox in mm (gridBoxMm).
 */
export type GridBox = Float64Array;

/** the grid box of paths, null when empty */
export function pathsGridBox(paths: Paths): GridBox | null {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const p of paths) {
    for (const q of p) {
      if (q.x < minX) minX = q.x;
      if (q.x > maxX) maxX = q.x;
      if (q.y < minY) minY = q.y;
      if (q.y > maxY) maxY = q.y;
    }
  }
  return minX > maxX ? null : Float64Array.of(minX, minY, maxX, maxY);
}

export function pathsBBox(paths: Paths): BBox | null {
  const b = pathsGridBox(paths);
  return b && gridBoxMm(b, 0, 0);
}

/**
 * The one conversion of a grid box (relative to the grid point ox, oy) to the box in mm that
 * leaves the shape stages.
 */
export function gridBoxMm(b: GridBox, ox: number, oy: number): BBox {
  return { minX: (b[0] + ox) / SCALE, minY: (b[1] + oy) / SCALE, maxX: (b[2] + ox) / SCALE, maxY: (b[3] + oy) / SCALE };
}

export function pathPerimeterMm(path: Path): number {
  let len = 0;
  const n = path.length;
  for (let i = 0; i < n; i++) {
    const a = path[i];
    const b = path[(i + 1) % n];
    len += len2(b.x - a.x, b.y - a.y);
  }
  return len / SCALE;
}
