// Modal state, units, frames, feed modes, M codes and diagnostics after NISTIR 6556
// (section named in each test) and NIST SP 811 for the inch.
import { describe, expect, it } from 'vitest';
import { MoveFlag, MoveKind, DIAGNOSTIC_CODES } from '@/lib/gcode';
import { codes, errors, points, run, totals } from './helpers';

describe('modal groups (NISTIR 6556 Table 4, §3.3.5)', () => {
  it('G0 G1 X1 is an error: two words of group 1; the line is skipped with its text', () => {
    const r = run('G21 F100\nG0 G1 X1\nM2');
    expect(errors(r)).toEqual(['modal-group-conflict']);
    expect(r.diagnostics[0]).toMatchObject({ line: 2, severity: 'error', text: 'G0 G1 X1' });
    expect(points(r, [MoveKind.rapid, MoveKind.feed])).toEqual([]);
  });
  it.each([['G17 G18'], ['G90 G91'], ['G93 G94'], ['G20 G21'], ['G40 G41'], ['G43 G49'], ['G98 G99'], ['G54 G55'], ['G61 G64'], ['M3 M5'], ['M0 M2']])('%s on one line is an error', (pair) => {
    expect(errors(run(`G21 F100\n${pair}\nM2`))).toEqual(['modal-group-conflict']);
  });
  it.each([['G0 G81'], ['G1 G83'], ['G2 G3'], ['G80 G81'], ['G81 G82']])('%s X1 Y1 Z-2 R1: motion and canned cycles share group 1, so the line is an error and moves nothing (Table 4, §3.3.5)', (pair) => {
    const r = run(`G21 F100\nG0 Z5\n${pair} X1 Y1 Z-2 R1\nM2`);
    expect(errors(r)).toEqual(['modal-group-conflict']);
    expect(r.diagnostics[0].line).toBe(3);
    expect(points(r, [MoveKind.rapid, MoveKind.feed, MoveKind.arc])).toEqual([['rapid', 0, 0, 5]]);
  });
  it('M7 and M8 together are allowed (NISTIR 6556 §3.4)', () => {
    const r = run('G21 F100\nM7 M8\nG1 X1\nM2');
    expect(errors(r)).toEqual([]);
    expect(r.moves.flags[0] & MoveFlag.coolant).toBeTruthy();
  });
  it('a letter twice on a line is an error (§3.3.5)', () => {
    expect(errors(run('G21 F100\nG1 X1 X2\nM2'))).toEqual(['duplicate-word']);
  });
  it('modal motion: axis words alone continue the motion mode in force', () => {
    const r = run('G21 F100\nG1 X1\nY2\nZ-1\nM2');
    expect(points(r, [MoveKind.feed])).toEqual([
      ['feed', 1, 0, 0],
      ['feed', 1, 2, 0],
      ['feed', 1, 2, -1],
    ]);
  });
});

describe('distance mode and units', () => {
  it('G91 sequence: each word adds to the current point (NISTIR 6556 §3.5.17)', () => {
    const r = run('G21 G91 F100\nG1 X10 Y5\nX-3\nY-5 Z-2\nG90 X0 Y0 Z0\nM2');
    expect(points(r, [MoveKind.feed])).toEqual([
      ['feed', 10, 5, 0],
      ['feed', 7, 5, 0],
      ['feed', 7, 0, -2],
      ['feed', 0, 0, 0],
    ]);
  });
  it('G20: coordinates and feed are converted with 1 in = 25.4 mm exactly (NIST SP 811 App. B)', () => {
    const r = run('G20 G90\nG1 X1 Y2.5 Z-0.125 F10\nM2');
    expect(r.moves.x[0]).toBe(25.4);
    expect(r.moves.y[0]).toBe(63.5);
    expect(r.moves.z[0]).toBe(-3.175);
    expect(r.moves.feed[0]).toBeCloseTo(254, 4);
    expect(r.facts.units).toBe('inch');
  });
  it('4 × 8 ft = 1219.2 × 2438.4 mm (computed, NIST SP 811)', () => {
    const r = run('G20\nG0 X48 Y96\nM2');
    expect(r.moves.x[0]).toBeCloseTo(1219.2, 9);
    expect(r.moves.y[0]).toBeCloseTo(2438.4, 9);
  });
  it('units switched mid-program: the current point stays where it is, later words are read in the new unit (NISTIR 6556 §3.5.7, section number from memory; 1 in = 25.4 mm, NIST SP 811)', () => {
    // X10 mm, then G20: X1 is 25.4 mm; G91 X1 adds 25.4 mm; G21 G90 X100 is 100 mm; an F given
    // after G20 is in in/min (10 in/min = 254 mm/min)
    const r = run('G21 F254\nG1 X10\nG20\nG1 X1\nG91 X1\nG21 G90 X100\nG20 X2 F10\nM2');
    expect(points(r, [MoveKind.feed]).map((p) => p[1])).toEqual([10, 25.4, 50.8, 100, 50.8]);
    expect(r.moves.feed[4]).toBeCloseTo(254, 4);
    expect(errors(r)).toEqual([]);
    // a G20 line alone moves nothing: the point after it is still X10 (10 mm, not 10 in)
    const still = run('G21 F100\nG1 X10\nG20\nG91 G1 Y1\nM2');
    expect(points(still, [MoveKind.feed])).toEqual([
      ['feed', 10, 0, 0],
      ['feed', 10, 25.4, 0],
    ]);
  });
  it('defaultUnits inch applies before any G20/G21', () => {
    const r = run('G0 X1\nM2', { defaultUnits: 'inch' });
    expect(r.moves.x[0]).toBe(25.4);
    expect(r.facts.units).toBe('inch');
  });
});

describe('feed modes (NISTIR 6556 §3.5.19)', () => {
  it('G93 G1 X100 F2: the move carries feed = length × F = 200 mm/min (its 30 s are timed through the estimate in kinematics/programs.test.ts)', () => {
    const r = run('G21 G93\nG1 X100 F2\nM2');
    expect(r.moves.feed[0]).toBeCloseTo(200, 9);
    expect(r.moves.flags[0] & MoveFlag.inverseTime).toBeTruthy();
  });
  it('G93 on an arc: the feed is the arc length × F (π·10 mm in 1/2 min → 20π mm/min)', () => {
    const r = run('G21 F100\nG93 G3 X20 Y0 R10 F2\nM2');
    expect(r.moves.feed[0]).toBeCloseTo(20 * Math.PI, 4);
  });
  it('in G93 every feed line needs F', () => {
    const r = run('G21 G93\nG1 X100 F2\nX200\nM2');
    expect(errors(r)).toEqual(['inverse-time-feed-missing']);
  });
  it('G94: F is modal; a feed move before any F is an error and keeps feed 0', () => {
    const r = run('G21\nG1 X5\nG1 X10 F300\nX20\nM2');
    expect(errors(r)).toEqual(['feed-missing']);
    expect([r.moves.feed[0], r.moves.feed[1], r.moves.feed[2]]).toEqual([0, 300, 300]);
  });
});

describe('dwell, frames and returns', () => {
  it('G4 P is seconds; negative P is an error (NISTIR 6556 §3.5.4)', () => {
    expect(totals(run('G4 P2.5\nM2')).dwellS).toBe(2.5);
    expect(errors(run('G4 P-1\nM2'))).toEqual(['dwell-negative']);
  });
  it('G54 uses the work offset; G53 moves in machine coordinates, not modal (NISTIR 6556 §3.5.12)', () => {
    const workOffset = { x: 100, y: 50, z: -20 };
    const r = run('G21 G54\nG0 X10 Y10\nG53 G0 Z0\nG0 Z5\nM2', { workOffset });
    expect(points(r, [MoveKind.rapid])).toEqual([
      ['rapid', 10, 10, 0],
      ['rapid', 10, 10, 20],
      ['rapid', 10, 10, 5],
    ]);
    expect(r.moves.flags[1] & MoveFlag.machineFrame).toBeTruthy();
    expect(r.moves.flags[2] & MoveFlag.machineFrame).toBeFalsy();
  });
  it('G28 goes through the programmed point to the home position (NISTIR 6556 §3.5.8)', () => {
    const r = run('G21\nG0 X10 Y10 Z5\nG28 Z20\nM2', { home: { x: 0, y: 0, z: 0 }, workOffset: { x: 0, y: 0, z: -30 } });
    expect(points(r, [MoveKind.rapid]).slice(1)).toEqual([
      ['rapid', 10, 10, 20],
      ['rapid', 0, 0, 30],
    ]);
    expect(codes(r)).toContain('home-position-assumed');
  });
  it('G30 goes through the programmed point to the second home position (NISTIR 6556 §3.5.8)', () => {
    // intermediate point Z20 in the work frame; the second home (500, 300, 0) in machine
    // coordinates is (500, 300, 30) in a work frame whose Z zero lies 30 mm below machine zero
    const opts = { home: { x: 0, y: 0, z: 0 }, home2: { x: 500, y: 300, z: 0 }, workOffset: { x: 0, y: 0, z: -30 } };
    const r = run('G21\nG0 X10 Y10 Z5\nG30 Z20\nM2', opts);
    expect(points(r, [MoveKind.rapid]).slice(1)).toEqual([
      ['rapid', 10, 10, 20],
      ['rapid', 500, 300, 30],
    ]);
    expect(r.moves.line[2]).toBe(3);
    // with no axis word the intermediate point is the current point: one move only
    const direct = run('G21\nG0 X10 Y10 Z5\nG30\nM2', opts);
    expect(points(direct, [MoveKind.rapid]).slice(1)).toEqual([['rapid', 500, 300, 30]]);
    // G30 is not modal (Table 4, group 0): the next axis words continue G0
    const after = run('G21\nG0 X10\nG30\nX1\nM2', opts);
    expect(points(after, [MoveKind.rapid]).at(-1)).toEqual(['rapid', 1, 300, 30]);
  });
  it('G1 and G28 on one line both use the axis words: an error, and only G28 is applied (NISTIR 6556 §3.4)', () => {
    const r = run('G21 F100\nG1 G28 X1\nM2');
    expect(errors(r)).toEqual(['axis-word-conflict']);
    expect(points(r, [MoveKind.rapid, MoveKind.feed])).toEqual([
      ['rapid', 1, 0, 0],
      ['rapid', 0, 0, 0],
    ]);
  });
  it('G55–G59 are taken as G54 with one info finding', () => {
    const r = run('G21\nG55\nG0 X1\nG56\nM2', { workOffset: { x: 5, y: 0, z: 0 } });
    expect(r.moves.x[0]).toBe(1);
    expect(codes(r).filter((c) => c === 'work-offset-assumed-zero')).toHaveLength(1);
  });
  it('G92 makes the current point take the given coordinates; G92.1 clears it', () => {
    const r = run('G21\nG0 X10 Y10\nG92 X0 Y0\nG0 X5\nG92.1\nG0 X5\nM2');
    expect(points(r, [MoveKind.rapid]).map((p) => p[1])).toEqual([10, 15, 5]);
  });
  it('G61 marks exact stop on each move, G64 clears it', () => {
    const r = run('G21 F100\nG61 G1 X1\nG64 X2\nM2');
    expect(r.moves.flags[0] & MoveFlag.exactStop).toBeTruthy();
    expect(r.moves.flags[1] & MoveFlag.exactStop).toBeFalsy();
  });
  it('G41/G42 and G43 are noted once each, not applied', () => {
    const r = run('G21 F100\nG41 D1\nG1 X1\nG42\nG43 H1\nG43 H2\nM2');
    expect(codes(r).filter((c) => c === 'cutter-compensation-ignored')).toHaveLength(1);
    expect(codes(r).filter((c) => c === 'length-compensation-ignored')).toHaveLength(1);
  });
});

describe('M codes, tools and spindle', () => {
  it('T then M6 records the tool change; S with M3 starts the spindle; moves carry them', () => {
    const r = run('G21 F100\nT3 M6\nS18000 M3\nG1 X5\nM5\nM2');
    const m = r.moves;
    expect(points(r).map((p) => p[0])).toEqual(['toolChange', 'spindleStart', 'feed', 'spindleStop', 'programEnd']);
    expect(m.tool[0]).toBe(3);
    expect(m.spindle[1]).toBe(18000);
    expect(m.spindle[2]).toBe(18000);
    expect(m.flags[2] & MoveFlag.spindleOn).toBeTruthy();
    expect(m.spindle[3]).toBe(0);
    expect(r.facts.toolsUsed).toEqual([3]);
    expect(r.facts.spindleSpeeds).toEqual([18000]);
  });
  it('M4 runs the spindle counter-clockwise; a reversal is a new spindle start', () => {
    const r = run('G21 F100\nS12000 M4\nG1 X1\nM3\nG1 X2\nM2');
    expect(points(r).map((p) => p[0])).toEqual(['spindleStart', 'feed', 'spindleStart', 'feed', 'programEnd']);
    expect(r.moves.flags[1] & MoveFlag.spindleCcw).toBeTruthy();
    expect(r.moves.flags[3] & MoveFlag.spindleCcw).toBeFalsy();
  });
  it('M1 is an optional stop (aux 1), M0 a stop', () => {
    const r = run('M0\nM1\nM2');
    expect(points(r).map((p) => p[0])).toEqual(['programStop', 'programStop', 'programEnd']);
    expect([r.moves.aux[0], r.moves.aux[1]]).toEqual([0, 1]);
  });
  it('M2 resets to G17 G90 G94 G54, M5, M9, motion G1 (NISTIR 6556 §3.6.1)', () => {
    const r = run('G21 G91 G18 G93 F5\nS1000 M3 M8\nM2\nF100\nX1 Y1\nG2 X3 Y1 I1 J0\n', { continueAfterEnd: true });
    const m = r.moves;
    const feed = points(r, [MoveKind.feed]);
    expect(feed).toEqual([['feed', 1, 1, 0]]); // G90 and motion G1 after M2
    const f = m.kind.indexOf(MoveKind.feed);
    expect(m.feed[f]).toBe(100); // G94 again
    expect(m.flags[f] & (MoveFlag.spindleOn | MoveFlag.coolant)).toBe(0); // M5, M9
    expect(m.arcs.plane[0]).toBe(0); // G17
    // the records in order: spindle start (line 2), the end (line 3), then the two moves
    expect(Array.from(m.kind)).toEqual([MoveKind.spindleStart, MoveKind.programEnd, MoveKind.feed, MoveKind.arc]);
    expect(m.line[1]).toBe(3);
  });
  it('M2 clears the G92 offsets (NISTIR 6556 §3.6.1: origin offsets back to their default, as G92.2 does)', () => {
    // G92 X0 at X10 shifts the program origin by 10; after M2 X5 is the work frame's X5 again
    const r = run('G21\nG0 X10 Y10\nG92 X0 Y0\nG0 X5\nM2\nG0 X5\n', { continueAfterEnd: true });
    expect(points(r, [MoveKind.rapid])).toEqual([
      ['rapid', 10, 10, 0],
      ['rapid', 15, 10, 0],
      ['rapid', 5, 10, 0],
    ]);
  });
  it('M30 clears them too, and the G91 of the first run (§3.6.1)', () => {
    const r = run('G21 G91\nG0 X10\nG92 X0\nM30\nG0 X5\n', { continueAfterEnd: true });
    expect(points(r, [MoveKind.rapid]).map((p) => p[1])).toEqual([10, 5]);
  });
  it('code after M30 is reported once and not interpreted (default)', () => {
    const r = run('G21\nG0 X1\nM30\nG0 X5\nG0 X6\n%');
    expect(points(r, [MoveKind.rapid])).toEqual([['rapid', 1, 0, 0]]);
    expect(codes(r)).toEqual(['lines-after-program-end']);
  });
});

describe('what the engine does not interpret is reported, never dropped silently', () => {
  it.each([
    ['#1 = 5', 'parameter-unsupported'],
    ['G1 X#1', 'parameter-unsupported'],
    ['G1 X[1+2]', 'expression-unsupported'],
    ['O100 sub', 'o-code-unsupported'],
    ['G1 X1..2', 'bad-number'],
    ['G1 X-', 'bad-number'],
    ['G1 X Y2', 'word-without-value'],
    ['G38.2 Z-5', 'unsupported-g-code'],
    ['G84 X1 Y1 Z-1 R1', 'unsupported-canned-cycle'],
  ])('%s → %s', (line, code) => {
    const r = run(`G21 F100\n${line}\nM2`);
    expect(errors(r)).toEqual([code]);
    expect(r.diagnostics[0].line).toBe(2);
    expect(r.diagnostics[0].text).toBe(line);
    // a full sentence; the line number is the diagnostic's `line`, not repeated in the text
    expect(r.diagnostics[0].message).toMatch(/^[A-Z0-9%].*\.$/);
    expect(r.diagnostics[0].message).not.toMatch(/line 2\b/);
  });
  it.each([
    ['G1 X1 A30', 'rotary-axis-ignored'],
    ['M98', 'unsupported-m-code'],
    ['G1 X1 E0.5', 'unsupported-word'],
    ['$H', 'controller-command-ignored'],
    ['G1 X1 (open comment', 'comment-unclosed'],
    ['G10 L2 P1 X0', 'g10-unsupported'],
  ])('%s → warning %s', (line, code) => {
    const r = run(`G21 F100\n${line}\nM2`);
    expect(codes(r)).toContain(code);
    expect(errors(r)).toEqual([]);
  });
  it('a bad number names its column (1-based)', () => {
    expect(run('G21 F100\nG1 Y2 X1..2\nM2').diagnostics[0]).toMatchObject({ code: 'bad-number', column: 7 });
  });
    it('every code used has a documented entry', () => {
    const r = run('G21\nG1 X1..2\nG0 G1 X1\nX#1\nG4 P-1\nG84 X1\n');
    for (const d of r.diagnostics) expect(DIAGNOSTIC_CODES).toHaveProperty(d.code);
  });
  it('a repeated finding is listed up to a cap and then counted', () => {
    const r = run('G21\n' + 'G1 X1..2\n'.repeat(500) + 'M2');
    expect(r.diagnostics.filter((d) => d.code === 'bad-number')).toHaveLength(200);
    expect(r.diagnostics.at(-1)).toMatchObject({ code: 'diagnostics-truncated', severity: 'info' });
  });
});

describe('program facts', () => {
  it('bounds of rapid and feed moves, with arcs by their true extent', () => {
    const r = run('G21 F100\nG0 X10 Y0 Z5\nG1 Z-1\nG3 X-10 Y0 I-10 J0\nG0 Z5\nM2');
    expect(r.facts.feedBounds).toEqual({ minX: -10, minY: 0, minZ: -1, maxX: 10, maxY: 10, maxZ: 5 });
    expect(r.facts.rapidBounds).toMatchObject({ minX: -10, maxX: 10, minZ: -1, maxZ: 5 });
    expect(r.facts.lineCount).toBe(6);
  });
});
