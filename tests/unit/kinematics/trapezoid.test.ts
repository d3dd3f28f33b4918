// Trapezoidal profiles: closed forms of L. Biagiotti, C. Melchiorri, Trajectory Planning for
// Automatic Machines and Robots, Springer 2008, §3.2.2 (from memory); check values computed in
// docs/references.md (v = 50 mm/s, a = 500 mm/s²).
import { describe, expect, it } from 'vitest';
import { blockDurationS, estimate, restToRestDurationS } from '@/lib/kinematics';
import { Moves, testProfile } from './support/moves';

describe('closed forms (Biagiotti & Melchiorri §3.2.2, from memory; values computed)', () => {
  it('rest to rest with cruise: d = 100 → d/v + v/a = 2.100 s', () => {
    expect(restToRestDurationS(100, 50, 500)).toBeCloseTo(2.1, 9);
  });
  it('rest to rest, triangle: d = 2 → 2√(d/a) = 0.12649 s', () => {
    expect(restToRestDurationS(2, 50, 500)).toBeCloseTo(0.12649, 5);
  });
  it('d = v²/a = 5 is the boundary: both forms give 0.200 s', () => {
    expect(restToRestDurationS(5, 50, 500)).toBeCloseTo(0.2, 9);
    expect(5 / 50 + 50 / 500).toBeCloseTo(2 * Math.sqrt(5 / 500), 12);
    expect(restToRestDurationS(5 - 1e-9, 50, 500)).toBeCloseTo(0.2, 7);
    expect(restToRestDurationS(5 + 1e-9, 50, 500)).toBeCloseTo(0.2, 7);
  });
  it('entry 10, exit 20 mm/s, d = 100 → 2.050 s', () => {
    expect(blockDurationS(100, 50, 500, 10, 20)).toBeCloseTo(2.05, 9);
  });
  it('entry 10, exit 20 mm/s, d = 3: cruise not reached, v_peak 41.833 → 0.10733 s', () => {
    const vPeak = Math.sqrt(500 * 3 + (10 * 10 + 20 * 20) / 2);
    expect(vPeak).toBeCloseTo(41.833, 3);
    expect(blockDurationS(3, 50, 500, 10, 20)).toBeCloseTo(0.10733, 5);
  });
  it('a pure ramp (a·d = |v0² − v1²|/2) takes 2d/(v0 + v1)', () => {
    // 0 → 50 mm/s over v²/(2a) = 2.5 mm: 0.1 s
    expect(blockDurationS(2.5, 50, 500, 0, 50)).toBeCloseTo(0.1, 9);
  });
});

describe('the estimator reproduces them on single moves', () => {
  const p = testProfile(); // a = 500 on every axis, feeds far above F
  it.each([
    [100, 2.1],
    [2, 2 * Math.sqrt(2 / 500)],
    [5, 0.2],
  ])('G1 X%d at F3000 (50 mm/s) from rest to rest', (d, t) => {
    const m = new Moves().feed(d, 0, 0, 3000).build();
    expect(estimate(m, p).totalSeconds).toBeCloseTo(t, 9);
  });
  it('a rapid runs at the rapid limit of its axis', () => {
    // rapid X 6000 mm/min = 100 mm/s, a = 500: d = 300 → 3 + 0.2 s
    const m = new Moves().rapid(300, 0, 0).build();
    expect(estimate(m, testProfile({ rapidMmPerMin: { x: 6000, y: 60000, z: 60000 } })).totalSeconds).toBeCloseTo(3.2, 9);
  });
});
