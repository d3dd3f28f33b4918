// Areas and containment of through-cut parts against closed forms and against an independent
// polygon library (@flatten-js/core, exact circular arcs), and Clipper's own offsets; the
// analysis's Clipper (6.4.2 compiled to WebAssembly) against the plain JavaScript port of the
// same Clipper (clipper-lib) for offsets, differences, areas and point-in-polygon, and the
// typed-array rings the nesting works on against clipper-lib's point-in-polygon and area.
import Flatten from '@flatten-js/core';
import ClipperLib, { type Path as RefPath, type Paths as RefPaths } from 'clipper-lib';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyze } from '@/lib/analysis';
import {
  differencePaths, offsetPaths, pathAreaMm2, pathsAreaMm2, pointInPath, pointInRing, ringAreaMm2, ringPerimeterMm, ringToPath, toPath, toRing,
  type Path, type Paths,
} from '@/lib/analysis/geometry/polygons';
import { ProgramWriter } from './support/program';
import { job } from './support/jobs';

const { point, circle, Polygon, BooleanOperations } = Flatten;
const THROUGH = [-9, -18.3];
/** area error bound of a circle of radius R drawn as chords of sagitta ≤ e and grown by r: perimeter × e (computed), plus Clipper's 5 µm join tolerance */
const chordBound = (R: number, r: number, e = 0.01) => 2 * Math.PI * (R + r) * (e + 0.005) + 0.01;

describe('part areas: closed forms', () => {
  it('a rectangle cut with a zero-width tool has area W·H (closed form)', () => {
    const w = new ProgramWriter();
    w.tool = 9;
    w.rect(10, 20, 130, 95, THROUGH);
    const r = analyze(w.build(), job(18));
    expect(r.parts).toHaveLength(1);
    expect(r.parts[0].areaMm2).toBeCloseTo(120 * 75, 6);
    expect(r.parts[0].perimeterMm).toBeCloseTo(2 * (120 + 75), 6);
  });

  it('kerf shrink of a rectangle: (W − d)(H − d) for tool diameter d (closed form)', () => {
    const w = new ProgramWriter();
    w.tool = 1; // 6.35 mm
    w.rect(0, 0, 200, 100, THROUGH);
    const p = analyze(w.build(), job(18)).parts[0];
    expect(p.areaMm2).toBeCloseTo((200 - 6.35) * (100 - 6.35), 4);
    expect(p.bbox.minX).toBeCloseTo(3.175, 6);
    expect(p.bbox.maxY).toBeCloseTo(100 - 3.175, 6);
    expect(p.perimeterMm).toBeCloseTo(2 * (200 - 6.35 + 100 - 6.35), 4);
  });

  it('a circle cut as two G2 half arcs has area πr² within the chord error', () => {
    const w = new ProgramWriter();
    w.tool = 9;
    w.circle(300, 300, 25, THROUGH);
    const p = analyze(w.build(), job(18)).parts[0];
    const exact = Math.PI * 25 * 25;
    expect(p.areaMm2).toBeLessThanOrEqual(exact + 1e-6); // chords lie inside the arc
    expect(exact - p.areaMm2).toBeLessThan(chordBound(25, 0));
  });

  it('a rectangle with a round hole: (W − d)(H − d) − π(R + d/2)², and the same from @flatten-js/core with exact arcs', () => {
    const w = new ProgramWriter();
    w.tool = 1;
    w.circle(60, 30, 10, THROUGH);
    w.rect(0, 0, 100, 60, THROUGH);
    const r = analyze(w.build(), job(18));
    expect(r.parts).toHaveLength(1);
    const p = r.parts[0];
    expect(p.holes).toBe(1);
    const rr = 3.175;
    const exact = (100 - 6.35) * (60 - 6.35) - Math.PI * (10 + rr) ** 2;
    expect(Math.abs(p.areaMm2 - exact)).toBeLessThan(chordBound(10, rr));
    const outer = new Polygon([point(rr, rr), point(100 - rr, rr), point(100 - rr, 60 - rr), point(rr, 60 - rr)]);
    const ref = BooleanOperations.subtract(outer, new Polygon(circle(point(60, 30), 10 + rr))).area();
    expect(Math.abs(p.areaMm2 - ref)).toBeLessThan(chordBound(10, rr));
  });
});

describe('arcs: helical entries and flat laps', () => {
  it('a circle entered by two helical turns and finished by a flat lap is one loop of area πr²', () => {
    const w = new ProgramWriter();
    w.tool = 9;
    w.rapid(140, 100, 5).feed(140, 100, 0, 600);
    w.arc(140, 100, -9, 100, 100, true).arc(140, 100, -18.3, 100, 100, true).arc(140, 100, -18.3, 100, 100, true);
    w.retract();
    const r = analyze(w.build(), job(18));
    expect(r.parts).toHaveLength(1);
    const exact = Math.PI * 40 * 40;
    expect(exact - r.parts[0].areaMm2).toBeGreaterThanOrEqual(-1e-6);
    expect(exact - r.parts[0].areaMm2).toBeLessThan(chordBound(40, 0));
    expect(r.parts[0].freedAtLine).toBe(5); // the flat lap closes it
  });

  it('a helical lap below the bottom followed by a flat lap is still one loop, not a crossing', () => {
    const w = new ProgramWriter();
    w.tool = 9;
    w.rapid(140, 100, 5).feed(140, 100, -18.1, 600);
    w.arc(140, 100, -18.3, 100, 100, false).arc(140, 100, -18.3, 100, 100, false);
    w.retract();
    const r = analyze(w.build(), job(18));
    expect(r.findings.filter((f) => f.kind === 'crossing-cuts')).toEqual([]);
    expect(r.parts).toHaveLength(1);
    expect(Math.PI * 1600 - r.parts[0].areaMm2).toBeLessThan(chordBound(40, 0));
  });
});

describe('containment and nesting', () => {
  it('a loop inside a part is its hole; a loop inside that hole is a part again', () => {
    const w = new ProgramWriter();
    w.tool = 9;
    w.rect(40, 40, 60, 60, THROUGH); // island inside the hole
    w.rect(20, 20, 80, 80, THROUGH); // the hole
    w.rect(0, 0, 100, 100, THROUGH); // the part's outside
    const r = analyze(w.build(), job(18));
    const areas = r.parts.map((p) => p.areaMm2).sort((a, b) => a - b);
    expect(areas[0]).toBeCloseTo(400, 6);
    expect(areas[1]).toBeCloseTo(10000 - 3600, 6);
    expect(r.parts.find((p) => p.areaMm2 > 1000)!.holes).toBe(1);
    expect(r.summary.holes).toBe(1);
    // the island's part lies inside the hole: its box is the hole's interior box
    const island = r.parts.find((p) => p.areaMm2 < 1000)!;
    expect([island.bbox.minX, island.bbox.minY, island.bbox.maxX, island.bbox.maxY]).toEqual([40, 40, 60, 60].map((v) => expect.closeTo(v, 6)));
  });

  it('Clipper point-in-polygon and offsets agree with the closed forms used above', () => {
    const sq = toPath([0, 10, 10, 0], [0, 0, 10, 10]);
    expect(pointInPath(5, 5, sq)).toBe(1);
    expect(pointInPath(15, 5, sq)).toBe(0);
    expect(pointInPath(10, 5, sq)).toBe(-1);
    expect(pathsAreaMm2(offsetPaths([sq], -2))).toBeCloseTo(36, 6); // (10 − 4)²
    // grown square with round joins: A + P·r + πr² (Minkowski sum with a disc, closed form)
    expect(pathsAreaMm2(offsetPaths([sq], 2))).toBeCloseTo(100 + 40 * 2 + Math.PI * 4, 1);
  });

  it('two laps a finishing allowance apart are one cut, not a part and a ring', () => {
    const w = new ProgramWriter();
    w.tool = 1;
    w.rect(0.2, 0.2, 99.8, 59.8, [-9, -18.3]);
    w.rect(0, 0, 100, 60, [-18.3]);
    const r = analyze(w.build(), job(18));
    expect(r.parts).toHaveLength(1);
    expect(r.parts[0].holes).toBe(0);
  });
});

/** a path in clipper-lib's point type ({X, Y}) */
const ref = (p: Path): RefPath => p.map((q) => ({ X: q.x, Y: q.y }));
/** clipper-lib's paths in the analysis's point type; + 0 turns the −0 its rounding can give into 0 */
const fromRef = (ps: RefPaths): Paths => ps.map((p) => p.map((q) => ({ x: q.X + 0, y: q.Y + 0 })));

/**
 * paths as a set of polygons: each started at its lowest point (x, then y), the paths in order
 * of those points. The two builds' boolean operations may start a polygon at another vertex
 * (as where the two inputs touch) or list the polygons in another order.
 */
function polygonSet(ps: Paths): Paths {
  const lower = (a: { x: number; y: number }, b: { x: number; y: number }) => a.x - b.x || a.y - b.y;
  return ps.map((p) => {
    let k = 0;
    for (let i = 1; i < p.length; i++) if (lower(p[i], p[k]) < 0) k = i;
    return [...p.slice(k), ...p.slice(0, k)];
  }).sort((a, b) => lower(a[0], b[0]) || a.length - b.length);
}

/** distance from (px, py) to the closed polygon p's boundary, in grid units */
function boundaryDistance(px: number, py: number, p: Path): number {
  let best = Infinity;
  for (let i = 0; i < p.length; i++) {
    const a = p[i], b = p[(i + 1) % p.length];
    const dx = b.x - a.x, dy = b.y - a.y, l2 = dx * dx + dy * dy;
    const t = l2 > 0 ? Math.max(0, Math.min(1, ((px - a.x) * dx + (py - a.y) * dy) / l2)) : 0;
    best = Math.min(best, Math.hypot(px - (a.x + t * dx), py - (a.y + t * dy)));
  }
  return best;
}

/**
 * Whether two offsets are the same paths, or the same to the grid: the two builds agree point
 * for point nearly always, but now and then one keeps a point a grid unit off its neighbours'
 * line that the other drops (seen with a 0.1 mm offset of a thin sliver). Then every point of
 * each path must lie within 1.5 units of the other's outline. Returns 'exact', 'grid' or what differs.
 */
function compareOffsets(got: Paths, want: Paths): string {
  if (JSON.stringify(got) === JSON.stringify(want)) return 'exact';
  if (got.length !== want.length) return `${got.length} paths against ${want.length}`;
  for (let i = 0; i < got.length; i++) {
    if (Math.abs(got[i].length - want[i].length) > 2) return `path ${i}: ${got[i].length} points against ${want[i].length}`;
    for (const q of got[i]) if (boundaryDistance(q.x, q.y, want[i]) > 1.5) return `path ${i}: (${q.x}, ${q.y}) is off the reference`;
    for (const q of want[i]) if (boundaryDistance(q.x, q.y, got[i]) > 1.5) return `path ${i}: reference point (${q.x}, ${q.y}) is off ours`;
  }
  return 'grid';
}

/** clipper-lib's offset with the analysis's settings: miter limit 2, arc tolerance 5 µm, round joins */
function refOffset(paths: Paths, deltaMm: number): Paths {
  const co = new ClipperLib.ClipperOffset(2, 5);
  co.AddPaths(paths.map(ref), ClipperLib.JoinType.jtRound, ClipperLib.EndType.etClosedPolygon);
  const out: RefPaths = [];
  co.Execute(out, deltaMm * 1000);
  return fromRef(out);
}

function refDifference(subject: Paths, clip: Paths): Paths {
  const c = new ClipperLib.Clipper();
  c.AddPaths(subject.map(ref), ClipperLib.PolyType.ptSubject, true);
  c.AddPaths(clip.map(ref), ClipperLib.PolyType.ptClip, true);
  const out: RefPaths = [];
  c.Execute(ClipperLib.ClipType.ctDifference, out, ClipperLib.PolyFillType.pftNonZero, ClipperLib.PolyFillType.pftNonZero);
  return fromRef(out);
}

/**
 * a star-shaped polygon (so simple, as Clipper's offset requires) about a centre anywhere on a
 * large sheet, counter-clockwise: vertex angles sorted, radii 1–60 mm, in mm
 */
const star = fc.record({
  cx: fc.integer({ min: -3000, max: 3000 }),
  cy: fc.integer({ min: -3000, max: 3000 }),
  vertices: fc.uniqueArray(fc.tuple(fc.integer({ min: 0, max: 3599 }), fc.double({ min: 1, max: 60, noNaN: true })), { minLength: 3, maxLength: 40, selector: (v) => v[0] }),
}).map(({ cx, cy, vertices }) => {
  const v = vertices.slice().sort((a, b) => a[0] - b[0]);
  return toPath(v.map(([a, r]) => cx + r * Math.cos(a * Math.PI / 1800)), v.map(([a, r]) => cy + r * Math.sin(a * Math.PI / 1800)));
});
/**
 * tool radii from 0.1 mm up, either way. (Below that the two builds part: offsets of 1–2 µm, one
 * or two grid units, round some arc points differently about a third of the time.)
 */
const delta = fc.tuple(fc.double({ min: 0.1, max: 8, noNaN: true }), fc.boolean()).map(([d, grow]) => (grow ? d : -d));
/** polygons Clipper takes: some three points off one line (a zero-area path may not be) */
const solid = star.filter((p) => ClipperLib.Clipper.Area(ref(p)) !== 0);

describe('Clipper in WebAssembly against clipper-lib (the same Clipper 6.4.2 in plain JavaScript)', () => {
  it('offsets with round joins give clipper-lib\'s paths point for point, but for a rare point a grid unit off', () => {
    let exact = 0;
    fc.assert(fc.property(star, delta, (path, d) => {
      const verdict = compareOffsets(offsetPaths([path], d), refOffset([path], d));
      expect(verdict === 'exact' || verdict === 'grid' ? 'same' : verdict).toBe('same');
      if (verdict === 'exact') exact++;
    }), { numRuns: 300 });
    expect(exact).toBeGreaterThanOrEqual(290);
  });

  it('an outline offset with its holes turned clockwise (one tool) gives clipper-lib\'s paths', () => {
    let exact = 0;
    fc.assert(fc.property(star, fc.double({ min: 0.5, max: 6, noNaN: true }), (hole, r) => {
      // a 270 mm square, counter-clockwise, round the hole (whose box starts at b and spans at most 120 mm); the hole reversed
      const b = hole.reduce((m, q) => ({ x: Math.min(m.x, q.x), y: Math.min(m.y, q.y) }), { x: Infinity, y: Infinity });
      const outer = toPath([-70, 200, 200, -70].map((v) => b.x / 1000 + v), [-70, -70, 200, 200].map((v) => b.y / 1000 + v));
      const paths = [outer, hole.slice().reverse()];
      const verdict = compareOffsets(offsetPaths(paths, -r), refOffset(paths, -r));
      expect(verdict === 'exact' || verdict === 'grid' ? 'same' : verdict).toBe('same');
      if (verdict === 'exact') exact++;
    }), { numRuns: 200 });
    expect(exact).toBeGreaterThanOrEqual(193);
  });

  it('differences (non-zero fill) give clipper-lib\'s polygons, and Clipper.Area\'s areas', () => {
    fc.assert(fc.property(solid, solid, fc.integer({ min: -40, max: 40 }), fc.integer({ min: -40, max: 40 }), (a, b, dx, dy) => {
      // b moved next to a, so that they overlap in some cases and not in others
      const moved = b.map((q) => ({ x: q.x - b[0].x + a[0].x + dx * 1000, y: q.y - b[0].y + a[0].y + dy * 1000 }));
      const got = differencePaths([a], [moved]);
      expect(polygonSet(got)).toEqual(polygonSet(refDifference([a], [moved])));
      expect(pathsAreaMm2(got)).toBe(got.reduce((s, p) => s + ClipperLib.Clipper.Area(ref(p)), 0) / 1e6);
    }), { numRuns: 300 });
  });

  it('a side of only degenerate paths is left out, as clipper-lib leaves it out', () => {
    const square = toPath([0, 10, 10, 0], [0, 0, 10, 10]);
    const line = toPath([2, 5, 8], [2, 5, 8]); // three points on one line
    expect(differencePaths([square], [line])).toEqual(refDifference([square], [line]));
    expect(differencePaths([line], [square])).toEqual(refDifference([line], [square]));
    expect(differencePaths([line], [square])).toEqual([]);
    expect(pathsAreaMm2(differencePaths([square], [line]))).toBe(100);
  });

  it('path area and point in path are clipper-lib\'s Clipper.Area and Clipper.PointInPolygon', () => {
    fc.assert(fc.property(star, fc.array(fc.tuple(fc.integer({ min: -70, max: 70 }), fc.integer({ min: -70, max: 70 })), { minLength: 1, maxLength: 20 }), (path, probes) => {
      expect(pathAreaMm2(path)).toBe(ClipperLib.Clipper.Area(ref(path)) / 1e6);
      // probes about the first vertex, on the 1 mm grid, and the vertices themselves (boundary)
      for (const [px, py] of [...probes.map(([u, v]) => [path[0].x + u * 1000, path[0].y + v * 1000]), ...path.map((q) => [q.x, q.y])]) {
        expect(pointInPath(px / 1000, py / 1000, path)).toBe(ClipperLib.Clipper.PointInPolygon({ X: px, Y: py }, ref(path)));
      }
    }), { numRuns: 200 });
  });
});

describe('rings on the micrometre grid against Clipper (clipper-lib as the reference)', () => {
  // random simple and self-crossing polygons on a small grid, so points on edges and vertices come up often
  const polygon = fc.array(fc.tuple(fc.integer({ min: -20, max: 20 }), fc.integer({ min: -20, max: 20 })), { minLength: 3, maxLength: 12 });
  const probe = fc.tuple(fc.integer({ min: -22, max: 22 }), fc.integer({ min: -22, max: 22 }));

  it('point in ring (Hormann–Agathos) gives Clipper.PointInPolygon\'s answer, boundary included', () => {
    fc.assert(fc.property(polygon, fc.array(probe, { minLength: 1, maxLength: 20 }), (pts, probes) => {
      const ring = { x: Float64Array.from(pts.map((p) => p[0] * 1000)), y: Float64Array.from(pts.map((p) => p[1] * 1000)) };
      const path = ref(ringToPath(ring));
      for (const [px, py] of probes) {
        expect(pointInRing(px * 1000, py * 1000, ring)).toBe(ClipperLib.Clipper.PointInPolygon({ X: px * 1000, Y: py * 1000 }, path));
      }
    }), { numRuns: 400 });
  });

  it('ring area is Clipper.Area, and toRing rounds as toPath does', () => {
    fc.assert(fc.property(fc.array(fc.tuple(fc.double({ min: -500, max: 500, noNaN: true }), fc.double({ min: -500, max: 500, noNaN: true })), { minLength: 3, maxLength: 30 }), (pts) => {
      const xs = pts.map((p) => p[0]), ys = pts.map((p) => p[1]);
      const ring = toRing(xs, ys);
      const path = toPath(xs, ys);
      expect(ringToPath(ring)).toEqual(path);
      expect(ringAreaMm2(ring)).toBeCloseTo(ClipperLib.Clipper.Area(ref(path)) / 1e6, 9);
    }), { numRuns: 300 });
  });

  it('a 10 mm square ring: area 100 mm², perimeter 40 mm, inside, outside and on the edge (closed form)', () => {
    const sq = toRing([0, 10, 10, 0], [0, 0, 10, 10]);
    expect(ringAreaMm2(sq)).toBeCloseTo(100, 9);
    expect(ringPerimeterMm(sq)).toBeCloseTo(40, 9);
    expect(pointInRing(5000, 5000, sq)).toBe(1);
    expect(pointInRing(15000, 5000, sq)).toBe(0);
    expect(pointInRing(10000, 5000, sq)).toBe(-1);
    expect(pointInRing(0, 0, sq)).toBe(-1);
  });
});
