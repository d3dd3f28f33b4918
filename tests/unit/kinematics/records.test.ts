// Timed records and the accounting of an estimate: tool change, spin-up and dwell times added
// exactly (the time model; G4 P is seconds, NISTIR 6556 §3.5.4), program stops counted
// with no time, the breakdown by kind and tool adding up to the total, and the clock at the
// end of every move mapping a time back to its move.
import { describe, expect, it } from 'vitest';
import { estimate, moveAtTime, stockTopZ } from '@/lib/kinematics';
import { Moves, testProfile } from './support/moves';

// 100 mm at 50 mm/s, a = 500, rest to rest: d/v + v/a = 2 + 0.1 (Biagiotti & Melchiorri §3.2.2, from memory)
const t100 = 2.1;

describe('timed records', () => {
  const program = () =>
    new Moves({ x: 0, y: 0, z: -1 })
      .toolChange(3)
      .spindleStart()
      .feed(100, 0, -1, 3000)
      .dwell(2.5)
      .feed(0, 0, -1, 3000)
      .spindleStop()
      .programStop()
      .build();

  it('adds toolChangeSeconds, spindleSpinUpSeconds and the dwell exactly, and stops at each', () => {
    const e = estimate(program(), testProfile({ toolChangeSeconds: 15, spindleSpinUpSeconds: 3 }));
    expect(e.totalSeconds).toBeCloseTo(15 + 3 + t100 + 2.5 + t100, 9);
    expect(e.breakdownSeconds.toolChange).toBe(15);
    expect(e.breakdownSeconds.spindle).toBe(3);
    expect(e.breakdownSeconds.dwell).toBe(2.5);
    expect(e.breakdownSeconds.cutting).toBeCloseTo(2 * t100, 9);
    expect(e.programStops).toBe(1);
  });

  it('records the clock at the end of every move', () => {
    const e = estimate(program(), testProfile());
    const want = [15, 18, 18 + t100, 20.5 + t100, 20.5 + 2 * t100, 20.5 + 2 * t100, 20.5 + 2 * t100];
    expect(Array.from(e.cumulativeS)).toEqual(want.map((v) => expect.closeTo(v, 9)));
    expect(moveAtTime(e.cumulativeS, 0)).toBe(0);
    expect(moveAtTime(e.cumulativeS, 16)).toBe(1);
    expect(moveAtTime(e.cumulativeS, 19)).toBe(2);
    expect(moveAtTime(e.cumulativeS, 18 + t100 + 1)).toBe(3);
    expect(moveAtTime(e.cumulativeS, 1e9)).toBe(6);
    expect(moveAtTime(new Float64Array(0), 1)).toBe(-1);
  });

  it('calibratedSeconds = total × timeFactor', () => {
    const e = estimate(program(), testProfile({ timeFactor: 1.25 }));
    // 15 + 3 + 2.1 + 2.5 + 2.1 = 24.7 s, × 1.25
    expect(e.calibratedSeconds).toBeCloseTo(30.875, 9);
  });

  it('per tool: seconds with the tool in the spindle (its change included) and feed distance', () => {
    const m = new Moves().toolChange(1).feed(100, 0, 0, 3000).rapid(0, 0, 10).toolChange(2).feed(0, 0, 0, 3000).build();
    const e = estimate(m, testProfile({ toolChangeSeconds: 10 }));
    expect(e.tools.map((t) => t.tool)).toEqual([1, 2]);
    expect(e.tools[0].feedDistanceMm).toBeCloseTo(100, 9);
    expect(e.tools[1].feedDistanceMm).toBeCloseTo(10, 9);
    expect(e.tools[0].seconds + e.tools[1].seconds).toBeCloseTo(e.totalSeconds, 9);
    expect(e.tools[1].seconds).toBeCloseTo(10.3, 9); // change + a 10 mm plunge: 10 + (10/50 + 50/500)
  });
});

describe('breakdown by kind', () => {
  it('rapid, air (at or above the top), plunge (steeper than 45° down: our own line, neither sourced nor computed; ramps enter at a few degrees, plunges straight down, common practice), cutting (below the top)', () => {
    const m = new Moves({ x: 0, y: 0, z: 10 })
      .rapid(0, 0, 2) // rapid
      .feed(50, 0, 2, 3000) // air
      .feed(50, 0, -3, 3000) // plunge, straight down
      .feed(100, 0, -3, 3000) // cutting
      .feed(150, 0, -5, 3000) // ramp of 2 in 50: cutting, not plunge
      .build();
    const e = estimate(m, testProfile());
    const c = e.cumulativeS;
    expect(e.breakdownSeconds.rapid).toBeCloseTo(c[0], 9);
    expect(e.breakdownSeconds.air).toBeCloseTo(c[1] - c[0], 9);
    expect(e.breakdownSeconds.plunge).toBeCloseTo(c[2] - c[1], 9);
    expect(e.breakdownSeconds.cutting).toBeCloseTo(c[4] - c[2], 9);
    const b = e.breakdownSeconds;
    expect(b.cutting + b.air + b.rapid + b.plunge + b.dwell + b.toolChange + b.spindle).toBeCloseTo(e.totalSeconds, 9);
    expect(e.distanceMm.rapid).toBeCloseTo(8, 9);
    expect(e.distanceMm.feed).toBeCloseTo(50 + 5 + 50 + Math.hypot(50, 2), 9);
  });

  it('with Z zero on the table the stock top is the sheet thickness', () => {
    expect(stockTopZ('table', 18)).toBe(18);
    expect(stockTopZ('top', 18)).toBe(0);
    expect(stockTopZ('table', null)).toBe(0);
    const m = new Moves({ x: 0, y: 0, z: 10 }).feed(100, 0, 10, 3000).build();
    expect(estimate(m, testProfile(), { stockTopZ: 18 }).breakdownSeconds.cutting).toBeCloseTo(t100, 9);
    expect(estimate(m, testProfile()).breakdownSeconds.air).toBeCloseTo(t100, 9);
  });

  it('achieved vs commanded feed of cutting moves: the share lost to acceleration', () => {
    const m = new Moves({ x: 0, y: 0, z: -1 }).feed(100, 0, -1, 3000).build();
    const e = estimate(m, testProfile());
    expect(e.cuttingFeed.commandedMmPerMin).toBeCloseTo(3000, 6);
    expect(e.cuttingFeed.achievedMmPerMin).toBeCloseTo(2857.142857, 6); // 100 mm in 2.1 s, per minute
    expect(e.cuttingFeed.lostShare).toBeCloseTo(1 - 2 / 2.1, 9);
  });
});

describe('progress and cancelling', () => {
  it('reports progress and stops when the signal is raised', () => {
    const b = new Moves();
    for (let i = 1; i <= 1000; i++) b.feed(i, (i % 2) * 3, 0, 3000);
    const seen: number[] = [];
    const signal = { aborted: false };
    const e = estimate(b.build(), testProfile(), {
      progressEvery: 100,
      signal,
      onProgress: (done) => {
        seen.push(done);
        if (done >= 300) signal.aborted = true;
      },
    });
    expect(seen).toEqual([100, 200, 300]);
    expect(e.cancelled).toBe(true);
  });
});
