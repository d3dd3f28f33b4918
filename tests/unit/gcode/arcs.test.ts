// Arc rules of NISTIR 6556 §3.5.3 and arc geometry against closed forms and against
// @flatten-js/core as an independent reference.
import Flatten from '@flatten-js/core';
import { describe, expect, it } from 'vitest';
import { arcChordCount, arcIndexOfMove, arcLength, flattenArc, MoveKind } from '@/lib/gcode';
import { codes, errors, run, totals } from './helpers';

describe('centre format (NISTIR 6556 §3.5.3.2)', () => {
  it('example: from (7,7), G17 G2 X10 Y16 I3 J4 Z9 has centre (10,11) and radius 5', () => {
    const r = run('G21 G90 F100\nG0 X7 Y7 Z9\nG17 G2 X10 Y16 I3 J4 Z9\nM2');
    const a = r.moves.arcs;
    expect(a.count).toBe(1);
    expect(a.cx[0]).toBeCloseTo(10, 12);
    expect(a.cy[0]).toBeCloseTo(11, 12);
    expect(a.radius[0]).toBeCloseTo(5, 12);
    expect(a.sweep[0]).toBeLessThan(0); // G2 is clockwise
    expect(errors(r)).toEqual([]);
  });

  it('I J are offsets from the current point in G91 as in G90 (§3.5.3.2)', () => {
    const r = run('G21 G91 F100\nG0 X7 Y7\nG2 X3 Y9 I3 J4\nM2');
    expect(r.moves.arcs.cx[0]).toBeCloseTo(10, 12);
    expect(r.moves.arcs.cy[0]).toBeCloseTo(11, 12);
  });

  // radius 5 about (0,0) from (5,0); the end is moved out along its radius by the difference
  const endAt = (rEnd: number) => `X${(rEnd * Math.cos(1)).toFixed(7)} Y${(rEnd * Math.sin(1)).toFixed(7)}`;
  it('mm: 0.0019 mm radius difference accepted, 0.0021 mm rejected (§3.5.3.2)', () => {
    const ok = run(`G21 F100\nG0 X5 Y0\nG3 ${endAt(5.0019)} I-5 J0\nM2`);
    expect(errors(ok)).toEqual([]);
    expect(ok.moves.arcs.count).toBe(1);
    const bad = run(`G21 F100\nG0 X5 Y0\nG3 ${endAt(5.0021)} I-5 J0\nM2`);
    expect(errors(bad)).toEqual(['arc-radius-mismatch']);
    expect(bad.moves.arcs.count).toBe(0);
    expect(bad.diagnostics[0].text).toContain('G3');
  });

  it('inch: 0.00019 in accepted, 0.00021 in rejected (§3.5.3.2)', () => {
    const ok = run(`G20 F10\nG0 X5 Y0\nG3 ${endAt(5.00019)} I-5 J0\nM2`);
    expect(errors(ok)).toEqual([]);
    const bad = run(`G20 F10\nG0 X5 Y0\nG3 ${endAt(5.00021)} I-5 J0\nM2`);
    expect(errors(bad)).toEqual(['arc-radius-mismatch']);
  });

  it('end equal to start is a full circle (§3.5.3.2): length 2πr', () => {
    const r = run('G21 F100\nG0 X10 Y0\nG3 X10 Y0 I-10 J0\nM2');
    expect(Math.abs(r.moves.arcs.sweep[0])).toBeCloseTo(2 * Math.PI, 12);
    expect(totals(r).arc).toBeCloseTo(2 * Math.PI * 10, 9);
  });

  it('G90.1 (an extension) makes I J K absolute; G91.1 restores offsets', () => {
    const r = run('G21 F100\nG0 X20 Y0\nG90.1 G2 X0 Y0 I10 J0\nG91.1 G2 X20 Y0 I10 J0\nM2');
    expect(errors(r)).toEqual([]);
    expect([r.moves.arcs.cx[0], r.moves.arcs.cx[1]]).toEqual([10, 10]);
  });

  it('R together with I/J/K is an error (§3.5.3)', () => {
    expect(errors(run('G21 F100\nG2 X10 Y0 R5 I5\nM2'))).toEqual(['arc-mixed-formats']);
  });

  it('G2/G3 with no axis word is an error (§3.5.3)', () => {
    expect(errors(run('G21 F100\nG0 X5\nG2 I-5\nM2'))).toEqual(['arc-no-axis-word']);
  });

  it('an arc without F is an error, reported with the line text (§3.5.19: feed required)', () => {
    const r = run('G21\nG0 X5\nG2 X-5 I-5\nM2');
    expect(errors(r)).toEqual(['feed-missing']);
    expect(r.diagnostics[0].text).toBe('G2 X-5 I-5');
    expect(r.diagnostics[0].line).toBe(3);
  });
});

describe('radius format (NISTIR 6556 §3.5.3.1)', () => {
  it('the same end point with R+ gives the short arc and R− the long one', () => {
    const short = run('G21 F100\nG0 X0 Y0\nG2 X10 Y0 R10\nM2');
    const long = run('G21 F100\nG0 X0 Y0\nG2 X10 Y0 R-10\nM2');
    const s = Math.abs(short.moves.arcs.sweep[0]);
    const l = Math.abs(long.moves.arcs.sweep[0]);
    // chord 10 on radius 10: θ = 2·asin(1/2) = 60° and 300° (computed)
    expect(s).toBeCloseTo(Math.PI / 3, 12);
    expect(l).toBeCloseTo((5 * Math.PI) / 3, 12);
    expect(totals(short).arc).toBeCloseTo((10 * Math.PI) / 3, 9);
    // G2 turns clockwise: the short arc from (0,0) to (10,0) bulges upward, centre below
    expect(short.moves.arcs.cy[0]).toBeLessThan(0);
    expect(long.moves.arcs.cy[0]).toBeGreaterThan(0);
  });

  it('semicircle with R: length πr (closed form)', () => {
    const r = run('G21 F100\nG0 X0 Y0\nG3 X20 Y0 R10\nM2');
    expect(r.moves.arcs.cx[0]).toBeCloseTo(10, 9);
    expect(totals(r).arc).toBeCloseTo(Math.PI * 10, 9);
  });

  it('end equal to start is an error; both in-plane end words missing is an error', () => {
    expect(errors(run('G21 F100\nG0 X5 Y5\nG2 X5 Y5 R3\nM2'))).toEqual(['arc-radius-end-equals-start']);
    expect(errors(run('G21 F100\nG0 X5 Y5\nG2 Z-1 R3\nM2'))).toEqual(['arc-radius-no-end']);
  });

  it('R shorter than half the chord is an error', () => {
    expect(errors(run('G21 F100\nG2 X10 Y0 R4\nM2'))).toEqual(['arc-radius-too-small']);
  });
});

describe('helix and planes', () => {
  it('helix length √((2πr)² + h²) for a full turn (closed form, NISTIR 6556 §2.1.2.5)', () => {
    const r = run('G21 F600\nG0 X10 Y0 Z0\nG3 X10 Y0 Z-6 I-10 J0\nM2');
    expect(totals(r).arc).toBeCloseTo(Math.hypot(2 * Math.PI * 10, 6), 9);
  });

  it('check value (docs/references.md): r = 10, 90°, rise 5 → 16.4845 mm, 1.6485 s at F600 (computed)', () => {
    const r = run('G21 F600\nG0 X10 Y0 Z0\nG3 X0 Y10 Z5 I-10 J0\nM2');
    const len = totals(r).arc;
    expect(len).toBeCloseTo(16.4845, 4);
    expect((len / r.moves.feed[1]) * 60).toBeCloseTo(1.6485, 4);
  });

  it('G18 (ZX) and G19 (YZ): G2 is clockwise seen from +Y / +X, and the normal axis rises', () => {
    // G18: in-plane axes (Z, X), Z × X = +Y: turning from +Z toward +X is counter-clockwise
    // seen from +Y, so G2 from (Z10, X0) to (Z0, X10) about the origin goes the long way
    const g18 = run('G21 F100\nG0 X0 Y0 Z10\nG18 G2 X10 Z0 I0 K-10\nM2');
    expect(errors(g18)).toEqual([]);
    expect(g18.moves.arcs.sweep[0]).toBeCloseTo((-3 * Math.PI) / 2, 12);
    const g18ccw = run('G21 F100\nG0 X0 Y0 Z10\nG18 G3 X10 Z0 I0 K-10\nM2');
    expect(g18ccw.moves.arcs.sweep[0]).toBeCloseTo(Math.PI / 2, 12);
    expect(g18.moves.arcs.plane[0]).toBe(1);
    const g19 = run('G21 F100\nG0 X0 Y10 Z0\nG19 G3 Y0 Z10 X4 J-10 K0\nM2');
    expect(g19.moves.arcs.sweep[0]).toBeCloseTo(Math.PI / 2, 12);
    expect(totals(g19).arc).toBeCloseTo(Math.hypot((Math.PI / 2) * 10, 4), 9);
  });
});

describe('flattening and chord counts (docs/references.md, Motion: n = ⌈θ / (2·acos(1 − e/r))⌉)', () => {
  it('check values: r = 10, e = 0.01, full circle → 71; r = 50, e = 0.01, 90° → 40 (computed)', () => {
    expect(arcChordCount(10, 2 * Math.PI, 0.01)).toBe(71);
    expect(arcChordCount(50, Math.PI / 2, 0.01)).toBe(40);
  });

  it('every chord sagitta is within the tolerance and the chain ends at the arc end', () => {
    const r = run('G21 F100\nG0 X30 Y0 Z0\nG3 X-30 Y0 Z-2 I-30 J0\nM2');
    const out: number[] = [];
    const n = flattenArc(r.moves, 0, 0.05, out);
    expect(out.length).toBe(3 * n);
    expect(out.slice(-3)).toEqual([r.moves.x[1], r.moves.y[1], r.moves.z[1]]);
    let px = 30;
    let py = 0;
    for (let k = 0; k < n; k++) {
      const x = out[3 * k];
      const y = out[3 * k + 1];
      expect(Math.hypot(x, y)).toBeCloseTo(30, 9);
      const chord = Math.hypot(x - px, y - py);
      expect(30 - Math.sqrt(30 * 30 - (chord / 2) ** 2)).toBeLessThanOrEqual(0.05 + 1e-12);
      px = x;
      py = y;
    }
  });

  it('arcIndexOfMove finds the arc row of an arc move', () => {
    const r = run('G21 F100\nG1 X10\nG2 X20 Y0 R5\nG1 X30\nG3 X40 Y0 R5\nM2');
    const arcMoves = [...Array(r.moves.count).keys()].filter((i) => r.moves.kind[i] === MoveKind.arc);
    expect(arcMoves.map((i) => arcIndexOfMove(r.moves, i))).toEqual([0, 1]);
    expect(arcIndexOfMove(r.moves, 0)).toBe(-1);
  });
});

describe('against @flatten-js/core (independent reference)', () => {
  // The centre is worked out here from the words alone, never read from the move list:
  // centre format (NISTIR 6556 §3.5.3.2): start + (I, J); radius format (§3.5.3.1): on the
  // perpendicular bisector of the chord, h = √(R² − (c/2)²) from its midpoint, to the left of
  // the chord's direction for G3 and to the right for G2 when R > 0 (the arc of 180° or less),
  // on the other side when R < 0 (plane geometry of a circle through two points).
  function centreOf(sx: number, sy: number, ex: number, ey: number, ccw: boolean, w: { i?: number; j?: number; r?: number }): [number, number] {
    if (w.r === undefined) return [sx + (w.i ?? 0), sy + (w.j ?? 0)];
    const dx = ex - sx;
    const dy = ey - sy;
    const c = Math.hypot(dx, dy);
    const h = Math.sqrt(w.r * w.r - (c / 2) ** 2);
    const left = ccw === w.r > 0;
    const [nx, ny] = left ? [-dy / c, dx / c] : [dy / c, -dx / c];
    return [(sx + ex) / 2 + h * nx, (sy + ey) / 2 + h * ny];
  }
  const cases: Array<[string, number, number, number, number, boolean, { i?: number; j?: number; r?: number }]> = [
    // program, start x, y, end x, y, ccw, the words that fix the centre
    ['G2 X10 Y16 I3 J4', 7, 7, 10, 16, false, { i: 3, j: 4 }],
    ['G3 X-10 Y4 I-8 J-6', 4, 2, -10, 4, true, { i: -8, j: -6 }],
    ['G2 X40 Y-10 R25', 0, 0, 40, -10, false, { r: 25 }],
    ['G3 X40 Y-10 R-25', 0, 0, 40, -10, true, { r: -25 }],
    ['G3 X40 Y-10 R25', 0, 0, 40, -10, true, { r: 25 }],
  ];
  for (const [block, sx, sy, ex, ey, ccw, words] of cases) {
    it(`${block}: centre, radius and length agree with a reference arc built from the words`, () => {
      const r = run(`G21 F100\nG0 X${sx} Y${sy}\n${block}\nM2`);
      expect(errors(r)).toEqual([]);
      expect(codes(r)).toEqual([]);
      const [cx, cy] = centreOf(sx, sy, ex, ey, ccw, words);
      const radius = Math.hypot(sx - cx, sy - cy);
      const a = r.moves.arcs;
      expect(a.cx[0]).toBeCloseTo(cx, 9);
      expect(a.cy[0]).toBeCloseTo(cy, 9);
      expect(a.radius[0]).toBeCloseTo(radius, 9);
      const c = new Flatten.Point(cx, cy);
      // flatten-js: counterClockwise flag true = CCW
      const ref = new Flatten.Arc(c, radius, Math.atan2(sy - cy, sx - cx), Math.atan2(ey - cy, ex - cx), ccw);
      expect(ref.end.distanceTo(new Flatten.Point(ex, ey))[0]).toBeLessThan(1e-6); // the words' end lies on the circle
      expect(arcLength(r.moves, 0)).toBeCloseTo(ref.length, 9);
      // R > 0 is the arc of 180° or less, R < 0 the longer one (§3.5.3.1)
      if (words.r !== undefined) expect(ref.length > Math.PI * radius).toBe(words.r < 0);
    });
  }
});
