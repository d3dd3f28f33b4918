// The viewer's path buffers and achieved-speed shares. Checked against closed forms from
// outside the project: the trapezoidal velocity profile from rest to rest (Biagiotti &
// Melchiorri, Trajectory Planning for Automatic Machines and Robots, §3.2.2, from memory):
// t = L/v + v/a when the feed is reached (L ≥ v²/a), t = 2√(L/a) when it is not; and the
// sagitta of a chord, r(1 − cos(φ/2)) (circle geometry), for the arc's chord count.
import { describe, expect, it } from 'vitest';
import { arcPoint, interpret } from '@/lib/gcode';
import { estimate } from '@/lib/kinematics';
import { buildViewerPath, TAG_FINDING, TAG_RAPID } from '@/lib/viewer/path-build';
import { ViewKind } from '@/lib/viewer/path-kinds';
import { Moves, testProfile } from '../kinematics/support/moves';

const none = new Uint32Array(0);

function build(m: ReturnType<Moves['build']>, tol = 0.003, findingLines = none) {
  const e = estimate(m, testProfile({ chordToleranceMm: tol }));
  return { path: buildViewerPath(m, e.cumulativeS, { stockTopZ: 0, chordToleranceMm: tol, findingLines }), est: e };
}

describe('achieved speed', () => {
  it('100 mm at F6000 (100 mm/s), a = 500 mm/s²: t = L/v + v/a = 1.2 s, so 100/1.2 mm/s is 5/6 of the feed', () => {
    const { path } = build(new Moves({ x: 0, y: 0, z: -1 }).feed(100, 0, -1, 6000).build());
    expect(path.speedShare[0]).toBeCloseTo(5 / 6, 6);
  });
  it('10 mm at the same feed never reaches it (10 < v²/a = 20 mm): t = 2√(L/a) = 0.282843 s, share 0.353553', () => {
    const { path } = build(new Moves({ x: 0, y: 0, z: -1 }).feed(10, 0, -1, 6000).build());
    expect(path.speedShare[0]).toBeCloseTo(10 / (2 * Math.sqrt(10 / 500)) / 100, 5);
    expect(path.speedShare[0]).toBeCloseTo(0.353553, 5);
  });
  it('rapids and records have no share (NaN), so colour by speed leaves them to their own colour', () => {
    const { path } = build(new Moves().rapid(50, 0, 5).dwell(1).build());
    expect(Number.isNaN(path.speedShare[0])).toBe(true);
    expect(Number.isNaN(path.speedShare[1])).toBe(true);
  });
});

describe('move kinds (the planner’s rule: steeper than 45° down is a plunge, below the stock top a cut, else air)', () => {
  it('classifies a rapid, a plunge, a cut, a shallow ramp into the stock and an air move', () => {
    const m = new Moves({ x: 0, y: 0, z: 5 })
      .rapid(10, 10, 5) // rapid
      .feed(10, 10, -3, 1000) // straight down: plunge
      .feed(60, 10, -3, 3000) // below the top: cut
      .feed(60, 10, 2, 3000) // up, partly below the top: cut
      .feed(100, 10, 2, 3000) // above the top: air
      .feed(110, 10, -1, 3000) // down 3 over 10: a ramp, below the top: cut
      .build();
    const { path } = build(m);
    expect(Array.from(path.viewKind)).toEqual([ViewKind.rapid, ViewKind.plunge, ViewKind.cut, ViewKind.cut, ViewKind.air, ViewKind.cut]);
  });
});

describe('segments', () => {
  it('a quarter circle of r = 10 at e = 0.01 mm has ⌈(π/2)/(2·acos(1 − e/r))⌉ = 18 chords, every vertex on the circle', () => {
    const step = 2 * Math.acos(1 - 0.01 / 10);
    const expected = Math.ceil(Math.PI / 2 / step);
    expect(expected).toBe(18);
    const m = new Moves({ x: 10, y: 0, z: -1 }).arcXY(0, 0, Math.PI / 2, 3000).feed(0, 20, -1, 3000).build();
    const { path } = build(m, 0.01);
    expect(path.moveSegStart[1] - path.moveSegStart[0]).toBe(expected);
    expect(path.moveSegStart[2] - path.moveSegStart[1]).toBe(1);
    // one strip: the arc's start, then the end of every chord
    for (let v = 0; v <= expected; v++) {
      expect(Math.hypot(path.positions[v * 3], path.positions[v * 3 + 1])).toBeCloseTo(10, 4);
    }
    expect([path.positions[0], path.positions[1]]).toEqual([10, 0]);
    expect(path.positions.length).toBe((expected + 2) * 3);
    expect([path.positions[(expected + 1) * 3], path.positions[(expected + 1) * 3 + 1]]).toEqual([0, 20]);
    // the sagitta of every chord stays within the tolerance
    for (let s = 0; s < expected; s++) {
      const o = s * 3;
      const mx = (path.positions[o] + path.positions[o + 3]) / 2;
      const my = (path.positions[o + 1] + path.positions[o + 4]) / 2;
      expect(10 - Math.hypot(mx, my)).toBeLessThanOrEqual(0.01 + 1e-6);
    }
  });
  it('records have no segment; tags carry the tool slot, the rapid flag and the finding flag; rapids measure their dash distance', () => {
    const m = new Moves({ x: 0, y: 0, z: 5 }).toolChange(3).rapid(30, 40, 5).feed(30, 40, -1, 1000).build();
    const { path } = build(m, 0.003, Uint32Array.of(3));
    expect(Array.from(path.moveSegStart)).toEqual([0, 0, 1, 2]);
    expect(path.tools).toEqual([3]);
    expect(path.tag[1]).toBe(TAG_RAPID);
    expect(path.tag[5]).toBe(TAG_FINDING);
    expect(Array.from(path.toolSlot.subarray(1))).toEqual([path.tag[2], path.tag[4]]);
    expect(path.dash[0]).toBe(0);
    expect(path.dash[1]).toBeCloseTo(50, 5); // a 30-40-50 triangle
    expect(path.dash[2]).toBe(0); // the feed after it: not a rapid, the next run of rapids starts at 0
    expect(path.bounds).toEqual({ minX: 0, minY: 0, minZ: -1, maxX: 30, maxY: 40, maxZ: 5 });
  });
});

describe('arc chords in every plane', () => {
  it('are the points lib/gcode arcPoint gives at c/n of the sweep (the arc geometry of NISTIR 6556 §3.5.3), to the last bit before float32', () => {
    // a G17 quarter, a G18 half turn with a rise along Y, a G19 full helix turn down Z... in X
    const text = 'G21 G90 G17\nG0 X10 Y0 Z-1\nG1 F1000\nG3 X0 Y10 I-10 J0\nG18\nG2 X20 Z-1 Y3 I10 K0\nG19\nG3 Y13 Z-1 X25 J5 K0\n';
    const r = interpret(text, {});
    expect(r.moves.arcs.count).toBe(3);
    const e = estimate(r.moves, testProfile({ chordToleranceMm: 0.01 }));
    const path = buildViewerPath(r.moves, e.cumulativeS, { stockTopZ: 0, chordToleranceMm: 0.01, findingLines: none });
    const p = { x: 0, y: 0, z: 0 };
    for (let a = 0; a < r.moves.arcs.count; a++) {
      const i = r.moves.arcs.move[a];
      const from = path.moveSegStart[i];
      const n = path.moveSegStart[i + 1] - from;
      expect(n).toBeGreaterThan(10);
      for (let c = 1; c <= n; c++) {
        arcPoint(r.moves, a, c / n, p);
        const o = (from + c) * 3;
        expect([path.positions[o], path.positions[o + 1], path.positions[o + 2]]).toEqual([Math.fround(p.x), Math.fround(p.y), Math.fround(p.z)]);
      }
    }
  });
});
