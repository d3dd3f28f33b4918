// Controller limits of the motion model: block rate R (a block lasts at least 1/R s, so
// v ≤ length·R) and a look-ahead of N blocks (the planner must be able to stop within the
// blocks it holds: on a straight run v² = 2·a·(distance held ahead)). Trapezoid closed forms:
// Biagiotti & Melchiorri §3.2.2 (from memory).
import { describe, expect, it } from 'vitest';
import { blockDurationS, estimate, restToRestDurationS } from '@/lib/kinematics';
import { Moves, testProfile } from './support/moves';

const run = (n: number, len: number, f: number) => {
  const b = new Moves();
  for (let i = 1; i <= n; i++) b.feed(i * len, 0, 0, f);
  return b.build();
};

describe('block rate', () => {
  it('1000 blocks of 0.01 mm at 1000 blocks/s run at 10 mm/s: a 10 mm trapezoid, 1.02 s', () => {
    const p = testProfile({ maxBlocksPerS: 1000, lookaheadBlocks: 32 });
    const e = estimate(run(1000, 0.01, 6000), p);
    expect(e.totalSeconds).toBeCloseTo(restToRestDurationS(10, 10, 500), 9);
    expect(e.totalSeconds).toBeGreaterThanOrEqual(1000 / 1000);
  });
  it('unlimited block rate lets the same run reach F', () => {
    const e = estimate(run(1000, 0.01, 6000), testProfile({ maxBlocksPerS: 0, lookaheadBlocks: 0 }));
    expect(e.totalSeconds).toBeCloseTo(restToRestDurationS(10, 100, 500), 9);
  });
});

describe('look-ahead', () => {
  it('N = 8 blocks of 1 mm: each block enters and leaves at √(2·500·7) (7 mm held ahead) and peaks at √(2·500·7.5)', () => {
    // Within a block the speed rises to v_peak = √(a·d + v²) = √(2·a·7.5) at its middle,
    // where 7.5 mm remain to the end of the blocks held: v² = 2·a·(distance held) everywhere.
    const p = testProfile({ lookaheadBlocks: 8 });
    const e = estimate(run(200, 1, 60000), p);
    const v = Math.sqrt(2 * 500 * 7);
    const vPeak = Math.sqrt(500 * 1 + v * v);
    expect(vPeak).toBeCloseTo(Math.sqrt(2 * 500 * 7.5), 9);
    const mid = e.cumulativeS[100] - e.cumulativeS[99];
    expect(mid).toBeCloseTo(blockDurationS(1, 1000, 500, v, v), 9);
    expect(mid).toBeCloseTo((2 * vPeak - 2 * v) / 500, 9);
    // the first block accelerates from rest at a throughout: 2d/v with v = √(2·a·d)
    expect(e.cumulativeS[0]).toBeCloseTo((2 * 1) / Math.sqrt(2 * 500 * 1), 9);
  });
  it('a deeper look-ahead is never slower', () => {
    const t = (n: number) => estimate(run(200, 1, 60000), testProfile({ lookaheadBlocks: n })).totalSeconds;
    expect(t(16)).toBeLessThan(t(8));
    expect(t(0)).toBeLessThan(t(16));
  });
  it('N = 1 stops at every block', () => {
    const e = estimate(run(20, 1, 60000), testProfile({ lookaheadBlocks: 1 }));
    expect(e.totalSeconds).toBeCloseTo(20 * restToRestDurationS(1, 1000, 500), 9);
  });
  it('unlimited look-ahead runs the straight run as one block', () => {
    const e = estimate(run(200, 1, 60000), testProfile({ lookaheadBlocks: 0 }));
    expect(e.totalSeconds).toBeCloseTo(restToRestDurationS(200, 1000, 500), 9);
  });
});
