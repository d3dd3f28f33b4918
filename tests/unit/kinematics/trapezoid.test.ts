// Trapezoidal profiles: closed forms of L. Biagiotti, C. Melchiorri, Trajectory Planning for
// Automatic Machines and Robots, Springer 2008, §3.2.2 (from memory); check values computed in
// docs/references.md (v = 50 mm/s, a = 500 mm/s²). Every expected value is a literal worked
// out from the formula in its comment, so the helper and the planner are each checked against
// the closed form, not against each other.
import { describe, expect, it } from 'vitest';
import { blockDurationS, estimate, restToRestDurationS } from '@/lib/kinematics';
import { Moves, testProfile } from './support/moves';

describe('closed forms (Biagiotti & Melchiorri §3.2.2, from memory; values computed)', () => {
  it('rest to rest with cruise: d = 100 → d/v + v/a = 2 + 0.1 = 2.100 s', () => {
    expect(restToRestDurationS(100, 50, 500)).toBeCloseTo(2.1, 9);
  });
  it('rest to rest, triangle: d = 2 < v²/a = 5 → 2√(d/a) = 2√0.004 = 0.126491 s', () => {
    expect(restToRestDurationS(2, 50, 500)).toBeCloseTo(0.126491, 6);
  });
  it('d = v²/a = 5 is the boundary: 5/50 + 50/500 = 2√(5/500) = 0.200 s, and no jump either side of it', () => {
    expect(restToRestDurationS(5, 50, 500)).toBeCloseTo(0.2, 9);
    expect(restToRestDurationS(5 - 1e-9, 50, 500)).toBeCloseTo(0.2, 7);
    expect(restToRestDurationS(5 + 1e-9, 50, 500)).toBeCloseTo(0.2, 7);
  });
  it('entry 10, exit 20 mm/s, d = 100 → 2 + 0.05·0.64 + 0.05·0.36 = 2.050 s', () => {
    expect(blockDurationS(100, 50, 500, 10, 20)).toBeCloseTo(2.05, 9);
  });
  it('entry 10, exit 20 mm/s, d = 3: cruise not reached, v_peak = √(1500 + 250) = 41.833 → (2·41.833 − 30)/500 = 0.10733 s', () => {
    expect(blockDurationS(3, 50, 500, 10, 20)).toBeCloseTo(0.10733, 5);
  });
  it('a pure ramp (a·d = |v0² − v1²|/2): 0 → 50 mm/s over v²/(2a) = 2.5 mm takes 2d/(v0 + v1) = 0.1 s', () => {
    expect(blockDurationS(2.5, 50, 500, 0, 50)).toBeCloseTo(0.1, 9);
  });
  it('entry and exit at the cruise speed: d/v exactly (2 s for 100 mm at 50 mm/s)', () => {
    expect(blockDurationS(100, 50, 500, 50, 50)).toBeCloseTo(2, 12);
  });
});

describe('the estimator reproduces them on single moves', () => {
  const p = testProfile(); // a = 500 on every axis, feeds far above F
  it.each([
    [100, 2.1], // d/v + v/a = 2 + 0.1
    [2, 0.126491], // 2√(d/a), d < v²/a = 5
    [5, 0.2], // the boundary
  ])('G1 X%d at F3000 (50 mm/s) from rest to rest → %f s', (d, t) => {
    const m = new Moves().feed(d, 0, 0, 3000).build();
    expect(estimate(m, p).totalSeconds).toBeCloseTo(t, 6);
  });
  it('a rapid runs at the rapid limit of its axis: X 6000 mm/min = 100 mm/s, d = 300 → 3 + 0.2 s', () => {
    const m = new Moves().rapid(300, 0, 0).build();
    expect(estimate(m, testProfile({ rapidMmPerMin: { x: 6000, y: 60000, z: 60000 } })).totalSeconds).toBeCloseTo(3.2, 9);
  });
});
