// Controller limits of the motion model: block rate R (a block lasts at least 1/R s, so
// v ≤ length·R) and a look-ahead of N blocks (the planner must be able to stop within the
// blocks it holds: on a straight run v² = 2·a·(distance held ahead)). Expected values are
// literals from the trapezoid closed forms (Biagiotti & Melchiorri §3.2.2, from memory) and,
// at corners, the corner-tolerance model of docs/references.md §3 (inscribed circle, a = v²/R).
import { describe, expect, it } from 'vitest';
import { estimate } from '@/lib/kinematics';
import { Moves, testProfile } from './support/moves';

const run = (n: number, len: number, f: number) => {
  const b = new Moves();
  for (let i = 1; i <= n; i++) b.feed(i * len, 0, 0, f);
  return b.build();
};

describe('block rate', () => {
  it('1000 blocks of 0.01 mm at 1000 blocks/s run at 10 mm/s: one 10 mm trapezoid, d/v + v/a = 1 + 0.02 = 1.02 s', () => {
    const p = testProfile({ maxBlocksPerS: 1000, lookaheadBlocks: 32 });
    const e = estimate(run(1000, 0.01, 6000), p);
    expect(e.totalSeconds).toBeCloseTo(1.02, 9);
  });
  it('unlimited block rate lets the same run reach F: 10 mm < v²/a = 20 mm, so 2√(d/a) = 0.282843 s', () => {
    const e = estimate(run(1000, 0.01, 6000), testProfile({ maxBlocksPerS: 0, lookaheadBlocks: 0 }));
    expect(e.totalSeconds).toBeCloseTo(0.282843, 6);
  });
  it('on an arc the chords share the cap: r = 10, e = 0.01 → 71 chords of 20π/71 mm; at 20 blocks/s v = 17.6991 mm/s → 71/20 + v·cos(π/71)/500 = 3.585364 s', () => {
    // 71 chords (chord count of docs/references.md); the cap 0.884956 mm × 20/s lies below F
    // (100 mm/s) and √(a·r) = 70.71 mm/s. Ramps of v²/(2a) = 0.31 mm fit in the first and last
    // chord, which run within π/71 of ±Y: a along them = 500/cos(π/71). Between chords the
    // corner circle R = δ·s/(1 − s) = 10.2 mm (s = cos(π/71)) is wider than the arc: no corner binds.
    const m = new Moves({ x: 10, y: 0, z: 0 }).arcXY(0, 0, 2 * Math.PI, 6000).build();
    const e = estimate(m, testProfile({ chordToleranceMm: 0.01, maxBlocksPerS: 20 }));
    expect(e.blocks).toBe(71);
    expect(e.totalSeconds).toBeCloseTo(3.585364, 6);
    // without the block rate the centripetal limit decides: at least 20π/√(500·10) = 0.888577 s
    // and at most that plus a full v/a = 0.141421 s of ramps
    const free = estimate(m, testProfile({ chordToleranceMm: 0.01 })).totalSeconds;
    expect(free).toBeGreaterThan(0.888577);
    expect(free).toBeLessThan(0.888577 + 0.141422);
  });
});

describe('look-ahead', () => {
  it('N = 8 blocks of 1 mm: a middle block enters and leaves at √(2·500·7) and peaks at √(2·500·7.5): (2·86.6025 − 2·83.6660)/500 = 0.011746 s', () => {
    // v² = 2·a·(distance held ahead): 7 mm at the block's ends, 7.5 mm at its middle
    const p = testProfile({ lookaheadBlocks: 8 });
    const e = estimate(run(200, 1, 60000), p);
    expect(e.cumulativeS[100] - e.cumulativeS[99]).toBeCloseTo(0.011746, 6);
    // the first block accelerates from rest at a throughout: 2d/v with v = √(2·a·d) = 0.0632456 s
    expect(e.cumulativeS[0]).toBeCloseTo(0.0632456, 7);
  });
  it('a deeper look-ahead is never slower', () => {
    const t = (n: number) => estimate(run(200, 1, 60000), testProfile({ lookaheadBlocks: n })).totalSeconds;
    expect(t(16)).toBeLessThan(t(8));
    expect(t(0)).toBeLessThan(t(16));
  });
  it('N = 1 stops at every block: 20 × 2√(1/500) = 1.788854 s', () => {
    const e = estimate(run(20, 1, 60000), testProfile({ lookaheadBlocks: 1 }));
    expect(e.totalSeconds).toBeCloseTo(1.788854, 6);
  });
  it('unlimited look-ahead runs the straight run as one block: 200 mm < v²/a = 2000 mm → 2√(200/500) = 1.264911 s', () => {
    const e = estimate(run(200, 1, 60000), testProfile({ lookaheadBlocks: 0 }));
    expect(e.totalSeconds).toBeCloseTo(1.264911, 6);
  });

  describe('on a path with corners: a zig-zag of 1 mm blocks at ±5° about X (170° corners)', () => {
    // Each block runs along (cos 5°, ±sin 5°): a along it = 500/cos 5° = 501.910 mm/s²; F and
    // the axis feeds (1000 mm/s) are far above. At every vertex u_out − u_in lies along Y, so
    // the corner speed is √(500·δ·s/(1 − s)), s = sin 85°: 36.1795 mm/s (docs/references.md).
    const zigzag = (n: number) => {
      const b = new Moves();
      const dx = Math.cos((5 * Math.PI) / 180);
      const dy = Math.sin((5 * Math.PI) / 180);
      for (let i = 1; i <= n; i++) b.feed(i * dx, i % 2 ? dy : 0, 0, 60000);
      return b.build();
    };
    it('N = 2: the look-ahead binds before the corner: a middle block runs √(2·a·1) = 31.6831 → 31.6831 mm/s, 2(√(a + 2a) − 31.6831)/a = 0.028374 s', () => {
      const e = estimate(zigzag(40), testProfile({ lookaheadBlocks: 2 }));
      expect(e.cumulativeS[20] - e.cumulativeS[19]).toBeCloseTo(0.028374, 6);
    });
    it('N = 0: the corners bind: a middle block runs 36.1795 → 36.1795 mm/s, 2(√(a·1 + 36.1795²) − 36.1795)/a = 0.025402 s', () => {
      const e = estimate(zigzag(40), testProfile({ lookaheadBlocks: 0 }));
      expect(e.cumulativeS[20] - e.cumulativeS[19]).toBeCloseTo(0.025402, 6);
    });
  });
});
