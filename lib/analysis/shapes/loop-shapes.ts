// The outline of each closed loop as a shape shared by its congruent copies. A nested sheet
// cuts the same part many times over; the loops the cut graph gives for the copies differ only
// by where they sit. So each loop is keyed by its graph vertices on Clipper's micrometre grid
// relative to its lowest-leftmost vertex (the origin) and by its arc edges' centres, radii and
// sweeps, built in a scratch buffer and looked up in a ShapeCache; a copy whose key matches in
// full shares the first copy's ring, area, perimeter and box, and keeps only its origin. The points of a ring (arcs as
// chords) are drawn once per distinct shape. Two copies whose vertices round to the same
// micrometres get the same ring, to the micrometre: below the chain tolerance that snaps the
// graph's vertices in the first place.
import type { CutGraph } from '../graph/cut-graph';
import type { GraphLoop } from '../graph/faces';
import { reverseRing, ringAreaMm2, ringPerimeterMm, SCALE, toRing, type GridBox, type Ring } from '../geometry/polygons';
import { hashKey, ScratchKey, ShapeCache } from './shape-cache';

// a module-level copy: an imported binding is read through an accessor on every use in the hot loops
const GRID = SCALE;

/** an outline shared by congruent copies (compared by identity) */
export interface LoopShape {
  /** counter-clockwise, on the integer grid, relative to the origin */
  ring: Ring;
  areaMm2: number;
  perimeterMm: number;
  /** grid box relative to the origin */
  box: GridBox;
}

/** a loop at its place: the shared shape and the grid point its origin sits at */
export interface PlacedLoop {
  shape: LoopShape;
  ox: number;
  oy: number;
}

const ANGLE_UNITS = 1e9;

export class LoopShapes {
  private readonly cache = new ShapeCache<LoopShape>();
  /** the key of the loop being placed (copied only when its shape is new), and its hash */
  private readonly scratch = new ScratchKey();
  private hash = 0;
  get hits(): number { return this.cache.hits; }
  get misses(): number { return this.cache.misses; }

  /**
   * the shape of a graph loop and its origin; `toleranceMm` is the chord sagitta its arcs are
   * drawn with when the shape is new
   */
  place(g: CutGraph, loop: GraphLoop, toleranceMm: number): PlacedLoop {
    const { verts, start: first, length: n } = loop;
    const vx = g.vx, vy = g.vy;
    // origin: the lowest-leftmost vertex on the grid (rounded here and again in keyOf: cheaper
    // than tables of the whole graph's rounded points, which would be mostly cache misses)
    let s = 0;
    let ox = Math.round(vx[verts[first]] * GRID), oy = Math.round(vy[verts[first]] * GRID);
    for (let i = 1; i < n; i++) {
      const qx = Math.round(vx[verts[first + i]] * GRID), qy = Math.round(vy[verts[first + i]] * GRID);
      if (qy < oy || (qy === oy && qx < ox)) { s = i; ox = qx; oy = qy; }
    }
    const data = this.keyOf(g, loop, s, ox, oy);
    const k = this.scratch.key(this.hash, data, ox, oy);
    const found = this.cache.find(k);
    if (found) return { shape: found, ox, oy };
    const shape = this.cache.put(ScratchKey.kept(k), drawShape(g, loop, s, ox, oy, toleranceMm));
    return { shape, ox, oy };
  }

  /**
   * the loop's key in the scratch buffer, per edge from the origin: vertex dx, dy; radius,
   * sweep as walked, centre dx, dy (zeros for a straight edge)
   */
  private keyOf(g: CutGraph, loop: GraphLoop, s: number, ox: number, oy: number): Float64Array {
    const { verts, edges, start: first, length: n } = loop;
    const key = this.scratch.data(6 * n);
    const vx = g.vx, vy = g.vy, eArc = g.eArc, aR = g.arcs.r, aSweep = g.arcs.sweep, aCx = g.arcs.cx, aCy = g.arcs.cy, eu = g.eu;
    for (let c = 0, i = s, o = 0; c < n; c++, i = i + 1 === n ? 0 : i + 1, o += 6) {
      const v = verts[first + i], e = edges[first + i];
      const dx = Math.round(vx[v] * GRID) - ox, dy = Math.round(vy[v] * GRID) - oy;
      key[o] = dx;
      key[o + 1] = dy;
      let r = 0;
      const arc = eArc[e];
      if (aR[arc] > 0) {
        r = Math.round(aR[arc] * GRID);
        const sw = Math.round(aSweep[arc] * ANGLE_UNITS);
        key[o + 3] = eu[e] === v ? sw : -sw;
        key[o + 4] = Math.round(aCx[arc] * GRID) - ox;
        key[o + 5] = Math.round(aCy[arc] * GRID) - oy;
      } else {
        key[o + 3] = 0;
        key[o + 4] = 0;
        key[o + 5] = 0;
      }
      key[o + 2] = r;
    }
    // the hash over the vertex offsets and radii (the rest is compared on a hit)
    this.hash = hashKey(key, 6, 3, 1);
    return key;
  }
}

/**
 * The loop's ring from its origin, arc edges drawn as m ≥ 2 chords of at most toleranceMm
 * sagitta. The inner points of each arc sit on a radius ρ a little outside r, chosen so the fan
 * of chords encloses exactly the sector's area: r·ρ·sin φ + (m − 2)/2 · ρ²·sin φ = r²·θ/2 with
 * φ = θ/m (end points stay on the arc, where the arc meets its neighbours). Areas then stay
 * exact at a chord error coarse enough to keep Clipper's offsets cheap; the outline errs by
 * about a third of the sagitta either way, and the turns keep their sign, so a convex loop
 * stays convex.
 */
function drawShape(g: CutGraph, loop: GraphLoop, s: number, ox: number, oy: number, toleranceMm: number): LoopShape {
  const { verts, edges, start: first, length: n } = loop;
  // first the chord count of each arc edge, so the points go straight into their arrays
  const chords = new Int32Array(n);
  let total = n;
  for (let i = 0; i < n; i++) {
    const arc = g.eArc[edges[first + i]];
    const r = g.arcs.r[arc];
    if (r <= 0) continue;
    const step = r > toleranceMm ? 2 * Math.acos(1 - toleranceMm / r) : Math.PI / 4;
    const m = Math.max(2, Math.ceil(Math.abs(g.arcs.sweep[arc]) / step));
    chords[i] = m;
    total += m - 1;
  }
  const x = new Float64Array(total), y = new Float64Array(total);
  let o = 0;
  for (let c = 0, i = s; c < n; c++, i = i + 1 === n ? 0 : i + 1) {
    const from = verts[first + i];
    x[o] = Math.round(g.vx[from] * GRID) - ox;
    y[o] = Math.round(g.vy[from] * GRID) - oy;
    o++;
    const m = chords[i];
    if (m === 0) continue;
    const e = edges[first + i];
    const a = g.eArc[e], arcs = g.arcs;
    const r = arcs.r[a];
    const forward = g.eu[e] === from;
    const sweep = forward ? arcs.sweep[a] : -arcs.sweep[a];
    const a0 = forward ? arcs.au[a] : arcs.au[a] + arcs.sweep[a];
    const rho = areaRadius(r, Math.abs(sweep), m);
    const cx = arcs.cx[a], cy = arcs.cy[a];
    for (let k = 1; k < m; k++) {
      x[o] = Math.round((cx + rho * Math.cos(a0 + (sweep * k) / m)) * GRID) - ox;
      y[o] = Math.round((cy + rho * Math.sin(a0 + (sweep * k) / m)) * GRID) - oy;
      o++;
    }
  }
  return shapeOfRing({ x, y });
}

/** radius of the inner chord points that makes m chords of a sweep θ enclose the sector's area */
export function areaRadius(r: number, theta: number, m: number): number {
  const s = Math.sin(theta / m);
  if (s <= 0) return r;
  const c = 0.5 * r * r * theta;
  if (m === 2) return c / (r * s);
  const a = ((m - 2) / 2) * s, b = r * s;
  return (-b + Math.sqrt(b * b + 4 * a * c)) / (2 * a);
}

/** a shape from a ring already relative to its origin (turned counter-clockwise if it is not) */
export function shapeOfRing(ring: Ring): LoopShape {
  let area = ringAreaMm2(ring);
  if (area < 0) {
    reverseRing(ring);
    area = -area;
  }
  const { x, y } = ring;
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (let i = 0; i < x.length; i++) {
    const px = x[i], py = y[i];
    if (px < minX) minX = px;
    if (px > maxX) maxX = px;
    if (py < minY) minY = py;
    if (py > maxY) maxY = py;
  }
  return { ring, areaMm2: area, perimeterMm: ringPerimeterMm(ring), box: Float64Array.of(minX, minY, maxX, maxY) };
}

/**
 * a placed loop from points in mm (tests and callers without a cut graph): its own shape, with
 * the origin at its lowest-leftmost grid point
 */
export function placePoints(xs: ArrayLike<number>, ys: ArrayLike<number>): PlacedLoop {
  const ring = toRing(xs, ys);
  const qx = ring.x, qy = ring.y, n = qx.length;
  const s = lowest(ring);
  const ox = qx[s], oy = qy[s];
  for (let i = 0; i < n; i++) {
    qx[i] -= ox;
    qy[i] -= oy;
  }
  return { shape: shapeOfRing(ring), ox, oy };
}

/** index of the ring's lowest-leftmost point, a shape's origin */
export function lowest(ring: Ring): number {
  const { x, y } = ring;
  let s = 0;
  for (let i = 1; i < x.length; i++) {
    if (y[i] < y[s] || (y[i] === y[s] && x[i] < x[s])) s = i;
  }
  return s;
}
