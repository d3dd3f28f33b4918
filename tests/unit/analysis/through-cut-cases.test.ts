// Through-cut analysis on programs that were missing from the suite (issue 19 point 6):
// arcs in the G18 and G19 planes, several tools on one part, an island inside a hole, and
// the onion-skin thickness boundary. The programs are G-code text run through the
// interpreter, so the arcs' planes come from G18/G19 as a CAM post writes them. Expected
// areas are closed forms of plane geometry: a rectangle w × h shrunk inward by r keeps sharp
// corners, (w − 2r)(h − 2r); a square hole of side s grown by r gains rounded corners,
// s² + 4sr + πr² (offset of a convex polygon: Steiner's formula); a circle of radius ρ grown
// by r is π(ρ + r)². A finished part is the loop's interior shrunk by its tool's radius, minus
// its holes grown by theirs (lib/analysis/types.ts). Sheet 18 mm, Z zero on top: the bottom
// is Z −18 and a cut at or below −17.95 is through (settings in docs/references.md §5).
import { describe, expect, it } from 'vitest';
import { interpret, moveLength, MoveKind } from '@/lib/gcode';
import { analyze } from '@/lib/analysis';
import { job } from './support/jobs';

const run = (text: string, holdDown: Parameters<typeof job>[1] = 'tape-glue') => {
  const r = interpret(text);
  expect(r.diagnostics.filter((d) => d.severity !== 'info')).toEqual([]);
  return { moves: r.moves, result: analyze(r.moves, job(18, holdDown)) };
};
const kinds = (r: ReturnType<typeof analyze>) => r.findings.map((f) => f.kind);

// tool 9 of the test library has diameter 0: the finished part is the tool-path loop itself
const ZERO_WIDTH = 'G21 G90 G17\nT9 M6\nS18000 M3\nG0 X0 Y0 Z5\nG1 Z-18.3 F600\n';

describe('arcs in the G18 and G19 planes (NISTIR 6556 §3.5.3: the arc lies in the selected plane)', () => {
  it('a side cut with a G18 (XZ) arc that dips 0.5 mm is straight in plan: the part is the 100 × 60 rectangle, 6000 mm²', () => {
    // chord 100 mm, sagitta 0.5 mm: R = (50² + 0.5²)/(2·0.5) = 2500.25 mm, centre 2499.75 mm
    // above the ends (K); arc length 2R·asin(50/R) = 100.006667 mm
    const k = Math.sqrt(2500.25 ** 2 - 50 ** 2);
    const { moves, result } = run(`${ZERO_WIDTH}G18 G2 X100 Z-18.3 I50 K${k.toFixed(6)} F3000\nG17 G1 Y60\nX0\nY0\nG0 Z5\nM30\n`);
    const arc = moves.kind.indexOf(MoveKind.arc);
    expect(moves.arcs.plane[0]).toBe(1);
    expect(moveLength(moves, arc)).toBeCloseTo(100.006667, 5);
    expect(result.parts).toHaveLength(1);
    expect(result.parts[0].areaMm2).toBeCloseTo(6000, 6);
    expect(result.parts[0].tabs).toBe(0);
    expect(result.parts[0].freedAtLine).toBe(9);
    // its lowest point, Z −18.8, is 0.8 mm into the spoilboard: within the 1 mm allowance
    expect(kinds(result)).not.toContain('spoilboard-depth');
  });

  it('a G19 (YZ) arc rising 3 mm over 6 mm of a side leaves a tab there; the part is still the rectangle in plan', () => {
    // from Y27 to Y33 about (Y30, Z −18.3): a half circle of r 3 mm above the through depth
    const tabbed = run(`${ZERO_WIDTH}G1 X100\nY27\nG19 G2 Y33 Z-18.3 J3 K0\nG17 G1 Y60\nX0\nY0\nG0 Z5\nM30\n`).result;
    expect(tabbed.parts).toHaveLength(1);
    expect(tabbed.parts[0]).toMatchObject({ tabs: 1, held: true, holdBy: 'tabs', freedAtLine: null });
    expect(tabbed.parts[0].areaMm2).toBeCloseTo(6000, 6);
    // the same tab made of three straight moves gives the same part
    const straight = run(`${ZERO_WIDTH}G1 X100\nY27\nZ-15.3\nY33\nZ-18.3\nY60\nX0\nY0\nG0 Z5\nM30\n`).result;
    expect(straight.parts.map((p) => [p.areaMm2, p.tabs, p.holdBy])).toEqual(tabbed.parts.map((p) => [p.areaMm2, p.tabs, p.holdBy]));
  });

  it('the same G19 arc turned the other way dips 3 mm: no tab, cut through, and 3.3 mm into the spoilboard is a warning', () => {
    const { result } = run(`${ZERO_WIDTH}G1 X100\nY27\nG19 G3 Y33 Z-18.3 J3 K0\nG17 G1 Y60\nX0\nY0\nG0 Z5\nM30\n`);
    expect(result.parts).toHaveLength(1);
    expect(result.parts[0]).toMatchObject({ tabs: 0, holdBy: 'tape-glue' });
    expect(result.parts[0].areaMm2).toBeCloseTo(6000, 6);
    expect(result.findings.filter((f) => f.kind === 'spoilboard-depth').map((f) => f.line)).toEqual([8]);
  });
});

describe('several tools on one part', () => {
  it('a hole cut with tool 2 (3.175 mm) and the outside with tool 1 (6.35 mm): 93.65 × 53.65 − π·11.5875² = 4602.50 mm²', () => {
    // outside 100 × 60 shrunk by 3.175; the hole, r 10, grown by 1.5875
    const { result } = run(
      'G21 G90 G17\nT2 M6\nS18000 M3\nG0 X60 Y30 Z5\nG1 Z-18.3 F600\nG2 X40 Y30 I-10 J0\nX60 Y30 I10 J0\nG0 Z5\n' +
        'T1 M6\nM3\nG0 X10 Y10\nG1 Z-9\nX110\nY70\nX10\nY10\nZ-18.3\nX110\nY70\nX10\nY10\nG0 Z5\nM30\n',
    );
    expect(result.parts).toHaveLength(1);
    const part = result.parts[0];
    expect(part).toMatchObject({ holes: 1, tool: 1 });
    // the circle is flattened within 0.01 mm (chord tolerance): at most 0.01 × its 72.8 mm perimeter
    expect(Math.abs(part.areaMm2 - 4602.5)).toBeLessThan(0.73);
  });

  it('roughed with one tool and cut through with another: the through pass\u2019s tool decides the finished part', () => {
    const rough = (a: number, b: number) =>
      `G21 G90 G17\nT${a} M6\nS18000 M3\nG0 X10 Y10 Z5\nG1 Z-9 F600\nX110\nY70\nX10\nY10\nG0 Z5\nT${b} M6\nM3\nG0 X10 Y10\nG1 Z-18.3\nX110\nY70\nX10\nY10\nG0 Z5\nM30\n`;
    // tool 3 (6 mm) through: (100 − 6)(60 − 6) = 5076 mm²
    const t3 = run(rough(1, 3)).result.parts;
    expect(t3.map((p) => [p.tool, p.areaMm2])).toEqual([[3, expect.closeTo(5076, 6)]]);
    // tool 1 (6.35 mm) through: (100 − 6.35)(60 − 6.35) = 5024.3225 mm²
    const t1 = run(rough(3, 1)).result.parts;
    expect(t1.map((p) => [p.tool, p.areaMm2])).toEqual([[1, expect.closeTo(5024.3225, 6)]]);
  });
});

describe('an island inside a hole', () => {
  // tool 1 (r = 3.175): the part 100 × 100 with a 60 × 60 hole, and a 20 × 20 island in the
  // hole, each cut through; the island is a part of its own (it comes free in the hole)
  const sq = (x0: number, y0: number, x1: number, y1: number) => `G0 X${x0} Y${y0}\nG1 Z-18.3\nX${x1}\nY${y1}\nX${x0}\nY${y0}\nG0 Z5\n`;
  const text = (order: string[]) => 'G21 G90 G17 F600\nT1 M6\nS18000 M3\nG0 Z5\n' + order.join('') + 'M30\n';
  const island = sq(40, 40, 60, 60);
  const hole = sq(20, 20, 80, 80);
  const outside = sq(0, 0, 100, 100);

  it('two parts: the island (20 − 6.35)² = 186.3225 mm² and the frame 93.65² − (60² + 4·60·3.175 + π·3.175²) = 4376.65 mm², one hole', () => {
    const { result } = run(text([island, hole, outside]));
    const parts = [...result.parts].sort((a, b) => a.areaMm2 - b.areaMm2);
    expect(parts).toHaveLength(2);
    expect(parts[0]).toMatchObject({ holes: 0, held: true });
    expect(parts[0].areaMm2).toBeCloseTo(186.3225, 6);
    expect(parts[1].holes).toBe(1);
    // the grown hole's rounded corners are flattened within 0.01 mm over their 20 mm of arc
    expect(Math.abs(parts[1].areaMm2 - 4376.653)).toBeLessThan(0.2);
    expect(result.summary.holes).toBe(1);
    // inside first: the island, then the frame; the island comes free at its own last line
    expect(parts[0].order).toBe(1);
    expect(parts[1].order).toBe(2);
    expect(kinds(result)).not.toContain('cut-order');
  });

  it('the order in which the three loops are cut does not change the parts', () => {
    const a = run(text([island, hole, outside])).result.parts.map((p) => Math.round(p.areaMm2 * 100)).sort();
    const b = run(text([hole, island, outside])).result.parts.map((p) => Math.round(p.areaMm2 * 100)).sort();
    expect(b).toEqual(a);
  });
});

describe('onion skin: a deepest pass at most 1.0 mm above the bottom is a skin (docs/references.md §5, our own margin)', () => {
  const profile = (z: string) => `${ZERO_WIDTH.replace('Z-18.3', `Z${z}`)}X100\nY60\nX0\nY0\nG0 Z5\nM30\n`;
  it.each([
    ['-17.5', 0.5],
    ['-17', 1.0], // exactly at the limit: still a skin
  ])('deepest pass at Z %s leaves a skin of %f mm that holds the part', (z, skin) => {
    const { result } = run(profile(z));
    expect(result.parts).toHaveLength(1);
    expect(result.parts[0]).toMatchObject({ held: true, holdBy: 'skin', freedAtLine: null });
    expect(result.parts[0].skinMm).toBeCloseTo(skin, 9);
  });
  it('at Z −16.99 (1.01 mm left) it is no skin and no part: the sheet is simply not cut through', () => {
    const { result } = run(profile('-16.99'));
    expect(result.parts).toEqual([]);
  });
  it('at Z −17.95 (the through tolerance) the part is cut free, with no skin', () => {
    const { result } = run(profile('-17.95'));
    expect(result.parts).toHaveLength(1);
    expect(result.parts[0]).toMatchObject({ skinMm: 0, holdBy: 'tape-glue', freedAtLine: 9 });
  });
});
