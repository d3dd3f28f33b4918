// The memos for repeated loops: congruent loops of the cut graph share one outline
// (lib/analysis/loop-shapes, LoopShapes), and repeated parts share the Clipper results
// (PartShapes). A copy must come out as the part analysed on its own, moved: the reference is
// the same analysis of a program holding that one copy (no reuse possible). The
// area-preserving arc flattening (areaRadius) encloses exactly the sector's area r²θ/2.
import { describe, expect, it } from 'vitest';
import { analyze } from '@/lib/analysis';
import { extractLoops, prune } from '@/lib/analysis/graph/faces';
import { FindingSink } from '@/lib/analysis/checks/findings';
import { areaRadius, LoopShapes, placePoints } from '@/lib/analysis/shapes/loop-shapes';
import { describeLoop } from '@/lib/analysis/shapes/loops';
import { loopNode } from '@/lib/analysis/shapes/nesting';
import { PartShapes } from '@/lib/analysis/shapes/parts';
import { ProgramChecks } from '@/lib/analysis/checks/program-checks';
import { scanMoves } from '@/lib/analysis/pass/scan';
import { resolveSettings } from '@/lib/analysis/settings';
import type { LoopInfo } from '@/lib/analysis/shapes/loops';
import type { MoveList } from '@/lib/gcode/move-list';
import { job } from './support/jobs';
import { ProgramWriter } from './support/program';

const DEPTHS = [-9, -18.3];

/** a 150 × 120 mm plate with a Ø24 mm hole, cut hole first, at (x0, y0) */
function plate(w: ProgramWriter, x0: number, y0: number): void {
  w.circle(x0 + 50, y0 + 40, 12, DEPTHS);
  w.rect(x0, y0, x0 + 150, y0 + 120, DEPTHS);
}

function program(offsets: number[][]): MoveList {
  const w = new ProgramWriter();
  w.tool = 1;
  for (const [dx, dy] of offsets) plate(w, 100 + dx, 100 + dy);
  return w.build();
}

/** the loops of a move list through the analysis' own pass, placed with the given memo */
function loopsOf(moves: MoveList, shapes: LoopShapes): LoopInfo[] {
  const s = resolveSettings(undefined);
  const bottom = -18, through = bottom + s.bottomToleranceMm;
  const checks = new ProgramChecks({ sheet: null, topZ: 0, bottomZ: bottom, spoilboardAllowanceMm: s.spoilboardAllowanceMm, toleranceMm: s.bottomToleranceMm, toolDiameter: () => 6.35 }, new FindingSink(25));
  const scan = scanMoves(moves, { throughZ: through, bandTopZ: bottom + s.skinMaxMm, stockTopZ: 0, chainToleranceMm: s.chainToleranceMm, chordToleranceMm: s.chordToleranceMm, tabMaxLengthMm: s.tabMaxLengthMm }, checks);
  const g = scan.graph!;
  g.zipOverlaps();
  return extractLoops(g, prune(g)).map((l) => describeLoop(g, l, bottom, through, moves.line, s.chordToleranceMm, shapes));
}

describe('shape memos', () => {
  // whole micrometres keep the rounding the same; 0.4 µm steps may round a point differently
  const offsets = [[0, 0], [200, 0], [0, 150], [834.567, 987.001], [449.9996, 333.3333], [600, 0]];

  it('each copy of a plate with a hole gets the area, perimeter and box of the plate analysed alone, moved', () => {
    const all = analyze(program(offsets), job(18)).parts.sort((a, b) => a.bbox.minX - b.bbox.minX || a.bbox.minY - b.bbox.minY);
    const alone = offsets.map((o) => analyze(program([o]), job(18)).parts[0]).sort((a, b) => a.bbox.minX - b.bbox.minX || a.bbox.minY - b.bbox.minY);
    expect(all).toHaveLength(offsets.length);
    all.forEach((p, i) => {
      const q = alone[i];
      // 1 µm grid: a point rounded the other way moves the area by about a micrometre times a chord
      expect(p.areaMm2).toBeCloseTo(q.areaMm2, 2);
      expect(p.perimeterMm).toBeCloseTo(q.perimeterMm, 2);
      for (const k of ['minX', 'minY', 'maxX', 'maxY'] as const) expect(Math.abs(p.bbox[k] - q.bbox[k])).toBeLessThanOrEqual(0.002);
      expect(p.holes).toBe(1);
    });
    // closed form: the outline shrunk by the radius, (150 − d)(120 − d), minus the hole grown by it, π(12 + d/2)², d = 6.35
    const d = 6.35;
    expect(all[0].areaMm2).toBeCloseTo((150 - d) * (120 - d) - Math.PI * (12 + d / 2) ** 2, 0);
  });

  it('congruent loops share one outline; a loop entered at another vertex is the same shape', () => {
    const shapes = new LoopShapes();
    const loops = loopsOf(program([[0, 0], [200, 0], [0, 150], [400, 300]]), shapes);
    expect(loops).toHaveLength(8);
    expect(shapes.misses).toBe(2); // the plate's outline and the hole
    expect(shapes.hits).toBe(6);
    // the same rectangle cut from its far corner, clockwise
    const w = new ProgramWriter();
    w.tool = 1;
    w.rect(100, 100, 250, 220, DEPTHS);
    w.rapid(850, 720, 5);
    for (const d of DEPTHS) w.feed(850, 720, d).feed(850, 600, d).feed(700, 600, d).feed(700, 720, d).feed(850, 720, d);
    const other = new LoopShapes();
    const two = loopsOf(w.retract().build(), other);
    expect(two).toHaveLength(2);
    expect(two[0].shape).toBe(two[1].shape);
    expect(other.misses).toBe(1);
  });

  it('the part memo tells a different tool radius or hole place from a copy', () => {
    const outer = placePoints([0, 100, 100, 0], [0, 0, 80, 80]);
    const hole = placePoints([40, 60, 60, 40], [30, 30, 50, 50]);
    const info = {} as LoopInfo;
    const at = (p: typeof outer, dx: number, dy: number, r: number) => loopNode(info, p.shape, p.ox + dx, p.oy + dy, r);
    const shapes = new PartShapes();
    const a = shapes.part(at(outer, 0, 0, 3), [at(hole, 0, 0, 3)]);
    const b = shapes.part(at(outer, 500_000, 0, 3), [at(hole, 500_000, 0, 3)]); // the same part 500 mm away
    expect(shapes.parts.hits).toBe(1);
    expect(b.areaMm2).toBe(a.areaMm2);
    expect(b.bbox!.minX - a.bbox!.minX).toBeCloseTo(500, 9);
    shapes.part(at(outer, 0, 0, 3.175), [at(hole, 0, 0, 3)]);
    shapes.part(at(outer, 0, 0, 3), [at(hole, 1000, 0, 3)]);
    expect(shapes.parts.misses).toBe(3);
    // closed form: the outline shrunk by 3 mm, 94 × 74, minus the 20 mm square hole grown by 3 mm with round corners, 26² − (4 − π)·3²
    expect(a.areaMm2).toBeCloseTo(94 * 74 - (26 * 26 - (4 - Math.PI) * 9), 0);
  });
});

describe('area-preserving arc chords', () => {
  // shoelace area of the fan (centre, end point on r, inner points on ρ, end point on r) against r²θ/2 (sector, closed form)
  for (const [r, thetaDeg, m] of [[10, 90, 2], [10, 90, 5], [4, 30, 3], [25, 360, 12], [3.175, 180, 7]]) {
    it(`r ${r}, sweep ${thetaDeg}°, ${m} chords enclose r²θ/2`, () => {
      const theta = (thetaDeg * Math.PI) / 180;
      const rho = areaRadius(r, theta, m);
      const xs = [0], ys = [0];
      for (let k = 0; k <= m; k++) {
        const rr = k === 0 || k === m ? r : rho;
        xs.push(rr * Math.cos((theta * k) / m));
        ys.push(rr * Math.sin((theta * k) / m));
      }
      let a2 = 0;
      for (let i = 0; i < xs.length; i++) {
        const j = (i + 1) % xs.length;
        a2 += xs[i] * ys[j] - xs[j] * ys[i];
      }
      expect(a2 / 2).toBeCloseTo((r * r * theta) / 2, 9);
      expect(rho).toBeGreaterThan(r);
    });
  }
});
