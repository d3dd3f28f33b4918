// Arcs flattened to chords within the arc tolerance; speed on an arc capped by the
// centripetal limit √(a·r). Chord count n = ⌈θ / (2·acos(1 − e/r))⌉ and the check values are
// computed in docs/references.md (circle geometry: sagitta h = r(1 − cos(φ/2))).
import { describe, expect, it } from 'vitest';
import { chordCount, estimate } from '@/lib/kinematics';
import { trapezoidS } from './support/closed-forms';
import { Moves, testProfile } from './support/moves';

describe('chord count (docs/references.md, computed)', () => {
  it('r = 10, e = 0.01, full circle → 71', () => expect(chordCount(10, 2 * Math.PI, 0.01)).toBe(71));
  it('r = 50, e = 0.01, 90° → 40', () => expect(chordCount(50, Math.PI / 2, 0.01)).toBe(40));
  it('every chord keeps its sagitta within the tolerance', () => {
    for (const [r, e, sweep] of [[3, 0.002, 1], [250, 0.005, 6], [0.5, 0.01, 3]]) {
      const n = chordCount(r, sweep, e);
      expect(r * (1 - Math.cos(sweep / (2 * n)))).toBeLessThanOrEqual(e * (1 + 1e-9));
      expect(r * (1 - Math.cos(sweep / (2 * (n - 1))))).toBeGreaterThan(e); // and no fewer chords do
    }
  });
});

describe('circles', () => {
  it('a full circle limited by F: 352 chords, arc length / F plus the start and stop ramps = 31.435926 s', () => {
    // r = 50 mm, e = 0.002: n = ⌈2π / (2·acos(1 − 0.002/50))⌉ = 352 chords. F600 = 10 mm/s,
    // a = 500: ramps of v²/(2a) = 0.1 mm fit in the first and last chord, whose directions are
    // within π/352 of ±Y (a along them 500/cos(π/352)); the centripetal limit √(500·50) =
    // 158 mm/s and the corner speeds lie far above F. Chords are timed at the arc's length (F
    // is along the path, NISTIR 6556 §2.1.2.5): 2π·50/10 + 10·cos(π/352)/500 = 31.435926 s.
    const p = testProfile({ chordToleranceMm: 0.002 });
    const m = new Moves({ x: 50, y: 0, z: 0 }).arcXY(0, 0, 2 * Math.PI, 600).build();
    const e = estimate(m, p);
    expect(e.totalSeconds).toBeCloseTo(31.435926, 6);
    expect(e.distanceMm.feed).toBeCloseTo(314.159265, 6);
    expect(e.blocks).toBe(352);
  });

  it('a full circle limited by √(a·r): r = 5, a = 500 → 50 mm/s although F asks 100', () => {
    const p = testProfile({ chordToleranceMm: 0.002 });
    const m = new Moves({ x: 5, y: 0, z: 0 }).arcXY(0, 0, 2 * Math.PI, 6000).build();
    const L = 2 * Math.PI * 5;
    const e = estimate(m, p);
    const arcS = e.totalSeconds;
    // cruise at √(a·r) = 50 mm/s; ramps at an acceleration between 500 and 500·√2 along the chords
    expect(arcS).toBeGreaterThanOrEqual(L / 50 + 50 / (500 * Math.SQRT2) - 1e-9);
    expect(arcS).toBeLessThanOrEqual(L / 50 + 50 / 500 + 1e-9);
    expect(arcS).toBeGreaterThan(L / 100 + 100 / 500); // well above what F alone would give
  });

  it('with a tiny corner tolerance the corners between chords bind: √(a_w·R) per corner (inscribed circle, a = v²/R)', () => {
    // r = 50, e = 0.002: 352 chords of d = 100π/352 mm, corner angle θ = π − φ, s = sin(θ/2) =
    // cos(π/352); δ = 1e-5 → R = δ·s/(1 − s) ≈ 0.25 mm ≪ r, so the corners, not √(a·r) = 158
    // mm/s, decide. Each chord runs corner to corner: a trapezoid from v_j to v_j; a_w (radial)
    // and the chord's own acceleration lie in 500..500·√2 (closed forms written out in
    // support/closed-forms.ts, not the planner's helpers)
    const p = testProfile({ chordToleranceMm: 0.002, cornerToleranceMm: 1e-5 });
    const m = new Moves({ x: 50, y: 0, z: 0 }).arcXY(0, 0, 2 * Math.PI, 6000).build();
    const n = 352;
    const s = Math.cos(Math.PI / n);
    const R = (1e-5 * s) / (1 - s);
    const d = (2 * Math.PI * 50) / n;
    const e = estimate(m, p);
    const lo = n * trapezoidS(d, 100, 500 * Math.SQRT2, Math.sqrt(500 * Math.SQRT2 * R), Math.sqrt(500 * Math.SQRT2 * R));
    const hi = n * trapezoidS(d, 100, 500, Math.sqrt(500 * R), Math.sqrt(500 * R));
    expect(e.totalSeconds).toBeGreaterThan(lo);
    expect(e.totalSeconds).toBeLessThan(hi + 0.2); // + start and stop ramps
    expect(e.totalSeconds).toBeGreaterThan(estimate(m, testProfile({ chordToleranceMm: 0.002 })).totalSeconds * 2);
  });

  it('a helix is timed along its path: r = 10, 90°, rise 5 → 16.484542 mm, 1.667506 s at F600 (NISTIR 6556 §2.1.2.6; computed)', () => {
    // length √((10·π/2)² + 5²) = 16.484542 mm; 1.648454 s at 10 mm/s without ramps. e = 0.003:
    // 33 chords; the first and last run mostly along Y and X: |u| = 0.952612 on that axis, so a
    // along them is 500/0.952617 = 524.872 mm/s², and the ramps add 2·v/(2a) = 0.019052 s
    const m = new Moves({ x: 10, y: 0, z: 0 }).arcXY(0, 0, Math.PI / 2, 600, 5).build();
    const e = estimate(m, testProfile());
    expect(e.distanceMm.feed).toBeCloseTo(16.484542, 6);
    expect(e.blocks).toBe(33);
    expect(e.totalSeconds).toBeCloseTo(1.667506, 6);
  });

  it('a clockwise arc (negative sweep) ends where the move list says and times like its mirror: π + 20·cos(π/182)/500 s', () => {
    // r = 20, half circle at F1200 (20 mm/s), e = 0.003: 91 chords; from rest (the dwell stops
    // the rapid) to rest, the ramps run along chords within π/182 of ±Y
    const arc = (sweep: number) => estimate(new Moves().rapid(20, 0, 0).dwell(0).arcXY(0, 0, sweep, 1200).build(), testProfile());
    const ccw = arc(Math.PI);
    const cw = arc(-Math.PI);
    const arcS = 3.181587; // π + 0.04·cos(π/182)
    expect(ccw.cumulativeS[2] - ccw.cumulativeS[1]).toBeCloseTo(arcS, 6);
    expect(cw.cumulativeS[2] - cw.cumulativeS[1]).toBeCloseTo(arcS, 6);
    expect(cw.distanceMm.feed).toBeCloseTo(62.831853, 6); // 20π
    // the 20 mm rapid before it: 20 < v²/a = 2000 mm, so 2√(20/500) = 0.4 s
    expect(cw.cumulativeS[0]).toBeCloseTo(0.4, 9);
  });
});
