// What each closed loop of the cut graph is: cut through all round (frees what it encloses),
// through except for raised spans (tabs: count, length at the base, height above the bottom),
// or nowhere through but within the skin band (an onion skin of the thinnest layer left).
import type { CutGraph } from './cut-graph';
import type { GraphLoop } from './faces';
import type { TabDetail } from './types';

export interface LoopInfo {
  xs: Float64Array;
  ys: Float64Array;
  /** freeing move: the move that cut the last edge through; −1 when tabs or skin remain */
  freedMove: number;
  /** the move that cut the last edge within the band (the loop's final pass is done) */
  completedMove: number;
  /** first move that cut any of it within the band */
  firstMove: number;
  tool: number;
  tabs: TabDetail[];
  skinMm: number;
}

/**
 * The loop's points, arc edges drawn as m ≥ 2 chords of at most toleranceMm sagitta. The inner
 * points of each arc sit on a radius ρ a little outside r, chosen so the fan of chords encloses
 * exactly the sector's area: r·ρ·sin φ + (m − 2)/2 · ρ²·sin φ = r²·θ/2 with φ = θ/m (end points
 * stay on the arc, where the arc meets its neighbours). Areas then stay exact at a chord
 * error coarse enough to keep Clipper's offsets cheap; the outline errs by about a third of
 * the sagitta either way, and the turns keep their sign, so a convex loop stays convex.
 */
function loopPoints(g: CutGraph, loop: GraphLoop, toleranceMm: number): { xs: Float64Array; ys: Float64Array } {
  const n = loop.verts.length;
  // first the chord count of each arc edge, so the points go straight into their arrays
  const chords = new Int32Array(n);
  let total = n;
  for (let i = 0; i < n; i++) {
    const e = loop.edges[i];
    const r = g.eR[e];
    if (r <= 0) continue;
    const step = r > toleranceMm ? 2 * Math.acos(1 - toleranceMm / r) : Math.PI / 4;
    const m = Math.max(2, Math.ceil(Math.abs(g.eSweep[e]) / step));
    chords[i] = m;
    total += m - 1;
  }
  const xs = new Float64Array(total);
  const ys = new Float64Array(total);
  let o = 0;
  for (let i = 0; i < n; i++) {
    const from = loop.verts[i];
    xs[o] = g.vx[from];
    ys[o] = g.vy[from];
    o++;
    const m = chords[i];
    if (m === 0) continue;
    const e = loop.edges[i];
    const r = g.eR[e];
    const forward = g.eu[e] === from;
    const sweep = forward ? g.eSweep[e] : -g.eSweep[e];
    const a0 = forward ? g.eAu[e] : g.eAu[e] + g.eSweep[e];
    const rho = areaRadius(r, Math.abs(sweep), m);
    const cx = g.eCx[e], cy = g.eCy[e];
    for (let k = 1; k < m; k++) {
      xs[o] = cx + rho * Math.cos(a0 + (sweep * k) / m);
      ys[o] = cy + rho * Math.sin(a0 + (sweep * k) / m);
      o++;
    }
  }
  return { xs, ys };
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

/** sagitta of the chords the area work draws arcs with, mm (areas stay exact, see loopPoints) */
export const AREA_CHORD_MM = 0.05;

export function describeLoop(g: CutGraph, loop: GraphLoop, bottomZ: number, throughZ: number, line: Uint32Array, arcToleranceMm: number): LoopInfo {
  const n = loop.verts.length;
  const { xs, ys } = loopPoints(g, loop, Math.max(arcToleranceMm, AREA_CHORD_MM));
  let completed = -1, first = Infinity, freed = -1, allThrough = true, anyThrough = false, freeTool = -1;
  let skin = Infinity;
  for (let i = 0; i < n; i++) {
    const e = loop.edges[i];
    const near = g.eFirstNear[e];
    if (near > completed) completed = near;
    if (near < first) first = near;
    const ft = g.eFirstThrough[e];
    if (ft < 0 || g.eZMin[e] > throughZ) {
      allThrough = false;
      const left = g.eZMin[e] - bottomZ;
      if (left < skin) skin = left;
    } else {
      anyThrough = true;
      if (ft > freed) {
        freed = ft;
        freeTool = g.eTool[e];
      }
    }
  }
  const tabs: TabDetail[] = [];
  if (!allThrough && anyThrough) {
    // rotate to a through edge, then read the raised runs
    let s = 0;
    while (g.eFirstThrough[loop.edges[s]] < 0) s++;
    let runLen = 0, runTop = -Infinity, runFirst = Infinity;
    for (let j = 1; j <= n; j++) {
      const e = loop.edges[(s + j) % n];
      const raised = g.eFirstThrough[e] < 0;
      if (raised) {
        runLen += g.edgeLengthMm(e);
        if (g.eZTop[e] > runTop) runTop = g.eZTop[e];
        if (g.eFirstNear[e] < runFirst) runFirst = g.eFirstNear[e];
      } else if (runLen > 0) {
        tabs.push({ lengthMm: runLen, heightMm: runTop - bottomZ, line: line[runFirst] });
        runLen = 0; runTop = -Infinity; runFirst = Infinity;
      }
    }
  }
  return {
    xs,
    ys,
    freedMove: allThrough ? freed : -1,
    completedMove: completed,
    firstMove: first === Infinity ? -1 : first,
    tool: allThrough ? freeTool : g.eTool[loop.edges[0]],
    tabs,
    skinMm: !allThrough && !anyThrough ? Math.max(0, skin) : 0,
  };
}
