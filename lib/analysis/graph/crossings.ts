// Through cuts that cross each other away from a shared point: two profiles overlap, or a
// profile runs through another part. The loops such edges bound are not real parts, so they
// are left out of the part list and reported once. Edges are walked cell by cell through a
// uniform grid (Amanatides–Woo traversal) and tested pairwise within each cell; a crossing is
// counted in the cell that holds it, so each pair counts once. Arc edges are tested by chord.
// Lengths are written out (√(dx² + dy²), as vec.len2): an imported function is called through
// the module loader's export getter, which V8 does not inline in these loops.
import type { CutGraph } from './cut-graph';
import { grownI32 } from '../typed-arrays';

export interface Crossing {
  x: number;
  y: number;
  edgeA: number;
  edgeB: number;
}

const MAX_PAIR_TESTS = 30_000_000;
/**
 * A cell is piled with cuts (many on top of each other) when it holds more edges than this and
 * their length within it (each edge's length, at most the cell's diagonal) is more than
 * DENSE_CELL_SPANS cell sides: as many cuts as that all the way across one cell. Cuts side by
 * side are at least a kerf apart, so a cell a few kerfs wide holds only a few of them; many
 * short chords (small holes, arcs) are many edges but not much length, and are tested pair by pair.
 */
const DENSE_CELL_EDGES = 128;
const DENSE_CELL_SPANS = 32;

/** edge b runs along arc edge a (both its ends within the arc's chord error of the circle) */
function alongArc(g: CutGraph, a: number, b: number, tol: number): boolean {
  const arc = g.eArc[a], arcs = g.arcs;
  const r = arcs.r[arc];
  if (r <= 0) return false;
  const band = r * (1 - Math.cos(arcs.sweep[arc] / 2)) + tol;
  const cx = arcs.cx[arc], cy = arcs.cy[arc];
  const x0 = g.vx[g.eu[b]] - cx, y0 = g.vy[g.eu[b]] - cy, x1 = g.vx[g.ev[b]] - cx, y1 = g.vy[g.ev[b]] - cy;
  const d0 = Math.sqrt(x0 * x0 + y0 * y0);
  const d1 = Math.sqrt(x1 * x1 + y1 * y1);
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
 * the cells edge e passes through, in order, written to out from index at (room for
 * nx + ny + 5 is the caller's to make); returns the index after the last; a plain function,
 * not a callback per cell
 */
function walkCells(g: CutGraph, e: number, grid: Grid, out: Int32Array, at: number): number {
  const { minX, minY, cell, nx, ny } = grid;
  const ax = (g.vx[g.eu[e]] - minX) / cell, ay = (g.vy[g.eu[e]] - minY) / cell;
  const bx = (g.vx[g.ev[e]] - minX) / cell, by = (g.vy[g.ev[e]] - minY) / cell;
  let cx = Math.min(nx - 1, Math.floor(ax)), cy = Math.min(ny - 1, Math.floor(ay));
  const ex = Math.min(nx - 1, Math.floor(bx)), ey = Math.min(ny - 1, Math.floor(by));
  if (cx === ex && cy === ey) {
    // within one cell, as most edges are (cells are several edges long): no traversal
    out[at++] = cy * nx + cx;
    return at;
  }
  const dx = bx - ax, dy = by - ay;
  const sx = dx > 0 ? 1 : -1, sy = dy > 0 ? 1 : -1;
  const tdx = dx !== 0 ? Math.abs(1 / dx) : Infinity, tdy = dy !== 0 ? Math.abs(1 / dy) : Infinity;
  let tx = dx !== 0 ? (dx > 0 ? cx + 1 - ax : ax - cx) * tdx : Infinity;
  let ty = dy !== 0 ? (dy > 0 ? cy + 1 - ay : ay - cy) * tdy : Infinity;
  out[at++] = cy * nx + cx;
  let guard = nx + ny + 4;
  while ((cx !== ex || cy !== ey) && guard-- > 0) {
    if (tx < ty) { cx += sx; tx += tdx; } else { cy += sy; ty += tdy; }
    if (cx < 0 || cy < 0 || cx >= nx || cy >= ny) break;
    out[at++] = cy * nx + cx;
  }
  return at;
}

/** the edges items[lo..hi) are more length within their cell than DENSE_CELL_SPANS sides */
function piled(items: Int32Array, lo: number, hi: number, lengths: Float64Array, cell: number): boolean {
  const diagonal = cell * Math.SQRT2;
  let sum = 0;
  for (let i = lo; i < hi; i++) {
    const len = lengths[items[i]];
    sum += len < diagonal ? len : diagonal;
  }
  return sum > DENSE_CELL_SPANS * cell;
}

/**
 * `alive` marks the edges to test (dangling ends cannot bound a part and are left out). Each pass
 * over the edges or cells is a function of its own: this runs once per analysis, so V8 compiles
 * its loops on the fly (on-stack replacement), and in one long function each loop's compiled
 * code gave up where the next loop began, for the first few analyses of a process.
 */
export function findCrossings(g: CutGraph, toleranceMm: number, alive: Uint8Array): { crossed: Uint8Array; crossings: Crossing[] } {
  const E = g.edgeCount;
  const crossed = new Uint8Array(E);
  const crossings: Crossing[] = [];
  if (E < 2) return { crossed, crossings };
  // each edge's length, once: a pair test needs both (an edge meets a few others per cell)
  const lengths = new Float64Array(E);
  const box = new Float64Array(5); // minX minY maxX maxY, total length
  measureEdges(g, lengths, box);
  const minX = box[0], minY = box[1], maxX = box[2], maxY = box[3], total = box[4];
  // about one cell per edge at most: a sparse nest over a wide area must not count and walk
  // millions of empty cells (four per edge took half as long again on the generated nest)
  const cell = Math.max(toleranceMm * 10, (total / E) / 2, Math.max(maxX - minX, maxY - minY) / 4096, Math.sqrt(((maxX - minX) * (maxY - minY)) / E));
  const nx = Math.floor((maxX - minX) / cell) + 1;
  const ny = Math.floor((maxY - minY) / cell) + 1;
  // one traversal per edge, its cells kept in order; then count them and fill the cells' lists (CSR)
  const grid: Grid = { minX, minY, cell, nx, ny };
  const cellsFrom = new Int32Array(E + 1);
  const cells = walkEdges(g, grid, alive, cellsFrom);
  const counts = new Int32Array(nx * ny + 1);
  const items = bucket(cells, cellsFrom, E, nx * ny, counts);
  testCells(g, grid, counts, items, lengths, toleranceMm, crossed, crossings);
  return { crossed, crossings };
}

/** each edge's length into lengths; the edges' box and their total length into box */
function measureEdges(g: CutGraph, lengths: Float64Array, box: Float64Array): void {
  const { vx, vy, eu, ev } = g;
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity, total = 0;
  for (let e = 0; e < lengths.length; e++) {
    const ax = vx[eu[e]], ay = vy[eu[e]], bx = vx[ev[e]], by = vy[ev[e]];
    minX = Math.min(minX, ax, bx); maxX = Math.max(maxX, ax, bx);
    minY = Math.min(minY, ay, by); maxY = Math.max(maxY, ay, by);
    const len = Math.sqrt((bx - ax) * (bx - ax) + (by - ay) * (by - ay));
    lengths[e] = len;
    total += len;
  }
  box[0] = minX; box[1] = minY; box[2] = maxX; box[3] = maxY; box[4] = total;
}

/** the cells of every live edge, one edge after another (edge e's at cellsFrom[e] …) */
function walkEdges(g: CutGraph, grid: Grid, alive: Uint8Array, cellsFrom: Int32Array): Int32Array {
  const E = cellsFrom.length - 1;
  const room = grid.nx + grid.ny + 5;
  let cells = new Int32Array(Math.max(1024, 4 * E));
  let w = 0;
  for (let e = 0; e < E; e++) {
    cellsFrom[e] = w;
    if (!alive[e]) continue;
    if (w + room > cells.length) {
      cells = grownI32(cells, Math.max(2 * cells.length, w + room));
    }
    w = walkCells(g, e, grid, cells, w);
  }
  cellsFrom[E] = w;
  return cells;
}

/** the edges of each cell c at items[counts[c] … counts[c + 1]) (counts: n + 1 zeros in, offsets out) */
function bucket(cells: Int32Array, cellsFrom: Int32Array, E: number, n: number, counts: Int32Array): Int32Array {
  const w = cellsFrom[E];
  for (let j = 0; j < w; j++) counts[cells[j] + 1]++;
  for (let c = 0; c < n; c++) counts[c + 1] += counts[c];
  const fill = counts.slice(0, n);
  const items = new Int32Array(counts[n]);
  for (let e = 0; e < E; e++) for (let j = cellsFrom[e]; j < cellsFrom[e + 1]; j++) items[fill[cells[j]]++] = e;
  return items;
}

/** the pair tests, cell by cell: crossings counted in the cell that holds them */
function testCells(g: CutGraph, grid: Grid, counts: Int32Array, items: Int32Array, lengths: Float64Array, toleranceMm: number, crossed: Uint8Array, crossings: Crossing[]): void {
  const { vx, vy, eu, ev } = g;
  const { minX, minY, cell, nx, ny } = grid;
  let tests = 0;
  for (let c = 0; c < nx * ny && tests < MAX_PAIR_TESTS; c++) {
    const lo = counts[c], hi = counts[c + 1];
    if (hi - lo < 2) continue;
    if (hi - lo > DENSE_CELL_EDGES && piled(items, lo, hi, lengths, cell)) {
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
        const la = lengths[a], lb = lengths[b];
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
}
