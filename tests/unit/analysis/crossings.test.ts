// The crossing check against a brute-force reference: every pair of segments tested with the
// orientation predicate (Cormen, Leiserson, Rivest and Stein, Introduction to Algorithms, 3rd
// ed., §33.1, SEGMENTS-INTERSECT, proper crossings only: each segment's ends strictly on
// opposite sides of the other). Integer coordinates keep the predicate exact; a small grid
// makes shared ends, touches and collinear overlaps common.
import { describe, expect, it } from 'vitest';
import { CutGraph } from '@/lib/analysis/graph/cut-graph';
import { addPiece } from './support/graph';
import { findCrossings } from '@/lib/analysis/graph/crossings';

const THROUGH_Z = -17.95;

function orient(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  return Math.sign((bx - ax) * (cy - ay) - (by - ay) * (cx - ax));
}

function bruteCrossed(g: CutGraph): Uint8Array {
  const E = g.edgeCount, out = new Uint8Array(E);
  const { vx, vy, eu, ev } = g;
  for (let a = 0; a < E; a++)
    for (let b = a + 1; b < E; b++) {
      const p = [vx[eu[a]], vy[eu[a]]], q = [vx[ev[a]], vy[ev[a]]], r = [vx[eu[b]], vy[eu[b]]], s = [vx[ev[b]], vy[ev[b]]];
      const d1 = orient(r[0], r[1], s[0], s[1], p[0], p[1]), d2 = orient(r[0], r[1], s[0], s[1], q[0], q[1]);
      const d3 = orient(p[0], p[1], q[0], q[1], r[0], r[1]), d4 = orient(p[0], p[1], q[0], q[1], s[0], s[1]);
      if (d1 * d2 < 0 && d3 * d4 < 0) out[a] = out[b] = 1;
    }
  return out;
}

/** every edge live: none pruned as a dangling end */
function allAlive(g: CutGraph): Uint8Array {
  return new Uint8Array(g.edgeCount).fill(1);
}

function polygon(g: CutGraph, pts: number[][]): void {
  for (let i = 0; i < pts.length; i++) {
    const [x0, y0] = pts[i], [x1, y1] = pts[(i + 1) % pts.length];
    addPiece(g, x0, y0, -18.2, x1, y1, -18.2, i, 1);
  }
}

describe('findCrossings', () => {
  it('marks exactly the edges a brute-force pair test finds crossing, for random chains of segments', () => {
    let seed = 2024;
    const rnd = (n: number) => (seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) % n;
    let total = 0;
    for (let trial = 0; trial < 40; trial++) {
      const g = new CutGraph(0.01, THROUGH_Z);
      // a few chains (pieces of the graph) in a 0…30 square, some far apart
      for (let chain = 0; chain < 1 + rnd(5); chain++) {
        const ox = rnd(3) * 40;
        let x = ox + rnd(31), y = rnd(31);
        const x0 = x, y0 = y, n = 2 + rnd(12);
        for (let k = 0; k < n; k++) {
          const nx = ox + rnd(31), ny = rnd(31);
          addPiece(g, x, y, -18.2, nx, ny, -18.2, k, 1);
          x = nx; y = ny;
        }
        // half the chains closed into loops
        if (rnd(2) === 0) addPiece(g, x, y, -18.2, x0, y0, -18.2, n, 1);
      }
      const { crossed, crossings } = findCrossings(g, 1e-9, allAlive(g));
      const want = bruteCrossed(g);
      expect(Array.from(crossed)).toEqual(Array.from(want));
      expect(crossings.length > 0).toBe(want.includes(1));
      for (const c of crossings) expect(crossed[c.edgeA] && crossed[c.edgeB]).toBe(1);
      total += want.reduce((a, b) => a + b, 0);
    }
    // the random chains do cross: the comparison is not between two empty sets
    expect(total).toBeGreaterThan(100);
  });

  it('a hole inside its part and parts side by side do not cross', () => {
    const g = new CutGraph(0.01, THROUGH_Z);
    const rect = (x0: number, y0: number, x1: number, y1: number) => {
      addPiece(g, x0, y0, -18.2, x1, y0, -18.2, 0, 1);
      addPiece(g, x1, y0, -18.2, x1, y1, -18.2, 1, 1);
      addPiece(g, x1, y1, -18.2, x0, y1, -18.2, 2, 1);
      addPiece(g, x0, y1, -18.2, x0, y0, -18.2, 3, 1);
    };
    rect(0, 0, 100, 60);
    rect(20, 20, 40, 40);
    rect(106.35, 0, 200, 60);
    const { crossings } = findCrossings(g, 0.01, allAlive(g));
    expect(crossings).toEqual([]);
  });

  it('a five-pointed star turns one way all round yet every side crosses two others; a convex pentagon does not', () => {
    // the pentagram {5/2}: vertices of a regular pentagon joined every second one
    const ring = (step: number) => Array.from({ length: 5 }, (_, i) => [50 + 40 * Math.cos((2 * Math.PI * i * step) / 5), 50 + 40 * Math.sin((2 * Math.PI * i * step) / 5)]);
    const star = new CutGraph(0.01, THROUGH_Z);
    polygon(star, ring(2));
    const s = findCrossings(star, 0.01, allAlive(star));
    // each side marked; a pair of sides already both marked is not reported again, so at
    // least 3 of the 5 crossing points are listed
    expect(Array.from(s.crossed)).toEqual([1, 1, 1, 1, 1]);
    expect(s.crossings.length).toBeGreaterThanOrEqual(3);
    const pentagon = new CutGraph(0.01, THROUGH_Z);
    polygon(pentagon, ring(1));
    expect(findCrossings(pentagon, 0.01, allAlive(pentagon)).crossings).toEqual([]);
  });

  it('many small holes crowded into one grid cell do not cross; a fan of cuts through one point all cross', () => {
    // 40 holes of 16 chords (r 0.8 mm, 2 mm apart) in one corner of a 1000 mm square: the grid
    // is sized for the whole square, so one cell holds far more edges than a piled-cuts check
    // would take on trust, yet little length; the brute-force reference decides
    const g = new CutGraph(0.01, THROUGH_Z);
    polygon(g, [[0, 0], [1000, 0], [1000, 1000], [0, 1000]]);
    for (let i = 0; i < 40; i++) {
      const cx = 5 + 2 * (i % 10), cy = 5 + 2 * Math.floor(i / 10);
      polygon(g, Array.from({ length: 16 }, (_, k) => [cx + 0.8 * Math.cos((Math.PI * k) / 8), cy + 0.8 * Math.sin((Math.PI * k) / 8)]));
    }
    expect(g.edgeCount).toBe(4 + 40 * 16);
    const holes = findCrossings(g, 0.01, allAlive(g));
    expect(holes.crossings).toEqual([]);
    expect(Array.from(holes.crossed)).toEqual(Array.from(bruteCrossed(g)));
    // 150 cuts 40 mm long through the point (500, 500), each at its own angle: every one crosses every other
    const fan = new CutGraph(0.01, THROUGH_Z);
    polygon(fan, [[0, 0], [1000, 0], [1000, 1000], [0, 1000]]);
    for (let i = 0; i < 150; i++) {
      const a = (Math.PI * i) / 150;
      addPiece(fan, 500 - 20 * Math.cos(a), 500 - 20 * Math.sin(a), -18.2, 500 + 20 * Math.cos(a), 500 + 20 * Math.sin(a), -18.2, 10 + i, 1);
    }
    const f = findCrossings(fan, 0.01, allAlive(fan));
    expect(Array.from(f.crossed)).toEqual(Array.from(bruteCrossed(fan)));
    expect(f.crossings.length).toBeGreaterThan(0);
  });

  it('a bow tie crosses itself once, at the middle', () => {
    // a bow tie: four points, the two long sides cross at (10, 5)
    const bow = new CutGraph(0.01, THROUGH_Z);
    polygon(bow, [[0, 0], [20, 10], [20, 0], [0, 10]]);
    const b = findCrossings(bow, 0.01, allAlive(bow));
    expect(b.crossings).toHaveLength(1);
    expect(b.crossings[0].x).toBeCloseTo(10, 9);
    expect(b.crossings[0].y).toBeCloseTo(5, 9);
  });
});
