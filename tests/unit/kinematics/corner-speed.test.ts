// Cornering by the corner tolerance δ: the corner is passed on the circle inscribed in the
// angle whose nearest point lies δ from the vertex (plane geometry: the vertex is R/sin(θ/2)
// from the centre, so R = δ·s/(1 − s), s = sin(θ/2)), at the speed of uniform circular motion
// a = v²/R (any physics textbook): v = √(a·δ·s/(1 − s)). Check values computed in docs/references.md
// (a = 500 mm/s², δ = 0.01 mm); 135° computed here from the same formula.
import { describe, expect, it } from 'vitest';
import { blockDurationS, estimate, cornerSpeedLimit, cornerSpeedForAngle, limitAlong, restToRestDurationS } from '@/lib/kinematics';
import { Moves, testProfile } from './support/moves';

const deg = Math.PI / 180;

describe('corner speed from the corner tolerance (inscribed circle and a = v²/R; values computed)', () => {
  it.each([
    [90, 3.4743],
    [120, 5.6851],
    [135, 7.7901], // computed: sin 67.5° = 0.923880, R = 0.121371 mm, √(500·R)
    [150, 11.905],
    [170, 36.179],
  ])('θ = %d° → %f mm/s', (theta, v) => {
    expect(cornerSpeedForAngle(theta * deg, 500, 0.01)).toBeCloseTo(v, 3);
  });

  it.each([30, 90, 120, 170])('θ = %d°: the radius v²/a is the circle tangent to both blocks passing δ inside the vertex', (theta) => {
    // plane geometry, worked independently of the formula: the blocks meet at the origin along
    // the rays at ±θ/2 about +X; a circle of radius R with its centre on +X at distance c is
    // tangent to both rays when the distance from the centre to a ray, c·sin(θ/2), equals R
    const delta = 0.01;
    const a = 500;
    const v = cornerSpeedForAngle(theta * deg, a, delta);
    const R = (v * v) / a; // uniform circular motion: a = v²/R
    const half = (theta / 2) * deg;
    const centre = R / Math.sin(half);
    // distance from the centre (centre, 0) to the line through the origin along (cos, sin)
    const toRay = Math.abs(centre * Math.sin(half));
    expect(toRay).toBeCloseTo(R, 12);
    // the circle's nearest point to the vertex lies on the bisector, centre − R from it
    expect(centre - R).toBeCloseTo(delta, 12);
  });

  it('straight on keeps speed, a reversal stops', () => {
    expect(cornerSpeedLimit(1, 0, 0, 1, 0, 0, 500, 500, 500, 0.01)).toBe(Infinity);
    expect(cornerSpeedLimit(1, 0, 0, -1, 0, 0, 500, 500, 500, 0.01)).toBe(0);
  });

  it('uses the acceleration limit along u_out − u_in, projected per axis', () => {
    // 90° corner X then Y: u_out − u_in is (−1, 1)/√2, so a = 500/(1/√2)
    const v = cornerSpeedLimit(1, 0, 0, 0, 1, 0, 500, 500, 500, 0.01);
    expect(v).toBeCloseTo(cornerSpeedForAngle(90 * deg, 500 * Math.SQRT2, 0.01), 9);
  });
});

describe('the planner runs the corner at that speed', () => {
  // Entry (cos θ/2, sin θ/2), exit (−cos θ/2, sin θ/2): the angle between reversed entry and
  // exit is θ and u_out − u_in lies along −X, so the acceleration that turns the velocity is accel_x = 500.
  it.each([90, 135, 170])('θ = %d°: two blocks = two trapezoids joined at the corner speed', (theta) => {
    const c = Math.cos((theta / 2) * deg);
    const s = Math.sin((theta / 2) * deg);
    const L = 100;
    const m = new Moves().feed(L * c, L * s, 0, 6000).feed(0, 2 * L * s, 0, 6000).build();
    const vj = cornerSpeedForAngle(theta * deg, 500, 0.01);
    const v = 100; // F6000; axis feeds are higher
    const a = limitAlong(c, s, 0, 500, 500, 500);
    const expected = blockDurationS(L, v, a, 0, vj) + blockDurationS(L, v, a, vj, 0);
    expect(estimate(m, testProfile()).totalSeconds).toBeCloseTo(expected, 9);
  });

  it('the corner speed is capped by the blocks’ own limits', () => {
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
