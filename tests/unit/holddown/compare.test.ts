// The hold-down comparison (lib/holddown/compare.ts) on the issue's worked example, run
// through the real engine: a sheet of 64 parts of 26.8 × 24.8 mm (finished) cut from 3 mm
// acrylic with a 3.175 mm up-cut tool (fixtures/price-tag-nest.ts, Router 1's T2), and each
// method's cost arithmetic written out by hand.
//
// Sources of the figures checked:
// - vacuum hold: F = μ·ΔP·A (PRODUCT.md trade facts; docs/references.md, Hold-down), with the
//   analysis's defaults μ = 0.45 and a 45 N side force (common practice, no published value);
//   1 kPa × 1 mm² = 10⁻³ N (NIST SP 811 unit conversions).
// - the labour and consumable defaults are the shop_settings column defaults (db/schema.ts,
//   common practice from memory): 40 s per taped part, 120 s per clamped sheet, 20 s per
//   skinned part, 12 s per tab, tape 300 minor units per m², glue 5 per part, labour 4000/h.
// - money: integer minor units, ⌊(s × rate + 1800) ÷ 3600⌋ (half up), as the quote's price.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { shopSettings } from '@/db/schema';
import { priceTagNest } from '@/fixtures/price-tag-nest';
import { holdMethods, type HoldMethodsJob } from '@/lib/estimate/hold-methods';
import { runEstimate } from '@/lib/estimate/run-estimate';
import { compareHoldDowns, type CompareSettings } from '@/lib/holddown/compare';
import { partRuns, RULE_OUT_REASONS, ruleOutQuerySchema, ruleOutReasons } from '@/lib/holddown/rule-out';
import type { HoldMethodsDoc } from '@/lib/holddown/types';
import { machineProfileSchema } from '@/lib/validation/machine-profile';

const root = path.resolve(__dirname, '../../..');
const router1 = machineProfileSchema.parse(JSON.parse(readFileSync(path.join(root, 'fixtures/machines/router-1.json'), 'utf8')));

/** the column defaults of shop_settings (db/schema.ts) */
const col = (c: { default: unknown }) => c.default as number;
const DEFAULTS: CompareSettings = {
  tapeGlueSPerPart: col(shopSettings.tapeGlueSPerPart),
  tabSPerTab: col(shopSettings.tabSPerTab),
  skinSPerPart: col(shopSettings.skinSPerPart),
  clampsSPerSheet: col(shopSettings.clampsSPerSheet),
  tapeCostMinorPerM2: col(shopSettings.tapeCostMinorPerM2),
  glueCostMinorPerPart: col(shopSettings.glueCostMinorPerPart),
  labourRateMinorPerHour: col(shopSettings.labourRateMinorPerHour),
};

function analysed(job: HoldMethodsJob, text = priceTagNest().text): HoldMethodsDoc {
  const run = runEstimate(text, router1, job, { name: 'nest.nc', sha256: '0'.repeat(64) });
  return holdMethods({ moves: run.interpretation.moves, profile: router1, job, base: run.checks, achievedCuttingFeedMmPerMin: run.report.cuttingFeed.achievedMmPerMin });
}

const SHEET = { widthMm: 1250, lengthMm: 2500, thicknessMm: 3 };
const job60: HoldMethodsJob = { sheet: SHEET, zero: 'top', hold: 'vacuum', vacuumKpa: 60, machineVacuumKpa: 61 };

describe('the worked example: 64 parts of 26.8 × 24.8 mm from 3 mm sheet, 3.175 mm up-cut tool', () => {
  const doc = analysed(job60);
  const cmp = compareHoldDowns({ doc, settings: DEFAULTS, machineRateMinorPerHour: 9500, currency: 'EUR', quantity: 240 });
  const opt = (id: string) => cmp.options.find((o) => o.method === id)!;

  it('uses the schema defaults the issue means (common practice)', () => {
    expect(DEFAULTS).toEqual({ tapeGlueSPerPart: 40, tabSPerTab: 12, skinSPerPart: 20, clampsSPerSheet: 120, tapeCostMinorPerM2: 300, glueCostMinorPerPart: 5, labourRateMinorPerHour: 4000 });
  });

  it('finds the 64 parts at their finished area, 26.8 × 24.8 = 664.64 mm²', () => {
    expect(doc.parts).toHaveLength(64);
    for (const p of doc.parts) expect(p.areaMm2).toBeCloseTo(664.64, 0);
    expect(cmp.sheets).toBe(4); // ⌈240 ÷ 64⌉
  });

  it('vacuum at 60 kPa holds none: 0.45 × 60 kPa × 664.64 mm² = 17.9 N, less than 45 N; each part says so', () => {
    const v = opt('vacuum');
    expect(v.vacuumKpa).toBe(60);
    expect(v.heldParts).toHaveLength(0);
    expect(v.unheldParts).toHaveLength(64);
    const hand = 0.45 * 60 * 664.64 * 1e-3; // N
    expect(hand).toBeCloseTo(17.945, 3);
    expect(hand).toBeLessThan(45);
    expect(v.unheldParts[0]!.reason).toMatch(/^area 665 mm²: vacuum at 60\.0 kPa holds 17\.9 N .*the cutter T2 pushes 45 N$/);
    // at the machine's own 61 kPa: 18.2 N, still short
    const vm = opt('vacuum-machine');
    expect(vm.vacuumKpa).toBe(61);
    expect(vm.unheldParts).toHaveLength(64);
    expect(vm.unheldParts[0]!.reason).toContain('holds 18.2 N');
    expect(v.ruledOut).toMatch(/^does not hold 64 of 64 parts \(part 1: area 665 mm²/);
  });

  it('clamps hold none and warn of sheet lift (up-cut tool, 3 mm sheet held at its edges)', () => {
    const c = opt('clamps');
    expect(c.unheldParts).toHaveLength(64);
    expect(c.unheldParts[0]!.reason).toMatch(/clamps or screws hold the sheet, not a part cut free of it/);
    expect(c.warnings.some((w) => /Up-cut tool T2 cuts through the 3\.0 mm sheet .* clamps at the sheet edge/.test(w))).toBe(true);
  });

  it('tape and glue holds all 64 and is recommended; its labour is 64 × the per-part setting', () => {
    const t = opt('tape-glue');
    expect(t.heldParts).toHaveLength(64);
    expect(t.unheldParts).toHaveLength(0);
    expect(t.warnings).toEqual([]);
    expect(t.labourSeconds).toBe(64 * DEFAULTS.tapeGlueSPerPart); // 2560 s
    expect(cmp.recommended).toBe('tape-glue');
    expect(t.ruledOut).toBeNull();
    expect(cmp.runnerUp).toBeNull(); // nothing else holds every part
    expect(cmp.note).toMatch(/^Suggested: tape and glue, the cheapest method that holds all 64 parts and raises no error/);
    expect(cmp.note).toMatch(/aid, not a guarantee.*seal, the spoilboard and the pump.*operator decides/);
  });

  it('the program’s tabs and onion skin hold none: it leaves neither, and no skin pass is invented', () => {
    expect(opt('tabs').unheldParts).toHaveLength(64);
    expect(opt('tabs').labourSeconds).toBe(0);
    const s = opt('skin');
    expect(s.unheldParts).toHaveLength(64);
    expect(s.machineSecondsDelta).toBe(0);
    expect(s.machineArithmetic).toMatch(/leaves no onion skin/);
  });
});

describe('each method’s cost arithmetic (defaults, labour 4000/h, machine 9500/h, 240 pieces = 4 sheets)', () => {
  const cmp = compareHoldDowns({ doc: analysed(job60), settings: DEFAULTS, machineRateMinorPerHour: 9500, currency: 'EUR', quantity: 240 });
  const opt = (id: string) => cmp.options.find((o) => o.method === id)!;

  it('vacuum: no hand work, no consumables', () => {
    expect([opt('vacuum').costMinor, opt('vacuum').jobCostMinor]).toEqual([0, 0]);
  });

  it('tape and glue: 2560 s labour + tape on 42 537 mm² + glue on 64 parts', () => {
    // labour 2560 s × 4000/h = 2844.44 → 2844; tape 42 537 mm² (64 × 664.64, half up) × 300/m² = 12.76 → 13; glue 64 × 5 = 320
    const t = opt('tape-glue');
    const area = Math.floor(cmpArea() + 0.5);
    expect(Math.abs(area - 42537)).toBeLessThanOrEqual(2);
    const tape = Math.floor((300 * area + 500_000) / 1_000_000);
    expect(tape).toBe(13);
    expect(t.consumablesMinor).toBe(tape + 320);
    expect(t.costMinor).toBe(2844 + tape + 320);
    // 4 sheets: 10 240 s → 11 377.78 → 11 378; consumables 4 × 333
    expect(t.jobCostMinor).toBe(11378 + 4 * (tape + 320));
  });

  it('clamps: 120 s per sheet', () => {
    // 120 s × 4000/h = 133.33 → 133; 480 s → 533.33 → 533
    expect([opt('clamps').labourSeconds, opt('clamps').costMinor, opt('clamps').jobCostMinor]).toEqual([120, 133, 533]);
  });

  it('onion skin: 20 s per part, no machine time where the program leaves no skin', () => {
    // 64 × 20 = 1280 s → 1422.22 → 1422; 5120 s → 5688.89 → 5689
    expect([opt('skin').labourSeconds, opt('skin').costMinor, opt('skin').jobCostMinor]).toEqual([1280, 1422, 5689]);
  });

  it('tabs: 12 s per tab on a program with tabs, and a skin pass timed at the achieved feed where it leaves a skin', () => {
    const tabsText = readFileSync(path.join(root, 'fixtures/programs/checks/plate-with-hole-tabs.nc'), 'utf8');
    const tabsDoc = analysed({ sheet: { widthMm: 600, lengthMm: 400, thicknessMm: 18 }, zero: 'top', hold: 'tabs', vacuumKpa: null, machineVacuumKpa: null }, tabsText);
    const tabs = compareHoldDowns({ doc: tabsDoc, settings: DEFAULTS, machineRateMinorPerHour: 9500, currency: 'EUR', quantity: 10 });
    const t = tabs.options.find((o) => o.method === 'tabs')!;
    expect(tabsDoc.parts[0]!.tabs).toBe(4);
    // 4 tabs × 12 s = 48 s → 48 × 4000 / 3600 = 53.33 → 53; 10 sheets: 480 s → 533
    expect([t.labourSeconds, t.costMinor, t.jobCostMinor]).toEqual([48, 53, 533]);
    expect(t.heldParts).toHaveLength(1);
    expect(t.heldParts[0]!.reason).toBe('held by 4 tabs the program leaves on it');

    const skinText = readFileSync(path.join(root, 'fixtures/programs/checks/onion-skin.nc'), 'utf8');
    const skinDoc = analysed({ sheet: { widthMm: 600, lengthMm: 400, thicknessMm: 3 }, zero: 'top', hold: 'skin', vacuumKpa: null, machineVacuumKpa: null }, skinText);
    const skin = compareHoldDowns({ doc: skinDoc, settings: DEFAULTS, machineRateMinorPerHour: 9500, currency: 'EUR', quantity: 1 }).options.find((o) => o.method === 'skin')!;
    const p = skinDoc.parts[0]!;
    expect(p.skinMm).toBeGreaterThan(0);
    const want = (p.perimeterMm / skinDoc.achievedCuttingFeedMmPerMin!) * 60; // length ÷ feed
    expect(skin.machineSecondsDelta).toBeCloseTo(want, 9);
    const s = Math.floor(want + 0.5);
    expect(skin.costMinor).toBe(Math.floor((20 * 4000 + 1800) / 3600) + Math.floor((s * 9500 + 1800) / 3600));
    expect(skin.heldParts).toHaveLength(1);
  });

  function cmpArea() {
    return analysed(job60).parts.reduce((sum, p) => sum + p.areaMm2, 0);
  }
});

describe('no method holds every part', () => {
  it('says which parts fail under each and what would change the verdict', () => {
    const doc = analysed(job60);
    // the demo's nest with tape and glue ruled out for the job (as the program page's "Methods
    // this job cannot use" asks the route): the one method that holds any part is gone
    const cmp = compareHoldDowns({ doc, settings: DEFAULTS, machineRateMinorPerHour: 9500, currency: 'EUR', quantity: 240, excluded: ruleOutReasons(['tape-glue']) });
    expect(cmp.recommended).toBeNull();
    expect(cmp.runnerUp).toBeNull();
    expect(cmp.note).toMatch(/^No method holds every part\. Vacuum at 60\.0 kPa \(the job’s level\): 64 of 64 not held \(parts 1–64\); Vacuum at 61\.0 kPa \(the machine’s level\): 64 of 64 not held \(parts 1–64\); Tape and glue: ruled out for this job; Screws or clamps: 64 of 64 not held \(parts 1–64\);/);
    expect(cmp.options.find((o) => o.method === 'tape-glue')!.ruledOut).toBe(`ruled out for this job: ${RULE_OUT_REASONS['tape-glue']}`);
    expect(cmp.wouldChange.at(-1)).toBe('A method that does not depend on friction: tape and glue, ruled out here, holds a part by its bond whatever its size.');
    // F ÷ (μ·ΔP) = 45 N ÷ (0.45 × 60 kPa) = 1666.7 mm²
    expect(45 / (0.45 * 60e3) * 1e6).toBeCloseTo(1666.67, 1);
    expect(cmp.wouldChange[0]).toMatch(/^Larger parts: at 60\.0 kPa a part needs at least 1667 mm²/);
    expect(cmp.wouldChange.some((w) => /^Tabs or an onion skin left in the CAM program on the 64 parts/.test(w))).toBe(true);
    expect(cmp.wouldChange.some((w) => /does not depend on friction/.test(w))).toBe(true);
    expect(cmp.note).toMatch(/aid, not a guarantee/);
  });

  it('a larger part turns vacuum into the recommendation (cheapest, nothing to pay)', () => {
    const big = priceTagNest();
    const doc = analysed(job60, big.text.replace('T2 M6', 'T1 M6')); // T1: 6.35 mm compression, no sheet lift
    // still 664.64 mm² parts: vacuum fails, so tape and glue again
    expect(compareHoldDowns({ doc, settings: DEFAULTS, machineRateMinorPerHour: 9500, currency: 'EUR', quantity: 64 }).recommended).toBe('tape-glue');
    const plate = readFileSync(path.join(root, 'fixtures/programs/checks/plate-with-hole-through.nc'), 'utf8');
    const plateDoc = analysed({ sheet: { widthMm: 600, lengthMm: 400, thicknessMm: 18 }, zero: 'top', hold: 'vacuum', vacuumKpa: 60, machineVacuumKpa: 61 }, plate);
    const cmp = compareHoldDowns({ doc: plateDoc, settings: DEFAULTS, machineRateMinorPerHour: 9500, currency: 'EUR', quantity: 5 });
    // a 100 × 60 mm plate: μ·ΔP·A ≈ 0.45 × 60 kPa × ~4000 mm² ≈ 100 N ≥ 45 N
    expect(cmp.recommended).toBe('vacuum');
    expect(cmp.runnerUp).toBe('vacuum-machine');
    expect(cmp.options.find((o) => o.method === 'tape-glue')!.ruledOut).toMatch(/^holds every part but costs EUR/);
  });
});

describe('methods ruled out for the job', () => {
  it('parses ?ruleOut= as a set of method names and refuses an unknown one', () => {
    expect(ruleOutQuerySchema.parse({}).ruleOut).toEqual([]);
    expect(ruleOutQuerySchema.parse({ ruleOut: '' }).ruleOut).toEqual([]);
    expect(ruleOutQuerySchema.parse({ ruleOut: 'tape-glue, clamps,tape-glue' }).ruleOut).toEqual(['tape-glue', 'clamps']);
    const bad = ruleOutQuerySchema.safeParse({ ruleOut: 'tape-glue,glue' });
    expect(bad.success).toBe(false);
    expect(bad.error!.issues[0]!.message).toMatch(/^Not a hold-down method: glue\./);
  });

  it('names part numbers in runs', () => {
    expect(partRuns([1])).toBe('part 1');
    expect(partRuns([3, 1, 2, 7, 9, 10, 11, 12])).toBe('parts 1–3, 7, 9–12');
  });

  it('ruling out vacuum alone leaves tape and glue suggested; a ruled-out method is never suggested', () => {
    const doc = analysed(job60);
    const cmp = compareHoldDowns({ doc, settings: DEFAULTS, machineRateMinorPerHour: 9500, currency: 'EUR', quantity: 240, excluded: ruleOutReasons(['vacuum', 'vacuum-machine']) });
    expect(cmp.recommended).toBe('tape-glue');
    expect(cmp.options.find((o) => o.method === 'vacuum')!.ruledOut).toBe(`ruled out for this job: ${RULE_OUT_REASONS.vacuum}`);
    const plate = readFileSync(path.join(root, 'fixtures/programs/checks/plate-with-hole-through.nc'), 'utf8');
    const plateDoc = analysed({ sheet: { widthMm: 600, lengthMm: 400, thicknessMm: 18 }, zero: 'top', hold: 'vacuum', vacuumKpa: 60, machineVacuumKpa: 61 }, plate);
    // vacuum would be suggested (it holds the plate at no cost); ruled out, the next one that holds is
    const free = compareHoldDowns({ doc: plateDoc, settings: DEFAULTS, machineRateMinorPerHour: 9500, currency: 'EUR', quantity: 5 });
    expect(free.recommended).toBe('vacuum');
    const noVacuum = compareHoldDowns({ doc: plateDoc, settings: DEFAULTS, machineRateMinorPerHour: 9500, currency: 'EUR', quantity: 5, excluded: ruleOutReasons(['vacuum', 'vacuum-machine']) });
    expect(noVacuum.recommended).not.toMatch(/^vacuum/);
    expect(noVacuum.recommended).not.toBeNull();
  });
});
