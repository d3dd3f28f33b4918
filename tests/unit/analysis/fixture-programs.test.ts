// Fixture programs of our own with known answers (fixtures/programs/checks, fixtures/nest-sheet.ts),
// run through the interpreter first and then through the checks.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { generateNestSheet } from '@/fixtures/nest-sheet';
import { generateProgram, nestExtentMm, sheetsIn } from '@/fixtures/program-generator';
import { analyze, type AnalysisInput, type HoldDownMethod } from '@/lib/analysis';
import { interpret } from '@/lib/gcode';
import { job } from './support/jobs';

const dir = path.resolve(__dirname, '../../../fixtures/programs/checks');
const load = (name: string) => {
  const r = interpret(readFileSync(path.join(dir, name), 'utf8'));
  expect(r.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
  return r.moves;
};
const kinds = (r: ReturnType<typeof analyze>) => r.findings.map((f) => f.kind);

// plate: 100 × 60 mm tool path, hole tool path radius 10, tool 6.35 mm (closed form of the finished part)
const PLATE_AREA = (100 - 6.35) * (60 - 6.35) - Math.PI * (10 + 3.175) ** 2;
const CHORD = 2 * Math.PI * 13.175 * 0.015 + 0.01;

describe('rectangles with and without tabs', () => {
  it('four tabs on the last pass hold the plate; the hole is cut first, so no cut-order error', () => {
    const r = analyze(load('plate-with-hole-tabs.nc'), job(18, 'clamps'));
    expect(r.parts).toHaveLength(1);
    const p = r.parts[0];
    expect(Math.abs(p.areaMm2 - PLATE_AREA)).toBeLessThan(CHORD);
    expect(p).toMatchObject({ holes: 1, tabs: 4, held: true, holdBy: 'tabs', freedAtLine: null, skinMm: 0 });
    for (const t of p.tabDetails) {
      expect(t.lengthMm).toBeCloseTo(8, 6);
      expect(t.heightMm).toBeCloseTo(18.3 - 15.3 - 0.3, 6); // tab top at Z −15.3, sheet bottom at −18
    }
    expect(kinds(r)).not.toContain('cut-order');
    expect(kinds(r)).not.toContain('unheld-part');
    // the hole's slug has no tabs: loose under clamps
    expect(r.findings.find((f) => f.kind === 'loose-slug')).toMatchObject({ severity: 'warning', line: 12, part: 1 });
  });

  it('the same plate without tabs is freed by its last line and held by nothing under clamps', () => {
    const r = analyze(load('plate-with-hole-through.nc'), job(18, 'clamps'));
    expect(r.parts).toHaveLength(1);
    expect(Math.abs(r.parts[0].areaMm2 - PLATE_AREA)).toBeLessThan(CHORD);
    expect(r.parts[0]).toMatchObject({ tabs: 0, held: false, holdBy: 'none', freedAtLine: 23, order: 1 });
    const f = r.findings.find((x) => x.kind === 'unheld-part')!;
    expect(f).toMatchObject({ severity: 'error', line: 23, part: 1 });
    expect(f.message).toMatch(/clamps/);
  });
});

describe('cut order', () => {
  it('a hole cut after the outside profile is a cut-order error at the hole, naming the profile\'s line', () => {
    const r = analyze(load('hole-after-profile.nc'), job(18, 'tape-glue'));
    expect(r.parts).toHaveLength(1);
    expect(r.parts[0].freedAtLine).toBe(11);
    const f = r.findings.find((x) => x.kind === 'cut-order')!;
    expect(f).toMatchObject({ severity: 'error', part: 1 });
    expect(f.line).toBeGreaterThan(11);
    expect(f.message).toContain('line 11');
    // its own line is the finding's line, shown beside it: the sentence does not repeat it
    expect(f.message).not.toContain(`line ${f.line}`);
    expect(f.message).toMatch(/thrown piece can hurt someone nearby/);
  });

  it('holes first, nothing reported', () => {
    expect(kinds(analyze(load('plate-with-hole-through.nc'), job(18, 'tape-glue')))).not.toContain('cut-order');
  });
});

describe('onion skin', () => {
  it('a last pass 0.3 mm above the bottom of a 3 mm sheet leaves a 0.3 mm skin that holds the part', () => {
    const r = analyze(load('onion-skin.nc'), job(3, 'skin'));
    expect(r.parts).toHaveLength(1);
    expect(r.parts[0].skinMm).toBeCloseTo(0.3, 6);
    expect(r.parts[0]).toMatchObject({ holdBy: 'skin', held: true, freedAtLine: null, tabs: 0 });
    expect(r.parts[0].areaMm2).toBeCloseTo((40 - 3.175) * (30 - 3.175), 3);
    expect(kinds(r)).not.toContain('unheld-part');
  });

  it('on a 2.5 mm sheet the same program cuts through and frees the part', () => {
    const r = analyze(load('onion-skin.nc'), job(2.5, 'skin'));
    expect(r.parts[0]).toMatchObject({ skinMm: 0, held: false, holdBy: 'none' });
  });
});

describe('rapid through stock', () => {
  it('a G0 in XY at Z −6 over a 12 mm sheet is a rapid-in-stock error on its line', () => {
    const r = analyze(load('rapid-through-stock.nc'), job(12, 'vacuum'));
    const f = r.findings.filter((x) => x.kind === 'rapid-in-stock');
    expect(f).toHaveLength(1);
    expect(f[0]).toMatchObject({ severity: 'error', line: 9 });
    expect(f[0].message).toMatch(/below the stock top/);
  });
});

describe('inch program', () => {
  it('a G20 plate gives the same part as in mm: (4 in − d)(2.5 in − d) − π(0.5 in + d/2)²', () => {
    const r = analyze(load('inch-plate.nc'), job(19.05, 'tape-glue'));
    expect(r.parts).toHaveLength(1);
    const exact = (4 * 25.4 - 6.35) * (2.5 * 25.4 - 6.35) - Math.PI * (0.5 * 25.4 + 3.175) ** 2;
    expect(Math.abs(r.parts[0].areaMm2 - exact)).toBeLessThan(2 * Math.PI * 15.875 * 0.015 + 0.01);
    expect(r.parts[0]).toMatchObject({ holes: 1, held: true, holdBy: 'tape-glue', freedAtLine: 16 });
  });
});

describe('a sheet of 40 small nested parts', () => {
  const nest = generateNestSheet();
  const moves = interpret(nest.text).moves;
  const input = (holdDown: HoldDownMethod): AnalysisInput => ({
    sheet: nest.sheet, zZero: 'top', holdDown, tools: [{ number: 1, diameterMm: 3.175, flutes: 2, kind: 'compression' }],
  });

  it('finds every part with area W·H − πR² and one hole each, in cutting order', () => {
    const r = analyze(moves, input('tape-glue'));
    expect(r.parts).toHaveLength(40);
    const expected = nest.parts[0].areaMm2;
    for (const p of r.parts) {
      expect(Math.abs(p.areaMm2 - expected)).toBeLessThan(2 * Math.PI * 4 * 0.015 + 0.01);
      expect(p.holes).toBe(1);
      expect(p.held).toBe(true);
    }
    expect(r.parts.map((p) => p.order)).toEqual(r.parts.map((_, i) => i + 1));
    const lines = r.parts.map((p) => p.freedAtLine!);
    expect(lines).toEqual([...lines].sort((a, b) => a - b));
    expect(r.parts[0].bbox.minX).toBeCloseTo(nest.parts[0].minX, 6);
    expect(r.parts[0].bbox.maxY).toBeCloseTo(nest.parts[0].maxY, 6);
  });

  it('under vacuum every 950 mm² part is unheld with the defaults, and every slug is loose', () => {
    const r = analyze(moves, input('vacuum'));
    expect(r.summary.partsUnheld).toBe(40);
    expect(r.summary.looseSlugs).toBe(40);
  });

  it('with tabs on the last pass the same nest is held by tabs', () => {
    const tabbed = generateNestSheet({ tabsPerSide: 1 });
    const r = analyze(interpret(tabbed.text).moves, input('tabs'));
    expect(r.parts).toHaveLength(40);
    expect(r.parts.every((p) => p.holdBy === 'tabs' && p.tabs === 4)).toBe(true);
  });

  it('holes cut last: a cut-order error for every part', () => {
    const wrong = generateNestSheet({ holesLast: true });
    const r = analyze(interpret(wrong.text).moves, { ...input('tape-glue'), settings: { maxFindingsPerKind: 100 } });
    expect(r.findings.filter((f) => f.kind === 'cut-order')).toHaveLength(40);
  });
});

describe('the generated benchmark program (fixtures/program-generator.ts)', () => {
  // 20,000 lines: about 180 parts, past the 72 of one sheet, so the nest moves on to new sheet origins
  const text = generateProgram(20_000, 5);
  const started = text.match(/\(part at /g)!.length;
  const sheets = sheetsIn(text);
  const r = analyze(interpret(text).moves, job(18, 'clamps', { sheet: { ...nestExtentMm(sheets), thicknessMm: 18 } }));

  it('spans more than one sheet, and no profile cuts across another', () => {
    expect(sheets).toBeGreaterThan(1);
    expect(r.findings.filter((f) => f.kind === 'crossing-cuts')).toEqual([]);
    // the generator writes whole parts only: every one it started is found
    expect(r.parts.length).toBe(started);
    const boxes = r.parts.map((p) => p.bbox).sort((a, b) => a.minX - b.minX || a.minY - b.minY);
    for (let i = 0; i < boxes.length; i++)
      for (let j = i + 1; j < boxes.length && boxes[j].minX < boxes[i].maxX; j++)
        expect(boxes[j].minY >= boxes[i].maxY || boxes[j].maxY <= boxes[i].minY).toBe(true);
  });

  it('its stepdowns leave the tabs standing: every part is held by its 4 tabs, none is freed', () => {
    expect(r.parts.every((p) => p.holes === 1 && p.holdBy === 'tabs' && p.tabs === 4 && p.freedAtLine === null)).toBe(true);
    // tab top at Z −15 over an 18 mm sheet (BIRCH_18: tab height 3 mm)
    for (const p of r.parts) for (const t of p.tabDetails) expect(t.heightMm).toBeCloseTo(3, 6);
    expect(r.findings.filter((f) => f.kind === 'unheld-part' || f.kind === 'rapid-in-stock' || f.kind === 'cut-order')).toEqual([]);
  });
});
