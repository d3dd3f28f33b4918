// Our own fixture programs and the generator: they interpret without errors, the generator
// is exact and deterministic, an inch rendering of a job matches its mm rendering, and the
// progress, cancel and builder interfaces behave as documented.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { generateProgram } from '@/fixtures/program-generator';
import { DEFAULT_DIALECT } from '@/fixtures/program-writer';
import { createMoveListBuilder, interpret, moveLength, MoveKind, moveListBytes } from '@/lib/gcode';
import { errors, totals } from './helpers';

const dir = path.resolve(__dirname, '../../../fixtures/programs');

describe('fixture programs', () => {
  const files = readdirSync(dir).filter((f) => /\.(nc|tap|gcode|ngc|cnc|txt)$/.test(f));
  it('there are several, in more than one dialect', () => {
    expect(files.length).toBeGreaterThanOrEqual(4);
  });
  // What fixtures/generate.ts writes into each program, worked out from its recipe: passes
  // per cut = ⌈depth / stepdown⌉ (passDepths), a round hole is two half circles per pass, a
  // profile four quarter-circle corners per pass (one full circle of the corner radius r);
  // arc length 2πr per pass and circle (circle geometry). Depths: holes and profiles go 0.2 mm
  // below the sheet.
  const expected: Record<string, { tools: number[]; arcs: number; arcLengthMm?: number }> = {
    // 4 parts × (hole ⌈18.2/6⌉ = 4 passes × 2 + profile 4 passes × 4); radii drawn at random
    'shelf-brackets-birch-18mm.nc': { tools: [3], arcs: 4 * (4 * 2 + 4 * 4) },
    // 6 × (hole r 3: ⌈3.2/1.5⌉ = 3 passes × 2 arcs; profile r 5: 3 passes × 4); 6·3·2π(3 + 5) = 288π
    'price-tag-holders-acrylic-3mm.tap': { tools: [5], arcs: 6 * (3 * 2 + 3 * 4), arcLengthMm: 288 * Math.PI },
    // tools 2 (pockets, drilling) and 4 (profiles); 2 profiles r 25: ⌈12.2/4⌉ = 4 passes × 4; 2·4·2π·25 = 400π
    'cutting-boards-hdpe-12mm-inch.nc': { tools: [2, 4], arcs: 2 * 4 * 4, arcLengthMm: 400 * Math.PI },
    // 5 profiles r 8: ⌈3.2/1.5⌉ = 3 passes × 4; 5·3·2π·8 = 240π
    'sign-letters-acrylic-3mm.gcode': { tools: [1], arcs: 5 * 3 * 4, arcLengthMm: 240 * Math.PI },
  };
  it('every fixture program has its expectations here', () => {
    expect([...files].sort()).toEqual(Object.keys(expected).sort());
  });
  for (const f of files) {
    it(`${f} interprets without errors, with the tools, arcs and program end its recipe gives`, () => {
      const r = interpret(readFileSync(path.join(dir, f), 'utf8'));
      const want = expected[f];
      expect(errors(r)).toEqual([]);
      expect(r.facts.toolsUsed).toEqual(want.tools);
      expect(r.moves.arcs.count).toBe(want.arcs);
      // the inch program writes 3 decimals of an inch: 25 mm is 0.984 in, 0.03 mm off per radius
      if (want.arcLengthMm !== undefined) expect(Math.abs(totals(r).arc - want.arcLengthMm)).toBeLessThan(0.1);
      // the program ends with M30 on its second-last line (the last is the closing %)
      expect(r.moves.kind[r.moves.count - 1]).toBe(MoveKind.programEnd);
      expect(r.moves.line[r.moves.count - 1]).toBe(r.facts.lineCount - 1);
    });
  }
  it('the inch program declares inch', () => {
    const r = interpret(readFileSync(path.join(dir, 'cutting-boards-hdpe-12mm-inch.nc'), 'utf8'));
    expect(r.facts.units).toBe('inch');
  });
});

describe('generateProgram', () => {
  it('writes exactly the lines asked for, deterministically per seed', () => {
    const a = generateProgram(5000, 3);
    expect(a.split('\n').length - 1).toBe(5000);
    expect(generateProgram(5000, 3)).toBe(a);
    expect(generateProgram(5000, 4)).not.toBe(a);
    const r = interpret(a);
    expect(errors(r)).toEqual([]);
    expect(r.facts.lineCount).toBe(5000);
  });

  it('an inch rendering of the same job gives the same path within output rounding (1 in = 25.4 mm)', () => {
    const mm = interpret(generateProgram(3000, 9, { ...DEFAULT_DIALECT, decimals: 4 }));
    const inch = interpret(generateProgram(3000, 9, { ...DEFAULT_DIALECT, units: 'inch', decimals: 4 }));
    expect(inch.moves.count).toBe(mm.moves.count);
    // 5 decimals of an inch round to ±0.000127 mm per coordinate
    for (let i = 0; i < mm.moves.count; i += 7) {
      expect(Math.abs(inch.moves.x[i] - mm.moves.x[i])).toBeLessThan(2e-4);
      expect(Math.abs(inch.moves.y[i] - mm.moves.y[i])).toBeLessThan(2e-4);
    }
    expect(totals(inch).feed).toBeCloseTo(totals(mm).feed, 0);
  });
});

describe('progress and cancel', () => {
  const text = generateProgram(20_000, 2);
  it('calls onProgress every progressEvery lines, then once at the end', () => {
    const calls: Array<[number, number]> = [];
    interpret(text, { progressEvery: 5000, onProgress: (d, t) => calls.push([d, t]) });
    expect(calls).toEqual([
      [5000, 20000],
      [10000, 20000],
      [15000, 20000],
      [20000, 20000],
      [20000, 20000],
    ]);
  });
  it('stops at the next check after the signal is aborted and says cancelled', () => {
    const signal = { aborted: false };
    const r = interpret(text, {
      progressEvery: 1000,
      signal,
      onProgress: (d) => {
        if (d >= 3000) signal.aborted = true;
      },
    });
    expect(r.cancelled).toBe(true);
    expect(Math.max(...r.moves.line)).toBeLessThanOrEqual(4000);
    expect(interpret(text).cancelled).toBe(false);
  });
});

describe('move list builder', () => {
  it('grows past its capacity, trims on finish and keeps the chain', () => {
    const b = createMoveListBuilder({ x: 0, y: 0, z: 5 }, 16);
    for (let i = 1; i <= 100; i++) b.push(MoveKind.feed, i, 0, 5, 600, i);
    b.pushArc(110, 10, 5, 600, 101, 0, 1, 18000, 100, 10, 5, 10, Math.PI / 2, 0);
    b.pushAtRest(MoveKind.dwell, 102, 0, 1, 18000, 1.5);
    const m = b.finish();
    expect(m.count).toBe(102);
    expect(m.x.length).toBe(102);
    expect(m.arcs.count).toBe(1);
    expect(moveLength(m, 0)).toBe(1);
    expect(moveLength(m, 100)).toBeCloseTo((Math.PI / 2) * 10, 12);
    expect([m.x[101], m.y[101], m.aux[101]]).toEqual([110, 10, 1.5]);
    // struct of arrays: 44 bytes per move plus 45 per arc row
    expect(moveListBytes(m)).toBe(102 * 44 + 45);
  });
});
