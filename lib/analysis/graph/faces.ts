// Closed loops from the cut graph. Dangling ends (lead-ins, lead-outs, ramps that the final
// pass retraced) are pruned first; then every bounded face of the planar graph is walked,
// turning at each vertex to the next edge clockwise from the one it came in on, so that a
// bounded face comes out counter-clockwise (positive area) and the outer face negative.
// Most loops of a nest are simple cycles (two live edges at every vertex): there the turn is
// to the other edge, with no angles, and the face on the other side is the same cycle walked
// back, so it is read off the first walk instead of walked again.
import { vertexDegrees, vertexEdges } from './adjacency';
import type { CutGraph } from './cut-graph';

export interface GraphLoop {
  /**
   * vertex ids in order, counter-clockwise, at verts[start … start + length): the arrays are
   * shared by all the loops of one extractLoops() (no array per loop)
   */
  verts: Int32Array;
  /** edge ids, edges[start + i] joins verts[start + i] and the next vertex (cyclic) */
  edges: Int32Array;
  start: number;
  length: number;
}

/** the graph with its dangling ends pruned: alive[e] = 1 for an edge of a cycle or a path between cycles */
export interface PrunedGraph {
  alive: Uint8Array;
  deg: Int32Array;
  start: Int32Array;
  /** each vertex's edges at adj[start[v] … start[v + 1]); extractLoops reorders each list in place (live edges first, in turning order) */
  adj: Int32Array;
}

/** made once and shared by the crossing check and the loop walk (the graph must not change between) */
export function prune(g: CutGraph): PrunedGraph {
  const V = g.vertexCount;
  const E = g.edgeCount;
  const eu = g.eu, ev = g.ev;
  const deg = vertexDegrees(eu, ev, V, E);
  const { start, adj } = vertexEdges(eu, ev, deg, V, E);
  // prune dangling ends
  const alive = new Uint8Array(E).fill(1);
  const stack: number[] = [];
  for (let v = 0; v < V; v++) if (deg[v] === 1) stack.push(v);
  while (stack.length > 0) {
    const v = stack.pop()!;
    if (deg[v] !== 1) continue;
    for (let k = start[v]; k < start[v + 1]; k++) {
      const e = adj[k];
      if (!alive[e]) continue;
      alive[e] = 0;
      deg[v]--;
      const w = eu[e] === v ? ev[e] : eu[e];
      deg[w]--;
      if (deg[w] === 1) stack.push(w);
      break;
    }
  }
  return { alive, deg, start, adj };
}

/** each vertex's live edges in turning order, and each edge end's place in its vertex's list */
interface TurnOrder {
  /** live edges at each vertex; they come first in the pruned graph's list, in turning order */
  count: Int32Array;
  /** at a branch point (3+ live edges): edge e's place in the list of its end u, and of its end v */
  posAtU: Int32Array;
  posAtV: Int32Array;
}

/**
 * The closed loops of the graph: every bounded face, counter-clockwise (stage 4 of the analysis).
 * Two steps: the live edges at each vertex put in turning order (turnOrder), then the faces
 * walked over the half-edges (walkFaces).
 */
export function extractLoops(g: CutGraph, pruned: PrunedGraph = prune(g)): GraphLoop[] {
  if (g.edgeCount === 0) return [];
  return walkFaces(g, pruned, turnOrder(g, pruned));
}

function turnOrder(g: CutGraph, pruned: PrunedGraph): TurnOrder {
  const V = g.vertexCount;
  const E = g.edgeCount;
  const eu = g.eu, ev = g.ev;
  const { alive, deg, start, adj } = pruned;
  // sort live edges around each vertex by angle, remember each edge end's position; in place
  // in the pruned graph's lists (live edges first, in turning order): a vertex of two live
  // edges, the most common, is left as it is, and a second copy of the lists is not made
  const order = adj;
  const count = new Int32Array(V);
  const posAtU = new Int32Array(E);
  const posAtV = new Int32Array(E);
  const vx = g.vx, vy = g.vy;
  // scratch for one vertex's live edges and their angles, sorted by insertion (branch points meet a
  // handful of edges); no closure per vertex, no array growth
  let tmp = new Int32Array(16);
  let ang = new Float64Array(16);
  for (let v = 0; v < V; v++) {
    if (deg[v] < 2) continue;
    const lo = start[v], hi = start[v + 1];
    if (hi - lo > tmp.length) { tmp = new Int32Array(2 * (hi - lo)); ang = new Float64Array(2 * (hi - lo)); }
    let m = 0;
    for (let k = lo; k < hi; k++) if (alive[adj[k]]) tmp[m++] = adj[k];
    // with two edges either order gives the same walk: only branch points need the angles
    if (m > 2) {
      for (let i = 0; i < m; i++) {
        const e = tmp[i];
        const w = eu[e] === v ? ev[e] : eu[e];
        const a = Math.atan2(vy[w] - vy[v], vx[w] - vx[v]);
        let j = i;
        while (j > 0 && ang[j - 1] > a) { ang[j] = ang[j - 1]; tmp[j] = tmp[j - 1]; j--; }
        ang[j] = a;
        tmp[j] = e;
      }
    }
    if (m > 2 || m < hi - lo) {
      // the dead edges after the live ones: the list stays a permutation of the vertex's edges
      let d = m;
      for (let k = lo; k < hi; k++) if (!alive[adj[k]]) tmp[d++] = adj[k];
      for (let i = 0; i < d; i++) order[lo + i] = tmp[i];
    }
    // the walk reads an edge's position only at a branch point: two edges, it takes the other one
    if (m > 2) {
      for (let i = 0; i < m; i++) {
        const e = tmp[i];
        if (eu[e] === v) posAtU[e] = i;
        else posAtV[e] = i;
      }
    }
    count[v] = m;
  }
  return { count, posAtU, posAtV };
}

/** the bounded faces, walked over half-edges: h = 2e (u→v) or 2e+1 (v→u) */
function walkFaces(g: CutGraph, pruned: PrunedGraph, turns: TurnOrder): GraphLoop[] {
  const E = g.edgeCount;
  const eu = g.eu, ev = g.ev, vx = g.vx, vy = g.vy;
  const { alive, start, adj: order } = pruned;
  const { count, posAtU, posAtV } = turns;
  const used = new Uint8Array(2 * E);
  const loops: GraphLoop[] = [];
  // every half-edge is walked once, so the walks fit one after another in 2E slots: a loop is
  // a stretch of these, not arrays of its own
  const vs = new Int32Array(2 * E);
  const es = new Int32Array(2 * E);
  let off = 0;
  for (let h0 = 0; h0 < 2 * E; h0++) {
    const e0 = h0 >> 1;
    if (!alive[e0] || used[h0]) continue;
    let len = off;
    let h = h0;
    let area2 = 0;
    let simple = true;
    while (!used[h]) {
      used[h] = 1;
      const e = h >> 1;
      const from = h & 1 ? ev[e] : eu[e];
      const to = h & 1 ? eu[e] : ev[e];
      vs[len] = from;
      es[len++] = e;
      area2 += vx[from] * vy[to] - vx[to] * vy[from];
      const n = count[to];
      const at = start[to];
      let next: number;
      if (n === 2) {
        next = order[at] === e ? order[at + 1] : order[at];
      } else {
        simple = false;
        // at `to`, the edge we came in on sits at pos; take the next one clockwise
        const pos = eu[e] === to ? posAtU[e] : posAtV[e];
        // (pos − 1 + n) mod n, without an integer division per step
        next = order[at + (pos > 0 ? pos - 1 : n - 1)];
      }
      h = next * 2 + (eu[next] === to ? 0 : 1);
    }
    if (h !== h0) continue;
    if (simple) {
      // the face on the other side is this cycle walked back: its half-edges are done too, and
      // when this one is the outside (clockwise), that one is the loop, as its own walk would
      // give it: from the far end of the first edge, back along it, then the rest in reverse
      for (let i = off; i < len; i++) used[es[i] * 2 + (eu[es[i]] === vs[i] ? 1 : 0)] = 1;
      if (area2 < -1e-9) {
        reverseWalk(vs, es, off, len, eu, ev);
        area2 = -area2;
      }
    }
    if (area2 <= 1e-9) continue;
    loops.push({ verts: vs, edges: es, start: off, length: len - off });
    off = len;
  }
  return loops;
}

/**
 * turns the walk vs/es[off..len) (verts w0 … w(k−1), edges f0 … f(k−1), f(i) from w(i) to
 * w(i+1)) into the walk the other way from the far end of f0: verts w1, w0, w(k−1) … w2,
 * edges f0, f(k−1) … f1
 */
function reverseWalk(vs: Int32Array, es: Int32Array, off: number, len: number, eu: Int32Array, ev: Int32Array): void {
  const f0 = es[off];
  const w0 = vs[off];
  const w1 = eu[f0] === w0 ? ev[f0] : eu[f0];
  // verts off+1 … len−1 hold w1 … w(k−1): reversed, w(k−1) … w1; then shift w1 to the front
  for (let i = off + 1, j = len - 1; i < j; i++, j--) { const t = vs[i]; vs[i] = vs[j]; vs[j] = t; }
  // now vs = w0, w(k−1) … w2, w1: rotate w1 to the front and w0 after it
  for (let i = len - 1; i > off + 1; i--) vs[i] = vs[i - 1];
  vs[off] = w1;
  vs[off + 1] = w0;
  // edges off+1 … len−1 hold f1 … f(k−1): reversed, f(k−1) … f1
  for (let i = off + 1, j = len - 1; i < j; i++, j--) { const t = es[i]; es[i] = es[j]; es[j] = t; }
}
