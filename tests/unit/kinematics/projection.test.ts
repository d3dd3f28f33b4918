// Per-axis projection of speed and acceleration limits on diagonal moves: an axis moving at
// |u_i| times the path speed limits the path to limit_i/|u_i| (vector decomposition of a
// straight-line move; the motion model).
import { describe, expect, it } from 'vitest';
import { estimate, limitAlong } from '@/lib/kinematics';
import { Moves, testProfile } from './support/moves';

describe('per-axis projection', () => {
  it('limitAlong takes the tightest moving axis', () => {
    const s = Math.SQRT1_2;
    expect(limitAlong(s, s, 0, 100, 200, 1)).toBeCloseTo(141.421356, 6); // 100/cos 45°; z does not move
    expect(limitAlong(0.6, 0.8, 0, 100, 100, 100)).toBeCloseTo(125, 9);
    expect(limitAlong(0, 0, -1, 100, 100, 30)).toBe(30);
  });

  it('45° XY move: speed limited by maxFeed_x/|u_x|, acceleration by accel_x/|u_x|', () => {
    // maxFeedMmPerMin x = y = 3000 mm/min (50 mm/s), accel 500: along 45° the path may run 50·√2
    // mm/s and accelerate at 500·√2 mm/s²; F is far above.
    const p = testProfile({ maxFeedMmPerMin: { x: 3000, y: 3000, z: 3000 } });
    // d = 200 mm ≥ v²/a = 7.07 mm: d/v + v/a = 200/70.7107 + 70.7107/707.107 = 2.828427 + 0.1
    const m = new Moves().feed(200 * Math.SQRT1_2, 200 * Math.SQRT1_2, 0, 20000).build();
    expect(estimate(m, p).totalSeconds).toBeCloseTo(2.928427, 6);
  });

  it('3-4-0 move with a slow Y axis: Y decides both limits', () => {
    // u = (0.6, 0.8, 0); Y: 1200 mm/min (20 mm/s) → 25 mm/s path; accel Y 200 → 250 path;
    // X limits (60000/60/0.6, 500/0.6) are looser. 50 mm: 50/25 + 25/250 = 2.1 s
    const p = testProfile({ maxFeedMmPerMin: { x: 60000, y: 1200, z: 60000 }, accelMmPerS2: { x: 500, y: 200, z: 500 } });
    const m = new Moves().feed(30, 40, 0, 60000).build();
    expect(estimate(m, p).totalSeconds).toBeCloseTo(2.1, 9);
  });

  it('F caps the path speed below the axis limits', () => {
    const p = testProfile();
    const m = new Moves().feed(60, 80, 0, 600).build(); // 10 mm/s; accel along u: 500/0.8 = 625
    expect(estimate(m, p).totalSeconds).toBeCloseTo(10.016, 9); // 100/10 + 10/625
  });

  it('a rapid with Z moving is held to Z’s rapid limit along its share', () => {
    // u = (0, 0.6, -0.8); rapid z 3000 mm/min = 50 mm/s → 62.5 mm/s path; a = 500/0.8 = 625:
    // 100/62.5 + 62.5/625 = 1.6 + 0.1 = 1.7 s
    const p = testProfile({ rapidMmPerMin: { x: 60000, y: 60000, z: 3000 } });
    const m = new Moves().rapid(0, 60, -80).build();
    expect(estimate(m, p).totalSeconds).toBeCloseTo(1.7, 9);
  });
});
