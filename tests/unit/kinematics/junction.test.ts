// Cornering by junction deviation: S. Jeon, "Improving Grbl: Cornering Algorithm", 2011 (the
// math): v = √(a·δ·sin(θ/2)/(1 − sin(θ/2))). Check values computed in REFERENCES.md
// (a = 500 mm/s², δ = 0.01 mm); 135° computed here from the same formula.
import { describe, expect, it } from 'vitest';
import { blockDurationS, estimate, junctionSpeed, junctionSpeedForAngle, limitAlong, restToRestDurationS } from '@/lib/kinematics';
import { Moves, testProfile } from './support/moves';

const deg = Math.PI / 180;

describe('junction-deviation formula (Jeon 2011; values computed)', () => {
  it.each([
    [90, 3.4743],
    [120, 5.6851],
    [135, 7.7901], // computed: sin 67.5° = 0.923880, R = 0.121371 mm, √(500·R)
    [150, 11.905],
    [170, 36.179],
  ])('θ = %d° → %f mm/s', (theta, v) => {
    expect(junctionSpeedForAngle(theta * deg, 500, 0.01)).toBeCloseTo(v, 3);
  });

  it('straight on keeps speed, a reversal stops', () => {
    expect(junctionSpeed(1, 0, 0, 1, 0, 0, 500, 500, 500, 0.01)).toBe(Infinity);
    expect(junctionSpeed(1, 0, 0, -1, 0, 0, 500, 500, 500, 0.01)).toBe(0);
  });

  it('uses the acceleration limit along u_out − u_in, projected per axis', () => {
    // 90° corner X then Y: u_out − u_in is (−1, 1)/√2, so a = 500/(1/√2)
    const v = junctionSpeed(1, 0, 0, 0, 1, 0, 500, 500, 500, 0.01);
    expect(v).toBeCloseTo(junctionSpeedForAngle(90 * deg, 500 * Math.SQRT2, 0.01), 9);
  });
});

describe('the planner runs the corner at that speed', () => {
  // Entry (cos θ/2, sin θ/2), exit (−cos θ/2, sin θ/2): the angle between reversed entry and
  // exit is θ and u_out − u_in lies along −X, so the junction acceleration is accel_x = 500.
  it.each([90, 135, 170])('θ = %d°: two blocks = two trapezoids joined at the junction speed', (theta) => {
    const c = Math.cos((theta / 2) * deg);
    const s = Math.sin((theta / 2) * deg);
    const L = 100;
    const m = new Moves().feed(L * c, L * s, 0, 6000).feed(0, 2 * L * s, 0, 6000).build();
    const vj = junctionSpeedForAngle(theta * deg, 500, 0.01);
    const v = 100; // F6000; axis feeds are higher
    const a = limitAlong(c, s, 0, 500, 500, 500);
    const expected = blockDurationS(L, v, a, 0, vj) + blockDurationS(L, v, a, vj, 0);
    expect(estimate(m, testProfile()).totalSeconds).toBeCloseTo(expected, 9);
  });

  it('the junction speed is capped by the blocks’ own limits', () => {
    // 170° would allow 36.18 mm/s; F = 1200 (20 mm/s) caps the corner, so it runs like a
    // straight line at 20 mm/s except for the geometry
    const c = Math.cos(85 * deg);
    const s = Math.sin(85 * deg);
    const m = new Moves().feed(100 * c, 100 * s, 0, 1200).feed(0, 200 * s, 0, 1200).build();
    const a = limitAlong(c, s, 0, 500, 500, 500);
    const expected = blockDurationS(100, 20, a, 0, 20) + blockDurationS(100, 20, a, 20, 0);
    expect(estimate(m, testProfile()).totalSeconds).toBeCloseTo(expected, 9);
  });

  it('a reversal stops; a straight continuation does not', () => {
    const rev = new Moves().feed(100, 0, 0, 3000).feed(0, 0, 0, 3000).build();
    expect(estimate(rev, testProfile()).totalSeconds).toBeCloseTo(2 * restToRestDurationS(100, 50, 500), 9);
    const straight = new Moves().feed(50, 0, 0, 3000).feed(100, 0, 0, 3000).build();
    expect(estimate(straight, testProfile()).totalSeconds).toBeCloseTo(restToRestDurationS(100, 50, 500), 9);
  });
});

describe('exact stop (G61; NISTIR 6556 §3.5.14 path control mode, section number from memory): every move ends at rest', () => {
  it('a square is the sum of four rest-to-rest trapezoids', () => {
    const m = new Moves().exactStop(true).feed(100, 0, 0, 3000).feed(100, 100, 0, 3000).feed(0, 100, 0, 3000).feed(0, 0, 0, 3000).build();
    expect(estimate(m, testProfile()).totalSeconds).toBeCloseTo(4 * restToRestDurationS(100, 50, 500), 9);
  });
  it('a hexagon, collinear joints included, is the sum of its sides’ trapezoids', () => {
    const b = new Moves().exactStop(true);
    let expected = 0;
    let x = 0;
    let y = 0;
    for (let k = 0; k < 6; k++) {
      const ang = (k * 60 * Math.PI) / 180;
      x += 40 * Math.cos(ang);
      y += 40 * Math.sin(ang);
      b.feed(x, y, 0, 3000);
      // a = 500/max(|cos|, |sin|) along each side; the speed limit is F (50 mm/s)
      expected += restToRestDurationS(40, 50, limitAlong(Math.cos(ang), Math.sin(ang), 0, 500, 500, 500));
    }
    b.feed(x + 10, y, 0, 3000); // collinear with nothing; stops anyway
    expected += restToRestDurationS(10, 50, 500);
    expect(estimate(b.build(), testProfile()).totalSeconds).toBeCloseTo(expected, 9);
  });
  it('without G61 the same square is faster (it corners)', () => {
    const sq = (g61: boolean) => new Moves().exactStop(g61).feed(100, 0, 0, 3000).feed(100, 100, 0, 3000).feed(0, 100, 0, 3000).feed(0, 0, 0, 3000).build();
    expect(estimate(sq(false), testProfile()).totalSeconds).toBeLessThan(estimate(sq(true), testProfile()).totalSeconds);
  });
});
