// The store between the program page's hold-down section and the viewer's parts panel
// (lib/viewer/hold-overlay.ts), fed with a real comparison of the demo's 64-part nest
// (fixtures/price-tag-nest.ts through the engine and lib/holddown/compare.ts): switching the
// method changes every part's verdict, and the panel's listeners hear each change once.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { priceTagNest } from '@/fixtures/price-tag-nest';
import { holdMethods } from '@/lib/estimate/hold-methods';
import { runEstimate } from '@/lib/estimate/run-estimate';
import { compareHoldDowns } from '@/lib/holddown/compare';
import { machineProfileSchema } from '@/lib/validation/machine-profile';
import { HoldOverlayStore, selectedMethod, verdictFor, type HoldOverlayMethod } from '@/lib/viewer/hold-overlay';
import { overlayMethods } from '@/lib/holddown/overlay';

const root = path.resolve(__dirname, '../../..');
const router1 = machineProfileSchema.parse(JSON.parse(readFileSync(path.join(root, 'fixtures/machines/router-1.json'), 'utf8')));

function comparison() {
  const job = { sheet: { widthMm: 1250, lengthMm: 2500, thicknessMm: 3 }, zero: 'top' as const, hold: 'tape-glue' as const, vacuumKpa: null, machineVacuumKpa: 61 };
  const run = runEstimate(priceTagNest().text, router1, job, { name: 'nest.nc', sha256: '0'.repeat(64) });
  const doc = holdMethods({ moves: run.interpretation.moves, profile: router1, job, base: run.checks, achievedCuttingFeedMmPerMin: 1500 });
  return { run, cmp: compareHoldDowns({ doc, settings: { tapeGlueSPerPart: 40, tabSPerTab: 12, skinSPerPart: 20, clampsSPerSheet: 120, tapeCostMinorPerM2: 300, glueCostMinorPerPart: 5, labourRateMinorPerHour: 4000 }, machineRateMinorPerHour: 9500, currency: 'EUR', quantity: 240 }) };
}

describe('hold overlay store', () => {
  it('starts on the recommended method and recolours every part on a switch', () => {
    const { run, cmp } = comparison();
    const store = new HoldOverlayStore();
    let heard = 0;
    store.subscribe(() => heard++);
    const methods: HoldOverlayMethod[] = overlayMethods(cmp);
    store.publish(12, methods, cmp.recommended);
    expect(heard).toBe(1);
    expect(store.getSnapshot().selected).toBe('tape-glue');
    // the report's parts (the viewer's rows) are the comparison's parts, by id
    for (const p of run.checks.parts) expect(verdictFor(store.getSnapshot(), p.id)).toMatchObject({ held: true });
    store.select('vacuum');
    expect(heard).toBe(2);
    for (const p of run.checks.parts) {
      const v = verdictFor(store.getSnapshot(), p.id)!;
      expect(v.held).toBe(false);
      expect(v.reason).toMatch(/^area 665 mm²: vacuum at 61\.0 kPa holds 18\.2 N/);
    }
    store.select('vacuum'); // no change, no render
    store.select('no-such-method');
    expect(heard).toBe(2);
    expect(selectedMethod(store.getSnapshot())!.label).toBe('Vacuum at 61.0 kPa (the machine’s level)');
  });

  it('keeps the choice when the same estimate is published again, and starts afresh for another', () => {
    const { cmp } = comparison();
    const store = new HoldOverlayStore();
    store.publish(12, overlayMethods(cmp), 'tape-glue');
    store.select('clamps');
    store.publish(12, overlayMethods(cmp), 'tape-glue');
    expect(store.getSnapshot().selected).toBe('clamps');
    store.publish(13, overlayMethods(cmp), 'tape-glue');
    expect(store.getSnapshot().selected).toBe('tape-glue');
    store.clear();
    expect(store.getSnapshot()).toEqual({ estimateId: null, methods: [], selected: null });
    expect(verdictFor(store.getSnapshot(), 1)).toBeNull();
  });
});
