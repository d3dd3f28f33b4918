// Arcs flattened to chords within the arc tolerance; speed on an arc capped by the
// centripetal limit √(a·r). Chord count n = ⌈θ / (2·acos(1 − e/r))⌉ and the check values are
// computed in docs/references.md (circle geometry: sagitta h = r(1 − cos(φ/2))).
import { describe, expect, it } from 'vitest';
import { blockDurationS, chordCount, estimate, restToRestDurationS } from '@/lib/kinematics';
import { Moves, testProfile } from './support/moves';

const chordsLength = (r: number, sweep: number, n: number) => n * 2 * r * Math.sin(Math.abs(sweep) / (2 * n));

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
  it('a full circle limited by F: arc length / F plus the start and stop ramps', () => {
    // r = 50 mm, F600 = 10 mm/s, a = 500: ramps of 0.1 mm fit in the first and last chord,
    // whose directions are within φ/2 of ±Y (accel along them 500/cos(φ/2)); the centripetal
    // limit √(500·50) = 158 mm/s and the corner speeds lie far above F.
    // Chords are timed at the arc's length (F is along the path, NISTIR 6556 §2.1.2.5).
    const p = testProfile({ chordToleranceMm: 0.002 });
    const m = new Moves({ x: 50, y: 0, z: 0 }).arcXY(0, 0, 2 * Math.PI, 600).build();
    const n = chordCount(50, 2 * Math.PI, 0.002);
    const aEnd = 500 / Math.cos(Math.PI / (2 * n));
    const e = estimate(m, p);
    expect(e.totalSeconds).toBeCloseTo((2 * Math.PI * 50) / 10 + 10 / aEnd, 5);
    expect(e.distanceMm.feed).toBeCloseTo(2 * Math.PI * 50, 9);
    expect(e.blocks).toBe(n);
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
    // r = 50, e = 0.002: n chords, corner angle θ = π − φ, s = sin(θ/2) = cos(φ/2);
    // δ = 1e-5 → R = δ·s/(1 − s) ≈ 0.25 mm ≪ r, so the corners, not √(a·r) = 158 mm/s, decide.
    const p = testProfile({ chordToleranceMm: 0.002, cornerToleranceMm: 1e-5 });
    const m = new Moves({ x: 50, y: 0, z: 0 }).arcXY(0, 0, 2 * Math.PI, 6000).build();
    const n = chordCount(50, 2 * Math.PI, 0.002);
    const s = Math.cos(Math.PI / n);
    const R = (1e-5 * s) / (1 - s);
    const L = 2 * Math.PI * 50;
    const e = estimate(m, p);
    // each chord runs corner to corner: a trapezoid from v_j to v_j (Biagiotti & Melchiorri
    // §3.2.2, from memory); a_w (radial) and the chord's own acceleration lie in 500..500·√2
    const d = L / n;
    const lo = n * blockDurationS(d, 100, 500 * Math.SQRT2, Math.sqrt(500 * Math.SQRT2 * R), Math.sqrt(500 * Math.SQRT2 * R));
    const hi = n * blockDurationS(d, 100, 500, Math.sqrt(500 * R), Math.sqrt(500 * R));
    expect(e.totalSeconds).toBeGreaterThan(lo);
    expect(e.totalSeconds).toBeLessThan(hi + 0.2); // + start and stop ramps
    expect(e.totalSeconds).toBeGreaterThan(estimate(m, testProfile({ chordToleranceMm: 0.002 })).totalSeconds * 2);
  });

  it('a helix is timed along its path: r = 10, 90°, rise 5 → 16.4845 mm (NISTIR 6556 §2.1.2.5; computed)', () => {
    const m = new Moves({ x: 10, y: 0, z: 0 }).arcXY(0, 0, Math.PI / 2, 600, 5).build();
    const e = estimate(m, testProfile());
    expect(e.distanceMm.feed).toBeCloseTo(16.4845, 4);
    // 1.6485 s at F600 without ramps (computed); the ramps add v/a at 500..500·√2 mm/s²
    expect(e.totalSeconds).toBeGreaterThan(1.64845 + 10 / (500 * Math.SQRT2));
    expect(e.totalSeconds).toBeLessThan(1.64845 + 10 / 500 + 1e-6);
  });

  it('a clockwise arc (negative sweep) ends where the move list says and times like its mirror', () => {
    const ccw = estimate(new Moves().rapid(20, 0, 0).arcXY(0, 0, Math.PI, 1200).build(), testProfile());
    const cw = estimate(new Moves().rapid(20, 0, 0).arcXY(0, 0, -Math.PI, 1200).build(), testProfile());
    expect(cw.totalSeconds).toBeCloseTo(ccw.totalSeconds, 9);
    expect(cw.distanceMm.feed).toBeCloseTo(20 * Math.PI, 9);
    expect(chordsLength(20, Math.PI, chordCount(20, Math.PI, 0.002))).toBeLessThan(20 * Math.PI); // chords alone would be shorter
    expect(ccw.totalSeconds).toBeGreaterThan(restToRestDurationS(20, 100, 500)); // sanity: the rapid alone
  });
});
