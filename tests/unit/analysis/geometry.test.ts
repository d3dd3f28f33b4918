// Areas and containment of through-cut parts against closed forms and against an independent
// polygon library (@flatten-js/core, exact circular arcs), and Clipper's own offsets; the
// typed-array rings the nesting works on against Clipper's point-in-polygon and area.
import Flatten from '@flatten-js/core';
import ClipperLib from 'clipper-lib';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyze } from '@/lib/analysis';
import { offsetPaths, pathsAreaMm2, pointInPath, pointInRing, ringAreaMm2, ringPerimeterMm, ringToPath, toPath, toRing } from '@/lib/analysis/geometry';
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
    // the same answer from the independent library's point containment
    const hole = new Polygon([point(20, 20), point(80, 20), point(80, 80), point(20, 80)]);
    expect(hole.contains(point(50, 50))).toBe(true);
    expect(hole.contains(point(10, 10))).toBe(false);
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

describe('rings on the micrometre grid against Clipper (clipper-lib as the reference)', () => {
  // random simple and self-crossing polygons on a small grid, so points on edges and vertices come up often
  const polygon = fc.array(fc.tuple(fc.integer({ min: -20, max: 20 }), fc.integer({ min: -20, max: 20 })), { minLength: 3, maxLength: 12 });
  const probe = fc.tuple(fc.integer({ min: -22, max: 22 }), fc.integer({ min: -22, max: 22 }));

  it('point in ring (Hormann–Agathos) gives Clipper.PointInPolygon\'s answer, boundary included', () => {
    fc.assert(fc.property(polygon, fc.array(probe, { minLength: 1, maxLength: 20 }), (pts, probes) => {
      const ring = { x: Float64Array.from(pts.map((p) => p[0] * 1000)), y: Float64Array.from(pts.map((p) => p[1] * 1000)) };
      const path = ringToPath(ring);
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
      expect(ringAreaMm2(ring)).toBeCloseTo(ClipperLib.Clipper.Area(path) / 1e6, 9);
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
