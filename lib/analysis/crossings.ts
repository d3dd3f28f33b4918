// Through cuts that cross each other away from a shared point: two profiles overlap, or a
// profile runs through another part. The loops such edges bound are not real parts, so they
// are left out of the part list and reported once. Edges are walked cell by cell through a
// uniform grid (Amanatides–Woo traversal) and tested pairwise within each cell; a crossing is
// counted in the cell that holds it, so each pair counts once. Arc edges are tested by chord.
import type { CutGraph } from './cut-graph';
import { len2 } from './vec';

export interface Crossing {
  x: number;
  y: number;
  edgeA: number;
  edgeB: number;
}

const MAX_PAIR_TESTS = 30_000_000;
/** more through-cut edges than this in one cell (half an average edge across) is many cuts on top of each other */
const DENSE_CELL_EDGES = 128;

/** edge b runs along arc edge a (both its ends within the arc's chord error of the circle) */
function alongArc(g: CutGraph, a: number, b: number, tol: number): boolean {
  const r = g.eR[a];
  if (r <= 0) return false;
  const band = r * (1 - Math.cos(g.eSweep[a] / 2)) + tol;
  const cx = g.eCx[a], cy = g.eCy[a];
  const d0 = len2(g.vx[g.eu[b]] - cx, g.vy[g.eu[b]] - cy);
  const d1 = len2(g.vx[g.ev[b]] - cx, g.vy[g.ev[b]] - cy);
  return Math.abs(d0 - r) <= band && Math.abs(d1 - r) <= band;
}

interface Grid {
  minX: number;
  minY: number;
  cell: number;
  nx: number;
  ny: number;
}

/**
 * the cells edge e passes through, in order: counted into counts[c + 1] (first pass), or with
 * items given, written at fill[c] (second pass); a plain function, not a callback per cell
 */
function walkCells(g: CutGraph, e: number, grid: Grid, counts: Int32Array | null, fill: Int32Array | null, items: Int32Array | null): void {
  const { minX, minY, cell, nx, ny } = grid;
  const ax = (g.vx[g.eu[e]] - minX) / cell, ay = (g.vy[g.eu[e]] - minY) / cell;
  const bx = (g.vx[g.ev[e]] - minX) / cell, by = (g.vy[g.ev[e]] - minY) / cell;
  let cx = Math.min(nx - 1, Math.floor(ax)), cy = Math.min(ny - 1, Math.floor(ay));
  const ex = Math.min(nx - 1, Math.floor(bx)), ey = Math.min(ny - 1, Math.floor(by));
  const dx = bx - ax, dy = by - ay;
  const sx = dx > 0 ? 1 : -1, sy = dy > 0 ? 1 : -1;
  const tdx = dx !== 0 ? Math.abs(1 / dx) : Infinity, tdy = dy !== 0 ? Math.abs(1 / dy) : Infinity;
  let tx = dx !== 0 ? (dx > 0 ? cx + 1 - ax : ax - cx) * tdx : Infinity;
  let ty = dy !== 0 ? (dy > 0 ? cy + 1 - ay : ay - cy) * tdy : Infinity;
  let c = cy * nx + cx;
  if (items !== null) items[fill![c]++] = e;
  else counts![c + 1]++;
  let guard = nx + ny + 4;
  while ((cx !== ex || cy !== ey) && guard-- > 0) {
    if (tx < ty) { cx += sx; tx += tdx; } else { cy += sy; ty += tdy; }
    if (cx < 0 || cy < 0 || cx >= nx || cy >= ny) break;
    c = cy * nx + cx;
    if (items !== null) items[fill![c]++] = e;
    else counts![c + 1]++;
  }
}

/** `alive` marks the edges to test (dangling ends cannot bound a part and are left out) */
export function findCrossings(g: CutGraph, toleranceMm: number, alive: Uint8Array): { crossed: Uint8Array; crossings: Crossing[] } {
  const E = g.edgeCount;
  const crossed = new Uint8Array(E);
  const crossings: Crossing[] = [];
  if (E < 2) return { crossed, crossings };
  const { vx, vy, eu, ev } = g;
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity, total = 0;
  for (let e = 0; e < E; e++) {
    const ax = vx[eu[e]], ay = vy[eu[e]], bx = vx[ev[e]], by = vy[ev[e]];
    minX = Math.min(minX, ax, bx); maxX = Math.max(maxX, ax, bx);
    minY = Math.min(minY, ay, by); maxY = Math.max(maxY, ay, by);
    total += len2(bx - ax, by - ay);
  }
  // about four cells per edge at most: a sparse nest over a wide area must not walk millions of empty cells
  const cell = Math.max(toleranceMm * 10, (total / E) / 2, Math.max(maxX - minX, maxY - minY) / 4096, Math.sqrt(((maxX - minX) * (maxY - minY)) / (4 * E)));
  const nx = Math.floor((maxX - minX) / cell) + 1;
  const ny = Math.floor((maxY - minY) / cell) + 1;
  // two passes over the traversal: count, then fill (CSR)
  const counts = new Int32Array(nx * ny + 1);
  const grid: Grid = { minX, minY, cell, nx, ny };
  for (let e = 0; e < E; e++) if (alive[e]) walkCells(g, e, grid, counts, null, null);
  for (let c = 0; c < nx * ny; c++) counts[c + 1] += counts[c];
  const fill = counts.slice(0, nx * ny);
  const items = new Int32Array(counts[nx * ny]);
  for (let e = 0; e < E; e++) if (alive[e]) walkCells(g, e, grid, null, fill, items);
  let tests = 0;
  for (let c = 0; c < nx * ny && tests < MAX_PAIR_TESTS; c++) {
    const lo = counts[c], hi = counts[c + 1];
    if (hi - lo < 2) continue;
    if (hi - lo > DENSE_CELL_EDGES) {
      // cuts piled on each other: every edge here is treated as overlapping, one report for the cell
      for (let i = lo; i < hi; i++) crossed[items[i]] = 1;
      const a = items[lo];
      crossings.push({ x: vx[eu[a]], y: vy[eu[a]], edgeA: a, edgeB: items[hi - 1] });
      continue;
    }
    const cxLo = minX + (c % nx) * cell, cyLo = minY + Math.floor(c / nx) * cell;
    for (let i = lo; i < hi; i++) {
      const a = items[i];
      const a0 = eu[a], a1 = ev[a];
      const ax = vx[a0], ay = vy[a0], adx = vx[a1] - ax, ady = vy[a1] - ay;
      for (let j = i + 1; j < hi; j++) {
        const b = items[j];
        const b0 = eu[b], b1 = ev[b];
        if (b0 === a0 || b0 === a1 || b1 === a0 || b1 === a1) continue;
        if (crossed[a] === 1 && crossed[b] === 1) continue; // both already known to cross
        tests++;
        const bx = vx[b0], by = vy[b0], bdx = vx[b1] - bx, bdy = vy[b1] - by;
        const den = adx * bdy - ady * bdx;
        if (den === 0) continue;
        const t = ((bx - ax) * bdy - (by - ay) * bdx) / den;
        const u = ((bx - ax) * ady - (by - ay) * adx) / den;
        // proper crossings only: a touch within the tolerance of either end is a shared point
        const la = len2(adx, ady), lb = len2(bdx, bdy);
        if (t * la <= toleranceMm || (1 - t) * la <= toleranceMm || u * lb <= toleranceMm || (1 - u) * lb <= toleranceMm) continue;
        const px = ax + adx * t, py = ay + ady * t;
        if (px < cxLo || px >= cxLo + cell || py < cyLo || py >= cyLo + cell) continue;
        if (alongArc(g, a, b, toleranceMm) || alongArc(g, b, a, toleranceMm)) continue;
        crossed[a] = 1;
        crossed[b] = 1;
        crossings.push({ x: px, y: py, edgeA: a, edgeB: b });
      }
    }
  }
  return { crossed, crossings };
}
