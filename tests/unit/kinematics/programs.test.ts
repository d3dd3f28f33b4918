// Estimates of G-code text through the interpreter (lib/gcode): inch programs run at the same
// speed as their metric twins (1 in = 25.4 mm exactly, NIST SP 811 App. B), G2/G3 circles,
// G4 dwells in seconds (NISTIR 6556 §3.5.4), M6/M3 timed, G61 exact stop, G93 inverse time
// (§3.5.19). Expected times are literals from the trapezoid closed forms (Biagiotti &
// Melchiorri §3.2.2, from memory) and the corner model of docs/references.md §3.
import { describe, expect, it } from 'vitest';
import { interpret } from '@/lib/gcode';
import { estimate } from '@/lib/kinematics';
import { testProfile } from './support/moves';

const run = (text: string, over = {}) => estimate(interpret(text).moves, testProfile(over));

describe('G-code programs', () => {
  it('an inch program equals its metric twin', () => {
    const inch = run('G20 G90 G17\nG0 X1 Y1 Z0.2\nG1 Z-0.125 F30\nG1 X5 F120\nG3 X5 Y3 I0 J1\nG1 X1\nG0 Z1\nM30\n');
    const mm = run('G21 G90 G17\nG0 X25.4 Y25.4 Z5.08\nG1 Z-3.175 F762\nG1 X127 F3048\nG3 X127 Y76.2 I0 J25.4\nG1 X25.4\nG0 Z25.4\nM30\n');
    expect(inch.totalSeconds).toBeCloseTo(mm.totalSeconds, 4);
    expect(inch.distanceMm.feed).toBeCloseTo(mm.distanceMm.feed, 3);
    // Cutting: 101.6 mm along X, the half circle of r 25.4 mm (79.796 mm) and 101.6 mm back, at
    // 120 in/min = 50.8 mm/s, tangent at both joins (their corners bind far above F). It starts
    // at the 90° corner out of the plunge and ends at the 90° corner into the rapid up, both at
    // √(a_w·R) = 4.131715 mm/s (R = 0.01·sin 45°/(1 − sin 45°), a_w = 500·√2 along
    // u_out − u_in). Time: 2·2 + π/2 + 2·(v/2a)(1 − 4.131715/50.8)² with a = 500 = 5.656542 s
    expect(inch.breakdownSeconds.cutting).toBeCloseTo(5.656542, 5);
  });

  it('a single inch move: 10 in at F60 (25.4 mm/s) is the 254 mm trapezoid: 254/25.4 + 25.4/500 = 10.0508 s', () => {
    const e = run('G20\nG1 X10 F60\n');
    expect(e.totalSeconds).toBeCloseTo(10.0508, 9);
  });

  it('G93: G1 X100 F2 takes 1/F min = 30 s plus its ramps: 30 + v/a with v = 200/60 mm/s → 30.006667 s (NISTIR 6556 §3.5.19)', () => {
    const e = run('G21 G93\nG1 X100 F2\n');
    expect(e.totalSeconds).toBeCloseTo(30.006667, 6);
  });

  it('G93 on an arc: a half circle of r 10 at F2 takes 30 s plus its ramps along ±Y: 30 + (10π/30)·cos(π/130)/500 = 30.002094 s', () => {
    // 65 chords at e = 0.003 (chord count of docs/references.md); v = 10π mm / 30 s
    const e = run('G21 G17\nG93 G3 X20 Y0 R10 F2\n');
    expect(e.totalSeconds).toBeCloseTo(30.002094, 6);
  });

  it('a helix from G3 with I J and Z: r 10, 90°, rise 5 is timed along the helix (NISTIR 6556 §2.1.2.6): 1.648454 + 0.019052 s', () => {
    // after the dwell the arc starts from rest; the ramps of the first and last chord: see
    // kinematics/arcs.test.ts (33 chords, a = 524.872 along them)
    const e = run('G21 G17 G90\nG1 X10 F600\nG4 P0\nG3 X0 Y10 Z5 I-10 J0\n');
    expect(e.cumulativeS[2] - e.cumulativeS[1]).toBeCloseTo(1.667506, 6);
  });

  it('a full circle from G2 with I J is timed at 2πr / F plus its ramps', () => {
    // r = 40, F1200 = 20 mm/s, a = 500: ramps v/(2a) each on chords near ±Y (a ≈ 500)
    const e = run('G21 G17 G90\nG1 X40 Y0 F1200\nG4 P0\nG2 X40 Y0 I-40 J0\n');
    const arcS = e.cumulativeS[2] - e.cumulativeS[1];
    expect(arcS).toBeCloseTo((2 * Math.PI * 40) / 20 + 20 / 500, 3);
  });

  it('G18 and G19 arcs are walked in their planes (counter-clockwise seen from the normal, NISTIR 6556 §3.5.3)', () => {
    // G18 (ZX): from X10 Z0 about the origin, G3 to X0 Z-10 is a quarter turn, G2 three quarters
    const g3 = run('G21 G90\nG1 X10 F600\nG18 G3 X0 Z-10 I-10 K0\n');
    const g2 = run('G21 G90\nG1 X10 F600\nG18 G2 X0 Z-10 I-10 K0\n');
    expect(g3.distanceMm.feed - 10).toBeCloseTo((Math.PI / 2) * 10, 6);
    expect(g2.distanceMm.feed - 10).toBeCloseTo(((3 * Math.PI) / 2) * 10, 6);
    // G19 (YZ): from Y10 Z0 down to Y0 Z-10 about the origin: the first half of the quarter
    // arc runs steeper than 45° down (plunge), the second half shallower (cutting)
    const g19 = run('G21 G90\nG1 Y10 F600\nG19 G2 Y0 Z-10 J-10 K0\n');
    expect(g19.distanceMm.feed - 10).toBeCloseTo((Math.PI / 2) * 10, 6);
    expect(g19.breakdownSeconds.plunge).toBeGreaterThan(0.4 * ((Math.PI / 2) * 10) / 10);
    expect(g19.breakdownSeconds.cutting).toBeGreaterThan(0.4 * ((Math.PI / 2) * 10) / 10);
  });

  it('G4 P is seconds, M6 and M3 from stopped add their times', () => {
    const base = run('G21\nG1 X100 F3000\n');
    const e = run('G21\nM6 T2\nM3 S18000\nG1 X100 F3000\nG4 P1.25\nM5\n', { toolChangeSeconds: 20, spindleSpinUpSeconds: 4 });
    expect(e.totalSeconds - base.totalSeconds).toBeCloseTo(20 + 4 + 1.25, 6);
    expect(e.tools.find((t) => t.tool === 2)?.feedDistanceMm).toBeCloseTo(100, 6);
  });

  it('G61 stops at every corner of a square; G64 blends', () => {
    const sq = 'G1 X100 F3000\nY100\nX0\nY0\n';
    const g61 = run(`G21 G61\n${sq}`);
    const g64 = run(`G21 G64\n${sq}`);
    expect(g61.totalSeconds).toBeCloseTo(8.4, 6); // 4 × (100/50 + 50/500)
    expect(g64.totalSeconds).toBeLessThan(g61.totalSeconds);
  });

  it('M0 counts as a program stop with no time', () => {
    const a = run('G21\nG1 X50 F3000\nG1 X100\n');
    const b = run('G21\nG1 X50 F3000\nM0\nG1 X100\n');
    expect(b.programStops).toBe(1);
    expect(b.totalSeconds).toBeCloseTo(2.2, 6); // it stops, costing the ramps: 2 × (50/50 + 50/500)
    expect(b.totalSeconds).toBeGreaterThan(a.totalSeconds);
  });
});
