// Cornering by the corner tolerance δ: the corner is passed on the circle inscribed in the
// angle whose nearest point lies δ from the vertex (plane geometry: the vertex is R/sin(θ/2)
// from the centre, so R = δ·s/(1 − s), s = sin(θ/2)), at the speed of uniform circular motion
// a = v²/R (any physics textbook): v = √(a·δ·s/(1 − s)). Check values computed in docs/references.md
// (a = 500 mm/s², δ = 0.01 mm); 135° computed here from the same formula.
import { describe, expect, it } from 'vitest';
import { estimate, cornerSpeedLimit, cornerSpeedForAngle } from '@/lib/kinematics';
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
    // 90° corner X then Y: u_out − u_in is (−1, 1)/√2, so a = 500/(1/√2) = 707.107 and
    // v = √(707.107 · 0.01 · s/(1 − s)), s = sin 45° → 4.13171 mm/s (computed)
    expect(cornerSpeedLimit(1, 0, 0, 0, 1, 0, 500, 500, 500, 0.01)).toBeCloseTo(4.13171, 5);
    // a slow Y axis (100 mm/s²) limits the same corner: a = 100·√2 → 1.84776 mm/s (computed)
    expect(cornerSpeedLimit(1, 0, 0, 0, 1, 0, 500, 100, 500, 0.01)).toBeCloseTo(1.84776, 5);
  });
});

describe('the planner runs the corner at that speed', () => {
  // Entry (cos θ/2, sin θ/2), exit (−cos θ/2, sin θ/2): the angle between reversed entry and
  // exit is θ and u_out − u_in lies along −X, so the acceleration that turns the velocity is
  // accel_x = 500 and the corner speed v_j is the table's value. Each block of 100 mm at
  // F6000 (100 mm/s) accelerates at 500/max(cos θ/2, sin θ/2) and is a trapezoid from rest to
  // v_j and back: T = 2·[d/v + (v/2a) + (v/2a)(1 − v_j/v)²] (Biagiotti & Melchiorri §3.2.2).
  it.each([
    [90, 2.273186], // a = 707.107, v_j = 3.47434
    [135, 2.341885], // a = 541.196, v_j = 7.79008
    [170, 2.28039], // a = 501.910, v_j = 36.1795
  ])('θ = %d°: two blocks = two trapezoids joined at the corner speed → %f s', (theta, t) => {
    const c = Math.cos((theta / 2) * deg);
    const s = Math.sin((theta / 2) * deg);
    const L = 100;
    const m = new Moves().feed(L * c, L * s, 0, 6000).feed(0, 2 * L * s, 0, 6000).build();
    expect(estimate(m, testProfile()).totalSeconds).toBeCloseTo(t, 6);
  });

  it('the corner speed is capped by the blocks’ own limits: 170° allows 36.18 mm/s, F1200 (20 mm/s) caps it', () => {
    // so it runs like a straight line at 20 mm/s: 2·(100/20) + 20/(2a)·2 with a = 500/sin 85°
    // = 501.910: 10 + 20/501.910 = 10.039848 s
    const c = Math.cos(85 * deg);
    const s = Math.sin(85 * deg);
    const m = new Moves().feed(100 * c, 100 * s, 0, 1200).feed(0, 200 * s, 0, 1200).build();
    expect(estimate(m, testProfile()).totalSeconds).toBeCloseTo(10.039848, 6);
  });

  it('a reversal stops (2 × 2.1 s); a straight continuation does not (one 100 mm trapezoid, 2.1 s)', () => {
    const rev = new Moves().feed(100, 0, 0, 3000).feed(0, 0, 0, 3000).build();
    expect(estimate(rev, testProfile()).totalSeconds).toBeCloseTo(4.2, 9);
    const straight = new Moves().feed(50, 0, 0, 3000).feed(100, 0, 0, 3000).build();
    expect(estimate(straight, testProfile()).totalSeconds).toBeCloseTo(2.1, 9);
  });
});

describe('exact stop (G61; NISTIR 6556 §3.5.14 path control mode, section number from memory): every move ends at rest', () => {
  it('a square is the sum of four rest-to-rest trapezoids: 4 × (100/50 + 50/500) = 8.4 s', () => {
    const m = new Moves().exactStop(true).feed(100, 0, 0, 3000).feed(100, 100, 0, 3000).feed(0, 100, 0, 3000).feed(0, 0, 0, 3000).build();
    expect(estimate(m, testProfile()).totalSeconds).toBeCloseTo(8.4, 9);
  });
  it('a hexagon of 40 mm sides, collinear joint included, is the sum of its sides’ trapezoids: 5.646410 s', () => {
    // sides at 0°, 60°, … 300°: a = 500/max(|cos|, |sin|), 500 at 0° and 180°, 577.350 at the
    // other four; each side d/v + v/a = 0.8 + 0.1 or 0.8 + 0.0866025; then 10 mm more along X
    // (0.2 + 0.1): 2·0.9 + 4·0.8866025 + 0.3 = 5.646410 s
    const b = new Moves().exactStop(true);
    let x = 0;
    let y = 0;
    for (let k = 0; k < 6; k++) {
      const ang = (k * 60 * Math.PI) / 180;
      x += 40 * Math.cos(ang);
      y += 40 * Math.sin(ang);
      b.feed(x, y, 0, 3000);
    }
    b.feed(x + 10, y, 0, 3000); // collinear with the last side; stops anyway
    expect(estimate(b.build(), testProfile()).totalSeconds).toBeCloseTo(5.64641, 5);
  });
  it('without G61 the same square is faster (it corners)', () => {
    const sq = (g61: boolean) => new Moves().exactStop(g61).feed(100, 0, 0, 3000).feed(100, 100, 0, 3000).feed(0, 100, 0, 3000).feed(0, 0, 0, 3000).build();
    expect(estimate(sq(false), testProfile()).totalSeconds).toBeLessThan(estimate(sq(true), testProfile()).totalSeconds);
  });
});
