// Properties: a rigid move or a mirror of the whole program changes no area, count or verdict;
// a loop's area does not depend on the direction it is cut (areas are of regions, not of paths).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyze, type HoldDownMethod } from '@/lib/analysis';
import { ProgramWriter, transformMoves } from './support/program';
import { job } from './support/jobs';

interface Spec { parts: Array<{ x: number; y: number; w: number; h: number; hole: boolean; tabs: boolean; holeLast: boolean }>; }

const partArb = fc.record({
  x: fc.integer({ min: 0, max: 9 }), y: fc.integer({ min: 0, max: 9 }),
  w: fc.integer({ min: 20, max: 90 }), h: fc.integer({ min: 20, max: 90 }),
  hole: fc.boolean(), tabs: fc.boolean(), holeLast: fc.boolean(),
});
const specArb = fc.record({ parts: fc.uniqueArray(partArb, { minLength: 1, maxLength: 6, selector: (p) => `${p.x},${p.y}` }) });

function program(s: Spec) {
  const w = new ProgramWriter();
  w.tool = 1;
  for (const p of s.parts) {
    const x0 = 100 + p.x * 100, y0 = 100 + p.y * 100;
    const hole = () => w.circle(x0 + p.w / 2, y0 + p.h / 2, Math.min(p.w, p.h) / 5, [-9, -18.3]);
    if (p.hole && !p.holeLast) hole();
    w.rect(x0, y0, x0 + p.w, y0 + p.h, [-9, -18.3], p.tabs ? { tabs: { perSide: 1, lengthMm: 6, heightMm: 3 } } : {});
    if (p.hole && p.holeLast) hole();
  }
  return w.build();
}

function digest(r: ReturnType<typeof analyze>) {
  return {
    areas: r.parts.map((p) => Math.round(p.areaMm2 * 10) / 10).sort((a, b) => a - b),
    verdicts: r.parts.map((p) => `${p.holdBy}/${p.held}/${p.tabs}/${p.holes}`).sort(),
    findings: r.findings.map((f) => `${f.kind}@${f.line}`).sort(),
  };
}

describe('invariance under translation and mirroring (fast-check)', () => {
  const methods: HoldDownMethod[] = ['vacuum', 'tape-glue', 'clamps', 'tabs'];
  it('translating a program does not change areas, counts or verdicts', () => {
    fc.assert(fc.property(specArb, fc.integer({ min: -80, max: 80 }), fc.integer({ min: -80, max: 80 }), fc.constantFrom(...methods), (s, dx, dy, m) => {
      const base = program(s);
      const a = digest(analyze(base, job(18, m)));
      const b = digest(analyze(transformMoves(base, dx + 0.25, dy - 0.125), job(18, m)));
      expect(b).toEqual(a);
    }), { numRuns: 30 });
  });

  it('mirroring a program (x → 1200 − x, arcs reversed) does not change areas, counts or verdicts', () => {
    fc.assert(fc.property(specArb, fc.constantFrom(...methods), (s, m) => {
      const base = program(s);
      const a = digest(analyze(base, job(18, m)));
      const b = digest(analyze(transformMoves(base, 0, 0, 1200), job(18, m)));
      expect(b).toEqual(a);
    }), { numRuns: 30 });
  });
});

describe('loop direction', () => {
  it('a star-shaped polygon part cut either way round has the shoelace area of its corners', () => {
    // one corner per equal sector about (300, 300), at a random radius: a star-shaped, so
    // simple, polygon; tool 9 has diameter 0, so the finished part is the loop itself, whose
    // area is ½|Σ (x_i·y_{i+1} − x_{i+1}·y_i)| (shoelace formula of plane geometry)
    let runs = 0;
    fc.assert(fc.property(fc.array(fc.tuple(fc.integer({ min: 20, max: 60 }), fc.double({ min: 0.1, max: 0.9, noNaN: true })), { minLength: 3, maxLength: 12 }), fc.boolean(), (corners, reversed) => {
      runs++;
      const n = corners.length;
      let pts = corners.map(([r, t], k) => {
        const a = ((k + t) * 2 * Math.PI) / n;
        return [Math.round((300 + r * Math.cos(a)) * 1000) / 1000, Math.round((300 + r * Math.sin(a)) * 1000) / 1000];
      });
      if (reversed) pts = [...pts].reverse();
      let twice = 0;
      for (let k = 0; k < n; k++) twice += pts[k][0] * pts[(k + 1) % n][1] - pts[(k + 1) % n][0] * pts[k][1];
      const w = new ProgramWriter();
      w.tool = 9;
      w.rapid(pts[0][0], pts[0][1], w.safeZ).feed(pts[0][0], pts[0][1], -18.3, 600);
      for (let k = 1; k <= n; k++) w.feed(pts[k % n][0], pts[k % n][1], -18.3);
      w.retract();
      const r = analyze(w.build(), job(18, 'tape-glue'));
      expect(r.parts).toHaveLength(1);
      expect(r.parts[0].areaMm2).toBeCloseTo(Math.abs(twice) / 2, 3);
      expect(r.parts[0].holdBy).toBe('tape-glue');
    }), { numRuns: 60 });
    expect(runs).toBe(60);
  });

  it('a part cut clockwise has the same area and verdict as cut counter-clockwise', () => {
    fc.assert(fc.property(fc.integer({ min: 30, max: 200 }), fc.integer({ min: 30, max: 200 }), fc.boolean(), (w, h, ccwCircle) => {
      const a = new ProgramWriter();
      a.circle(50 + w / 2, 50 + h / 2, 5, [-18.3], { ccw: ccwCircle });
      a.rect(50, 50, 50 + w, 50 + h, [-9, -18.3]);
      const b = new ProgramWriter();
      b.circle(50 + w / 2, 50 + h / 2, 5, [-18.3], { ccw: !ccwCircle });
      b.rect(50, 50, 50 + w, 50 + h, [-9, -18.3], { cw: true });
      const ra = analyze(a.build(), job(18, 'vacuum')), rb = analyze(b.build(), job(18, 'vacuum'));
      expect(rb.parts).toHaveLength(1);
      expect(rb.parts[0].areaMm2).toBeCloseTo(ra.parts[0].areaMm2, 6);
      expect(rb.parts[0].holdBy).toBe(ra.parts[0].holdBy);
      expect(rb.parts[0].holes).toBe(1);
    }), { numRuns: 40 });
  });

  it('a hole whose kerf meets the outside kerf leaves no part (nothing is left between the cuts)', () => {
    const a = new ProgramWriter();
    a.circle(57.5, 57.5, 5, [-18.3]);
    a.rect(50, 50, 65, 65, [-18.3]); // 15 mm square tool path, 6.35 mm tool: the hole's kerf reaches the outside
    expect(analyze(a.build(), job(18, 'vacuum')).parts).toEqual([]);
  });
});
