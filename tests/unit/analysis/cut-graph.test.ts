// The cut graph's building blocks: the snapped-point hash table against JavaScript's own Map
// (ECMA-262 §24.1, an independent reference), and the graph's merging of retraced passes,
// edge lists per vertex, zipping of split laps, and the crossing check, against hand-counted
// answers for small drawings (a square has 4 edges and 4 vertices; two diagonals of a square
// cross at its centre, elementary geometry).
import { describe, expect, it } from 'vitest';
import { findCrossings } from '@/lib/analysis/graph/crossings';
import { CutGraph } from '@/lib/analysis/graph/cut-graph';
import { addArc, addPiece } from './support/graph';
import { extractLoops, prune } from '@/lib/analysis/graph/faces';
import { KeyTable } from '@/lib/analysis/graph/key-table';

const THROUGH_Z = -17.95;

/** a square lap at depth z from move index `move` on, counter-clockwise from (x0, y0) */
function square(g: CutGraph, x0: number, y0: number, side: number, z: number, move: number): void {
  const pts = [[x0, y0], [x0 + side, y0], [x0 + side, y0 + side], [x0, y0 + side], [x0, y0]];
  for (let i = 1; i < pts.length; i++) addPiece(g, pts[i - 1][0], pts[i - 1][1], z, pts[i][0], pts[i][1], z, move + i - 1, 1);
}

describe('KeyTable', () => {
  it('getOrSet and get agree with a Map over many key pairs, through the table growing', () => {
    const t = new KeyTable(4);
    // the reference: one Map keyed by the pair combined into a single exact number
    const ref = new Map<number, number>();
    let seed = 12345;
    const rnd = () => (seed = (Math.imul(seed, 1103515245) + 12345) >>> 0);
    for (let i = 0; i < 20000; i++) {
      // many repeated pairs; the second key up to 2^25 − 1, as the cut graph's snapped points
      const a = rnd() % 3000, b = i % 5 === 0 ? 2 ** 25 - 1 - (rnd() % 7) : rnd() % 7;
      const key = a * 2 ** 25 + b;
      const had = ref.get(key);
      const got = t.getOrSet(a, b, i);
      expect(got).toBe(had ?? -1);
      if (had === undefined) ref.set(key, i);
    }
    for (const [k, v] of ref) expect(t.get(Math.floor(k / 2 ** 25), k % 2 ** 25)).toBe(v);
    expect(t.get(3001, 0)).toBe(-1);
    expect(t.get(0, 8)).toBe(-1);
  });

  it('keys crowded into one cell fill its page and go on in the overflow, still agreeing with a Map', () => {
    const t = new KeyTable(1 << 12);
    const ref = new Map<number, number>();
    let seed = 777;
    const rnd = () => (seed = (Math.imul(seed, 1103515245) + 12345) >>> 0);
    for (let i = 0; i < 5000; i++) {
      // four in five keys inside one 2^13 cell (one page), the rest anywhere
      const crowded = i % 5 !== 0;
      const a = crowded ? 2 ** 24 + (rnd() % 90) : rnd() % 2 ** 26, b = crowded ? 2 ** 24 + (rnd() % 90) : rnd() % 2 ** 26;
      const key = a * 2 ** 26 + b;
      const had = ref.get(key);
      expect(t.getOrSet(a, b, i)).toBe(had ?? -1);
      if (had === undefined) ref.set(key, i);
    }
    expect(ref.size).toBeGreaterThan(2000);
    for (const [k, v] of ref) expect(t.get(Math.floor(k / 2 ** 26), k % 2 ** 26)).toBe(v);
    expect(t.get(2 ** 24 + 95, 2 ** 24)).toBe(-1);
  });
});

describe('CutGraph', () => {
  it('passes that retrace a square land on the same 4 edges, keeping the deepest cut and its first through move', () => {
    const g = new CutGraph(0.01, THROUGH_Z);
    square(g, 0, 0, 50, -17.5, 0); // within the band, not through
    square(g, 0, 0, 50, -18.2, 10); // through
    square(g, 0, 0, 50, -18.0, 20); // through again, less deep
    expect(g.vertexCount).toBe(4);
    expect(g.edgeCount).toBe(4);
    for (let e = 0; e < 4; e++) {
      expect(g.eZMin[e]).toBe(-18.2);
      expect(g.eFirstNear[e]).toBe(e);
      expect(g.eFirstThrough[e]).toBe(10 + e);
    }
  });

  it('points within the chain tolerance snap to one vertex, and a reversed lap is the same edges', () => {
    const g = new CutGraph(0.01, THROUGH_Z);
    square(g, 0, 0, 50, -18.2, 0);
    // the same square, clockwise, each corner moved by under half the tolerance
    const pts = [[0.002, 0.001], [-0.001, 50.003], [50.002, 49.998], [49.999, 0.002], [0.002, 0.001]];
    for (let i = 1; i < pts.length; i++) addPiece(g, pts[i - 1][0], pts[i - 1][1], -18.3, pts[i][0], pts[i][1], -18.3, 10 + i, 1);
    expect(g.vertexCount).toBe(4);
    expect(g.edgeCount).toBe(4);
    for (let e = 0; e < 4; e++) expect(g.eZMin[e]).toBe(-18.3);
  });

  it('an arc and a straight chord between the same two points stay two edges; a retraced arc stays one', () => {
    const g = new CutGraph(0.01, THROUGH_Z);
    // half circle of radius 10 about (0, 0) from (10, 0) to (-10, 0): 4 sub-arcs of 45°
    addArc(g, 10, 0, -10, 0, -18.2, 0, 0, 10, 0, Math.PI, 0, 1);
    addArc(g, 10, 0, -10, 0, -18.3, 0, 0, 10, 0, Math.PI, 1, 1);
    expect(g.edgeCount).toBe(4);
    expect(g.vertexCount).toBe(5);
    addPiece(g, -10, 0, -18.2, 10, 0, -18.2, 2, 1);
    expect(g.edgeCount).toBe(5);
    let arcs = 0;
    for (let e = 0; e < g.edgeCount; e++) if (g.arcs.r[g.eArc[e]] > 0) { arcs++; expect(g.eZMin[e]).toBe(-18.3); }
    expect(arcs).toBe(4);
    // the half disc is one bounded face of area πr²/2 > 0
    expect(extractLoops(g).length).toBe(1);
  });

  it('zipOverlaps joins a lap split at a midpoint with the unsplit lap, so one loop of 5 edges remains', () => {
    const g = new CutGraph(0.01, THROUGH_Z);
    square(g, 0, 0, 40, -18.2, 0);
    // a second lap with its bottom side broken at X 15 (a tab end, say)
    addPiece(g, 0, 0, -18.3, 15, 0, -18.3, 10, 1);
    addPiece(g, 15, 0, -18.3, 40, 0, -18.3, 11, 1);
    addPiece(g, 40, 0, -18.3, 40, 40, -18.3, 12, 1);
    expect(g.edgeCount).toBe(6);
    g.zipOverlaps();
    expect(g.edgeCount).toBe(5);
    const loops = extractLoops(g);
    expect(loops.length).toBe(1);
    expect(loops[0].length).toBe(5);
    // after renumbering, later retraces still find the edges at each vertex
    addPiece(g, 40, 40, -18.4, 0, 40, -18.4, 20, 1);
    expect(g.edgeCount).toBe(5);
  });

  it('faces: a square cut either way round gives one counter-clockwise loop; two squares sharing a side give two', () => {
    // each loop's edges must join its consecutive vertices, and its shoelace area be positive
    // (the bounded faces; the outside face is left out): 400 mm² per 20 mm square
    const check = (g: CutGraph, areas: number[]) => {
      const loops = extractLoops(g);
      const got: number[] = [];
      for (const l of loops) {
        let a2 = 0;
        for (let i = 0; i < l.length; i++) {
          const v = l.verts[l.start + i], w = l.verts[l.start + ((i + 1) % l.length)], e = l.edges[l.start + i];
          expect([g.eu[e], g.ev[e]].sort()).toEqual([v, w].sort());
          a2 += g.vx[v] * g.vy[w] - g.vx[w] * g.vy[v];
        }
        got.push(a2 / 2);
      }
      expect(got.map((a) => Math.round(a)).sort()).toEqual(areas);
    };
    const ccw = new CutGraph(0.01, THROUGH_Z);
    square(ccw, 0, 0, 20, -18.2, 0);
    check(ccw, [400]);
    // clockwise: the first walk from edge 0 goes round the outside, so the loop is read off it backwards
    const cw = new CutGraph(0.01, THROUGH_Z);
    const pts = [[0, 0], [0, 20], [20, 20], [20, 0], [0, 0]];
    for (let i = 1; i < pts.length; i++) addPiece(cw, pts[i - 1][0], pts[i - 1][1], -18.2, pts[i][0], pts[i][1], -18.2, i, 1);
    check(cw, [400]);
    // two squares side by side sharing the side X 20: branch points of three edges at its ends
    const two = new CutGraph(0.01, THROUGH_Z);
    square(two, 0, 0, 20, -18.2, 0);
    square(two, 20, 0, 20, -18.2, 10);
    expect(two.edgeCount).toBe(7);
    check(two, [400, 400]);
  });

  it('two diagonals of a square cross once at its centre; the sides alone do not cross', () => {
    const g = new CutGraph(0.01, THROUGH_Z);
    square(g, 0, 0, 20, -18.2, 0);
    expect(findCrossings(g, 0.01, prune(g).alive).crossings.length).toBe(0);
    addPiece(g, 0, 0, -18.2, 20, 20, -18.2, 10, 1);
    addPiece(g, 20, 0, -18.2, 0, 20, -18.2, 11, 1);
    const { crossings } = findCrossings(g, 0.01, prune(g).alive);
    expect(crossings.length).toBe(1);
    expect(crossings[0].x).toBeCloseTo(10, 9);
    expect(crossings[0].y).toBeCloseTo(10, 9);
  });
});
