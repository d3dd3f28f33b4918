// Hold-down labour per sheet, against worked examples written out by hand. The seconds per
// part and the consumable prices are the shop_settings defaults (db/schema.ts); those are
// common-practice figures for small router shops, not measurements, so the tests state the
// arithmetic from the inputs rather than trusting any published time.
import { describe, expect, it } from 'vitest';
import { holdDownLabour, tapeCostMinor, type HoldDownLabourSettings } from '@/lib/quotes/hold-down-labour';
import { HOLD_DOWNS } from '@/lib/validation/enums';

const settings: HoldDownLabourSettings = {
  tapeGlueSPerPart: 40,
  tabSPerTab: 12,
  skinSPerPart: 20,
  clampsSPerSheet: 120,
  tapeCostMinorPerM2: 300,
  glueCostMinorPerPart: 5,
};

// Six shelf brackets of 300 mm × 200 mm on one sheet, four tabs each.
// area = 6 × 300 × 200 = 360 000 mm² = 0.36 m²
const sheet = { partCount: 6, tabCount: 24, partsAreaMm2: 6 * 300 * 200 };

describe('holdDownLabour', () => {
  it('tape and glue: 6 × 40 s = 240 s; tape 0.36 m² × 300 = 108; glue 6 × 5 = 30; consumables 138', () => {
    const r = holdDownLabour('tape-glue', sheet, settings);
    expect(r.labourS).toBe(240);
    expect(r.consumablesMinor).toBe(108 + 30);
    expect(r.steps.map((s) => s.arithmetic)).toEqual([
      '6 parts × 40 s = 240 s',
      '360000 mm² ÷ 1 000 000 × 300 per m² = 108, rounded half up = 108',
      '6 parts × 5 = 30',
    ]);
  });

  it('tabs: 24 tabs × 12 s = 288 s, no consumables', () => {
    const r = holdDownLabour('tabs', sheet, settings);
    expect(r.labourS).toBe(288);
    expect(r.consumablesMinor).toBe(0);
    expect(r.steps[0]!.arithmetic).toBe('24 tabs × 12 s = 288 s');
  });

  it('onion skin: 6 × 20 s = 120 s', () => {
    const r = holdDownLabour('skin', sheet, settings);
    expect(r.labourS).toBe(120);
    expect(r.consumablesMinor).toBe(0);
  });

  it('clamps: once per sheet, whatever the part count (120 s)', () => {
    expect(holdDownLabour('clamps', sheet, settings).labourS).toBe(120);
    expect(holdDownLabour('clamps', { partCount: 40, tabCount: 0, partsAreaMm2: 1 }, settings).labourS).toBe(120);
  });

  it('vacuum: nothing', () => {
    const r = holdDownLabour('vacuum', sheet, settings);
    expect([r.labourS, r.consumablesMinor]).toEqual([0, 0]);
    expect(r.steps).toHaveLength(1);
  });

  it('every method gives an explanation whose figures add up to the totals', () => {
    for (const m of HOLD_DOWNS) {
      const r = holdDownLabour(m, sheet, settings);
      expect(r.steps.length).toBeGreaterThan(0);
      expect(r.steps.reduce((a, s) => a + s.labourS, 0)).toBe(r.labourS);
      expect(r.steps.reduce((a, s) => a + s.consumablesMinor, 0)).toBe(r.consumablesMinor);
      expect(Number.isInteger(r.consumablesMinor)).toBe(true);
    }
  });

  it('tape cost rounds half up to a whole minor unit, in integers', () => {
    // 5 000 mm² × 100 per m² = 500 000 / 1 000 000 = 0.5 → 1
    expect(tapeCostMinor(5000, 100)).toBe(1);
    // 4 999 mm² × 100 = 0.4999 → 0
    expect(tapeCostMinor(4999, 100)).toBe(0);
    // 1 666 667 mm² × 300 = 500.0001 → 500
    expect(tapeCostMinor(1_666_667, 300)).toBe(500);
    // area rounded to whole mm² first: 4 999.5 → 5 000 → 0.5 → 1
    expect(tapeCostMinor(4999.5, 100)).toBe(1);
  });

  it('refuses counts that are not whole numbers and negative areas, naming the field', () => {
    expect(() => holdDownLabour('tabs', { ...sheet, tabCount: 2.5 }, settings)).toThrow(/tabCount/);
    expect(() => holdDownLabour('skin', { ...sheet, partCount: -1 }, settings)).toThrow(/partCount/);
    expect(() => holdDownLabour('tape-glue', { ...sheet, partsAreaMm2: -3 }, settings)).toThrow(/partsAreaMm2/);
    expect(() => holdDownLabour('tape-glue', sheet, { ...settings, glueCostMinorPerPart: 0.5 })).toThrow(/glueCostMinorPerPart/);
  });
});
