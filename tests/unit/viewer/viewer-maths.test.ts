// The viewer's pure parts: time → move and draw range, the tool's place on an arc, colour by
// kind / tool / speed and the legend, camera fitting, readouts and line starts. Sources: the
// tangent from an eye to a sphere, d = r / sin θ (right-triangle geometry); 1 in = 25.4 mm
// exactly (NIST SP 811, appendix B.8); line ends per NISTIR 6556 §3.3 (LF, CRLF, lone CR);
// the trapezoid closed form t = L/v + v/a (Biagiotti & Melchiorri §3.2.2, from memory).
import { describe, expect, it } from 'vitest';
import { interpret } from '@/lib/gcode';
import { estimate } from '@/lib/kinematics';
import { boxRadius, fitDistance, placeCamera } from '@/lib/viewer/camera-fit';
import { colourPath, legendFor, moveColour, speedStep } from '@/lib/viewer/colour-map';
import { compareReports } from '@/lib/viewer/compare-reports';
import { lineStarts, lineText } from '@/lib/viewer/line-index';
import { hexToRgb, PATH_COLOURS, SPEED_COLOURS, TOOL_COLOURS } from '@/lib/viewer/palette';
import { buildViewerPath } from '@/lib/viewer/path-build';
import { ViewKind } from '@/lib/viewer/path-kinds';
import { doneSegmentCount, fractionAt, stripRanges, moveAtLine, moveAtTime, toolPositionAt } from '@/lib/viewer/playhead';
import { formatArea, formatClock, formatCoordinate } from '@/lib/viewer/readouts';
import { Moves, testProfile } from '../kinematics/support/moves';

describe('playhead on the planner’s clock', () => {
  // two 100 mm moves at F6000 with a stop between (exact stop): each 1.2 s by the trapezoid
  const m = new Moves({ x: 0, y: 0, z: -1 }).exactStop(true).feed(100, 0, -1, 6000).feed(100, 100, -1, 6000).build();
  const e = estimate(m, testProfile());
  it('each move takes L/v + v/a = 1.2 s', () => {
    expect(e.cumulativeS[0]).toBeCloseTo(1.2, 6);
    expect(e.cumulativeS[1]).toBeCloseTo(2.4, 6);
  });
  it('maps a time to the move running then, and the share of it done', () => {
    expect(moveAtTime(e.cumulativeS, 0.6)).toBe(0);
    expect(moveAtTime(e.cumulativeS, 1.8)).toBe(1);
    expect(moveAtTime(e.cumulativeS, 99)).toBe(1);
    expect(fractionAt(e.cumulativeS, 1, 1.8)).toBeCloseTo(0.5, 6);
  });
  it('the draw range counts whole segments done, never a partly done chord', () => {
    const p = buildViewerPath(m, e.cumulativeS, { stockTopZ: 0, chordToleranceMm: 0.003, findingLines: new Uint32Array(0) });
    expect(doneSegmentCount(p.moveSegStart, 0, 0.5)).toBe(0);
    expect(doneSegmentCount(p.moveSegStart, 0, 1)).toBe(1);
    expect(doneSegmentCount(p.moveSegStart, 1, 0.99)).toBe(1);
    expect(doneSegmentCount(p.moveSegStart, 1, 1)).toBe(2);
    expect(doneSegmentCount(p.moveSegStart, -1, 0)).toBe(0);
  });
  it('splits the strip: segment s joins vertices s and s + 1, so both ranges share the playhead’s vertex', () => {
    // 2 of 5 segments done: vertices 0–2 drawn as cut (3), vertices 2–5 to come (4)
    expect(stripRanges(2, 5)).toEqual({ done: [0, 3], ahead: [2, 4] });
    // nothing done: no cut range (a single vertex draws nothing), the whole strip to come
    expect(stripRanges(0, 5)).toEqual({ done: [0, 0], ahead: [0, 6] });
    expect(stripRanges(5, 5)).toEqual({ done: [0, 6], ahead: [0, 0] });
  });
  it('puts the tool on the arc: half of a quarter circle of r = 10 is at (10 cos 45°, 10 sin 45°)', () => {
    const a = new Moves({ x: 10, y: 0, z: -2 }).arcXY(0, 0, Math.PI / 2, 3000).build();
    const p = toolPositionAt(a, 0, 0.5, { x: 0, y: 0, z: 0 });
    expect(p.x).toBeCloseTo(10 * Math.SQRT1_2, 9);
    expect(p.y).toBeCloseTo(10 * Math.SQRT1_2, 9);
    expect(p.z).toBeCloseTo(-2, 9);
    const s = toolPositionAt(m, 1, 0.25, { x: 0, y: 0, z: 0 });
    expect([s.x, s.y, s.z]).toEqual([100, 25, -1]);
  });
  it('a source line maps to the first move at or after it', () => {
    const r = interpret('G21 G90\nG0 X0 Y0 Z5\n(comment)\nG1 Z-1 F500\nG1 X10\n', {});
    expect(moveAtLine(r.moves.line, 3)).toBe(r.moves.line.indexOf(4));
    expect(r.moves.line[moveAtLine(r.moves.line, 5)]).toBe(5);
  });
});

describe('colour by', () => {
  const input = { viewKind: Uint8Array.of(ViewKind.rapid, ViewKind.cut, ViewKind.plunge), speedShare: Float32Array.of(Number.NaN, 0.85, 0.1), toolSlot: Uint8Array.of(0, 1, 2), moveSegStart: Uint32Array.of(0, 1, 2, 3) };
  it('move kind, tool slot and achieved-speed step give one colour per move', () => {
    expect(moveColour(input, 'kind', 1)).toBe(PATH_COLOURS.cut);
    expect(moveColour(input, 'kind', 2)).toBe(PATH_COLOURS.plunge);
    expect(moveColour(input, 'tool', 2)).toBe(TOOL_COLOURS[2]);
    expect(moveColour(input, 'speed', 1)).toBe(SPEED_COLOURS[4]);
    expect(moveColour(input, 'speed', 2)).toBe(SPEED_COLOURS[0]);
    expect(moveColour(input, 'speed', 0)).toBe(PATH_COLOURS.rapid);
  });
  it('speed steps are fifths of the programmed feed', () => {
    expect([0, 0.19, 0.2, 0.39, 0.4, 0.79, 0.8, 1].map(speedStep)).toEqual([0, 0, 1, 1, 2, 3, 4, 4]);
    expect(speedStep(Number.NaN)).toBe(-1);
  });
  it('writes the end vertex of every segment, and the first vertex as the first segment', () => {
    const out = colourPath(input, 'kind', new Uint8Array(12));
    expect(Array.from(out.subarray(0, 6))).toEqual([...hexToRgb(PATH_COLOURS.rapid), ...hexToRgb(PATH_COLOURS.rapid)]);
    expect(Array.from(out.subarray(6, 12))).toEqual([...hexToRgb(PATH_COLOURS.cut), ...hexToRgb(PATH_COLOURS.plunge)]);
  });
  it('the legend is in words, rapids dashed in every mode, only what the program has', () => {
    const kinds = new Set([ViewKind.rapid, ViewKind.cut]);
    expect(legendFor('kind', { kinds, tools: [] }).map((e) => [e.words, e.dashed])).toEqual([
      ['Cut', false],
      ['Rapid (dashed)', true],
    ]);
    expect(legendFor('tool', { kinds, tools: [3, 5] }).map((e) => e.words)).toEqual(['Tool 3', 'Tool 5', 'Rapid (dashed)']);
    const speed = legendFor('speed', { kinds, tools: [] });
    expect(speed[0].words).toBe('0–20% of the programmed feed');
    expect(speed[4].words).toBe('80–100% of the programmed feed');
    expect(speed.at(-1)?.dashed).toBe(true);
  });
  it('no two legend colours of one mode are the same', () => {
    for (const list of [TOOL_COLOURS, SPEED_COLOURS, [PATH_COLOURS.cut, PATH_COLOURS.plunge, PATH_COLOURS.air, PATH_COLOURS.rapid]]) expect(new Set(list).size).toBe(list.length);
  });
});

describe('camera fitting', () => {
  it('a sphere of r = 1 fills a 90° view from d = 1/sin 45° = √2', () => {
    expect(fitDistance(1, 90, 1, 1)).toBeCloseTo(Math.SQRT2, 9);
  });
  it('a narrow window decides by its horizontal half-angle, atan(aspect · tan θv)', () => {
    const halfH = Math.atan(0.5 * Math.tan(Math.PI / 4));
    expect(fitDistance(1, 90, 0.5, 1)).toBeCloseTo(1 / Math.sin(halfH), 9);
  });
  it('preset views look at the box centre from their side, the sphere just inside the view', () => {
    const box = { minX: 0, minY: 0, minZ: -18, maxX: 1220, maxY: 2440, maxZ: 0 };
    const top = placeCamera(box, 'top', 40, 1.5);
    expect(top.target).toEqual([610, 1220, -9]);
    expect(top.position[2]).toBeGreaterThan(1000);
    const d = Math.hypot(top.position[0] - 610, top.position[1] - 1220, top.position[2] + 9);
    expect(Math.asin(boxRadius(box) / d)).toBeLessThan((20 * Math.PI) / 180);
    const front = placeCamera(box, 'front', 40, 1.5);
    expect(front.position[1]).toBeLessThan(0);
    expect(front.position[0]).toBeCloseTo(610, 9);
  });
});

describe('readouts', () => {
  it('the clock reads m:ss under an hour, h:mm:ss above', () => {
    expect(formatClock(0)).toBe('0:00');
    expect(formatClock(75.9)).toBe('1:15');
    expect(formatClock(3725)).toBe('1:02:05');
    expect(formatClock(-3)).toBe('0:00');
  });
  it('coordinates in mm or inch (25.4 mm exactly, NIST SP 811 B.8)', () => {
    expect(formatCoordinate(25.4, 'inch')).toBe('1.0000');
    expect(formatCoordinate(-0.0001, 'mm')).toBe('0.000');
    expect(formatCoordinate(12.3456, 'mm')).toBe('12.346');
    expect(formatArea(645.16, 'inch')).toBe('1.00 in²');
  });
});

describe('line starts (NISTIR 6556 §3.3: LF, CRLF and a lone CR each end a line)', () => {
  it('agree with the interpreter’s line count and give each line’s text', () => {
    const text = 'G21\r\nG0 X1\rG1 X2 F100\nM30';
    const bytes = new TextEncoder().encode(text);
    const starts = lineStarts(bytes);
    expect(starts.length - 1).toBe(interpret(text, {}).facts.lineCount);
    const d = new TextDecoder();
    expect([1, 2, 3, 4].map((l) => lineText(bytes, starts, l, d))).toEqual(['G21', 'G0 X1', 'G1 X2 F100', 'M30']);
  });
});

describe('comparing reports', () => {
  it('identical JSON agrees; a changed total is named', () => {
    const r = { engine: '1', file: { sha256: 'a' }, totalSeconds: 1, calibratedSeconds: 1, breakdownSeconds: {}, moves: 1, distanceMm: {}, findings: [], parts: [] } as never;
    expect(compareReports(r, structuredClone(r)).identical).toBe(true);
    const c = compareReports(r, { ...(r as object), totalSeconds: 2 } as never);
    expect(c.identical).toBe(false);
    expect(c.differences[0]).toMatch(/^total time/);
  });
});
