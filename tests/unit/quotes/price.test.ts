// The price build-up against a worked example written out by hand (every step below), the
// rounding rules, ⌈⌉ of sheets and integer money. The shop figures are the shop_settings
// defaults (common practice, from memory; db/schema.ts) except where a step says otherwise.
import { describe, expect, it } from 'vitest';
import { buildPrice, formatMoney, mulDivRound, roundToStep, type PriceFigures, type PriceInputs } from '@/lib/quotes/price';

const settings = {
  setupS: 900,
  loadUnloadSPerSheet: 240,
  wasteAllowanceBp: 1000,
  marginBp: 2500,
  taxBp: 2000,
  roundToMinor: 100,
  roundingMode: 'nearest' as const,
  labourRateMinorPerHour: 4000,
  tapeGlueSPerPart: 40,
  tabSPerTab: 12,
  skinSPerPart: 20,
  clampsSPerSheet: 120,
  tapeCostMinorPerM2: 300,
  glueCostMinorPerPart: 5,
};

// Shelf brackets: the program cuts 12 brackets of 300 × 200 mm from one sheet in 1 234.4 s.
const figures: PriceFigures = {
  estimateId: 1,
  secondsPerSheet: 1234.4,
  estimatePartCount: 12,
  estimateTabCount: 0,
  estimatePartsAreaMm2: 12 * 300 * 200,
  machineName: 'Router 1',
  machineRateMinorPerHour: 6000,
  materialName: '18 mm birch plywood',
  materialCostMinorPerSheet: 4500,
  currency: 'EUR',
  settings,
};

const inputs: PriceInputs = {
  quantity: 50,
  partsPerSheet: 12,
  holdDown: 'tape-glue',
  extraLines: [{ label: 'Edge sanding', amountMinor: 1500 }],
};

const amount = (r: ReturnType<typeof buildPrice>, key: string) => r.lines.find((l) => l.key === key)?.amountMinor;

describe('buildPrice: worked example', () => {
  const r = buildPrice(inputs, figures);

  it('sheets = ⌈50 ÷ 12⌉ = ⌈4.17⌉ = 5', () => {
    expect(r.sheets).toBe(5);
  });
  it('machine time = 1234.4 × 5 + 900 + 240 × 5 = 6172 + 900 + 1200 = 8272 s', () => {
    expect(r.machineS).toBe(8272);
  });
  it('machine = 8272 s × 6000 / 3600 = 13 786.67 → 13 787 (half up)', () => {
    expect(amount(r, 'machine')).toBe(13787);
  });
  it('material = 5 × 4500 × 1.10 = 24 750', () => {
    expect(amount(r, 'material')).toBe(24750);
  });
  it('hold-down labour = 12 × 40 s × 5 sheets = 2400 s × 4000 / 3600 = 2666.67 → 2667', () => {
    expect(r.holdDownS).toBe(2400);
    expect(amount(r, 'hold-down-labour')).toBe(2667);
  });
  it('consumables = (0.72 m² × 300 = 216 tape + 12 × 5 = 60 glue) × 5 = 1380', () => {
    expect(amount(r, 'consumables')).toBe(1380);
  });
  it('subtotal = 13 787 + 24 750 + 2667 + 1380 + 1500 = 44 084; margin 25 % = 11 021', () => {
    expect(r.subtotalMinor).toBe(44084);
    expect(r.marginMinor).toBe(11021);
  });
  it('net = 55 105 rounded to the nearest 100 = 55 100 (rounding −5); tax 20 % = 11 020; total 66 120', () => {
    expect(r.roundingMinor).toBe(-5);
    expect(r.netMinor).toBe(55100);
    expect(r.taxMinor).toBe(11020);
    expect(r.totalMinor).toBe(66120);
  });
  it('every money line is an integer and the lines explain themselves', () => {
    for (const l of r.lines) {
      if (l.amountMinor !== null) expect(Number.isSafeInteger(l.amountMinor)).toBe(true);
      expect(l.arithmetic.length).toBeGreaterThan(0);
    }
    expect(r.lines.find((l) => l.key === 'machine')!.arithmetic).toBe('8272 s ÷ 3600 × EUR 60.00 per hour = EUR 137.87');
    expect(r.lines.find((l) => l.key === 'sheets')!.arithmetic).toBe('⌈50 pieces ÷ 12 per sheet⌉ = 5');
  });
});

describe('buildPrice: rules', () => {
  it('rounding up: 55 105 → 55 200, tax 20 % = 11 040, total 66 240', () => {
    const r = buildPrice(inputs, { ...figures, settings: { ...settings, roundingMode: 'up' } });
    expect(r.netMinor).toBe(55200);
    expect(r.totalMinor).toBe(66240);
  });
  // the worked example's net (55 105) rounds down to 100; these steps make it round up, so a
  // rounding that truncates instead of going half up shows in a whole quote, not only in the helper
  it('nearest 200: 55 105 = 275.525 steps → 276 × 200 = 55 200 (rounding +95); tax 20 % = 11 040, total 66 240', () => {
    const r = buildPrice(inputs, { ...figures, settings: { ...settings, roundToMinor: 200 } });
    expect([r.netMinor, r.roundingMinor, r.taxMinor, r.totalMinor]).toEqual([55200, 95, 11040, 66240]);
  });
  it('nearest 10: 55 105 is exactly half a step, and half goes up (price.ts header, not to even) → 55 110; tax 11 022, total 66 132', () => {
    const r = buildPrice(inputs, { ...figures, settings: { ...settings, roundToMinor: 10 } });
    expect([r.netMinor, r.roundingMinor, r.taxMinor, r.totalMinor]).toEqual([55110, 5, 11022, 66132]);
  });
  it('no rounding with roundToMinor 1', () => {
    const r = buildPrice(inputs, { ...figures, settings: { ...settings, roundToMinor: 1 } });
    expect(r.netMinor).toBe(55105);
    expect(r.roundingMinor).toBe(0);
  });
  it('sheets: an exact multiple needs no extra sheet; one more piece does', () => {
    expect(buildPrice({ ...inputs, quantity: 48 }, figures).sheets).toBe(4);
    expect(buildPrice({ ...inputs, quantity: 49 }, figures).sheets).toBe(5);
    expect(buildPrice({ ...inputs, quantity: 1 }, figures).sheets).toBe(1);
  });
  it('tabs: the estimate\'s 24 tabs on 6 parts scale to 48 on 12 parts per sheet; 48 × 12 s × 1 sheet = 576 s', () => {
    const r = buildPrice({ ...inputs, quantity: 12, holdDown: 'tabs', extraLines: [] }, { ...figures, estimatePartCount: 6, estimateTabCount: 24 });
    expect(r.holdDownS).toBe(576);
    // 576 × 4000 / 3600 = 640
    expect(amount(r, 'hold-down-labour')).toBe(640);
    expect(amount(r, 'consumables')).toBeUndefined();
  });
  it('half-up integer rounding helpers', () => {
    expect(mulDivRound(1, 1, 2)).toBe(1); // 0.5 → 1
    expect(mulDivRound(1, 1, 3)).toBe(0); // 0.33 → 0
    expect(roundToStep(150, 100, 'nearest')).toBe(200);
    expect(roundToStep(149, 100, 'nearest')).toBe(100);
    expect(roundToStep(101, 100, 'up')).toBe(200);
    expect(roundToStep(100, 100, 'up')).toBe(100);
  });
  it('money is printed from integers with the currency\'s minor digits (ISO 4217: EUR 2, JPY 0)', () => {
    expect(formatMoney(123450, 'EUR')).toBe('EUR 1,234.50');
    expect(formatMoney(5, 'EUR')).toBe('EUR 0.05');
    expect(formatMoney(1234, 'JPY')).toBe('JPY 1,234');
    expect(formatMoney(-5, 'EUR')).toBe('EUR −0.05');
  });
  it('frozen figures: the JSON copy stored with a quote gives the same total after the shop changes its settings', () => {
    const frozen = JSON.parse(JSON.stringify(figures)) as PriceFigures;
    const before = buildPrice(inputs, frozen).totalMinor;
    // the shop later raises its margin and the machine is recalibrated: the live figures move
    const live = { ...figures, secondsPerSheet: 1500, settings: { ...settings, marginBp: 4000 } };
    expect(buildPrice(inputs, live).totalMinor).not.toBe(before);
    expect(buildPrice(inputs, frozen).totalMinor).toBe(66120);
  });
  it('refuses bad inputs naming the field', () => {
    expect(() => buildPrice({ ...inputs, quantity: 0 }, figures)).toThrow(/quantity/);
    expect(() => buildPrice({ ...inputs, partsPerSheet: 2.5 }, figures)).toThrow(/partsPerSheet/);
    expect(() => buildPrice({ ...inputs, extraLines: [{ label: 'x', amountMinor: 1.5 }] }, figures)).toThrow(/extraLines\.0\.amountMinor/);
  });
});
