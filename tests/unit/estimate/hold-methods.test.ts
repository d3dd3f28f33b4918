// The per-method analysis stored with an estimate (lib/estimate/hold-methods.ts). Tape and
// glue, tabs and onion skin are derived from the clamps analysis by the engine's hold rules
// (lib/analysis/checks/hold.ts, sheet-lift.ts) instead of being analysed again; every derived
// method is checked here against a full analyze() of that method on the same moves, on our own
// fixture programs (a nest of small parts, a plate with tabs, an onion-skin plate), so a change
// of the engine's rules that the derivation does not follow fails here.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { priceTagNest } from '@/fixtures/price-tag-nest';
import type { HoldDownMethod } from '@/lib/analysis';
import { HOLD_FINDING_KINDS, holdMethods, plannedMethods, type HoldMethodsJob } from '@/lib/estimate/hold-methods';
import { runEstimate } from '@/lib/estimate/run-estimate';
import { machineProfileSchema } from '@/lib/validation/machine-profile';

const root = path.resolve(__dirname, '../../..');
const router1 = machineProfileSchema.parse(JSON.parse(readFileSync(path.join(root, 'fixtures/machines/router-1.json'), 'utf8')));

/** the demo's sheet of 64 price-tag holders, cut with Router 1's 3.175 mm up-cut tool T2 */
function smallPartsNest(): string {
  return priceTagNest().text;
}

function doc(text: string, job: HoldMethodsJob) {
  const run = runEstimate(text, router1, job, { name: 'test.nc', sha256: '0'.repeat(64) });
  return { run, doc: holdMethods({ moves: run.interpretation.moves, profile: router1, job, base: run.checks, achievedCuttingFeedMmPerMin: run.report.cuttingFeed.achievedMmPerMin }) };
}

function fullAnalysis(text: string, job: HoldMethodsJob, holdDown: HoldDownMethod, vacuumKpa: number | null) {
  const run = runEstimate(text, router1, { ...job, hold: holdDown, vacuumKpa }, { name: 'test.nc', sha256: '0'.repeat(64) });
  return run.checks;
}

const cases: Array<{ name: string; text: () => string; job: HoldMethodsJob }> = [
  { name: 'the 64-part nest (tape and glue job)', text: smallPartsNest, job: { sheet: { widthMm: 300, lengthMm: 280, thicknessMm: 3 }, zero: 'top', hold: 'tape-glue', vacuumKpa: null, machineVacuumKpa: 61 } },
  { name: 'the 64-part nest (vacuum job at 60 kPa)', text: smallPartsNest, job: { sheet: { widthMm: 300, lengthMm: 280, thicknessMm: 3 }, zero: 'top', hold: 'vacuum', vacuumKpa: 60, machineVacuumKpa: 80 } },
  { name: 'a plate with tabs (tabs job)', text: () => readFileSync(path.join(root, 'fixtures/programs/checks/plate-with-hole-tabs.nc'), 'utf8'), job: { sheet: { widthMm: 600, lengthMm: 400, thicknessMm: 18 }, zero: 'top', hold: 'tabs', vacuumKpa: null, machineVacuumKpa: null } },
  { name: 'an onion-skin plate (clamps job)', text: () => readFileSync(path.join(root, 'fixtures/programs/checks/onion-skin.nc'), 'utf8'), job: { sheet: { widthMm: 600, lengthMm: 400, thicknessMm: 3 }, zero: 'top', hold: 'clamps', vacuumKpa: null, machineVacuumKpa: 61 } },
];

describe('per-method analysis: every method equals a full analysis of it', () => {
  for (const c of cases) {
    it(c.name, () => {
      const text = c.text();
      const { run, doc: d } = doc(text, c.job);
      expect(d.parts.length).toBe(run.checks.parts.length);
      expect(d.parts.length).toBeGreaterThan(0);
      for (const m of d.methods) {
        const full = fullAnalysis(text, c.job, m.holdDown, m.vacuumKpa);
        const byId = new Map(full.parts.map((p) => [p.id, p.holdBy]));
        expect(m.holdBy, `${m.id}: what holds each part`).toEqual(d.parts.map((p) => byId.get(p.id)));
        const hold = full.findings.filter((f) => HOLD_FINDING_KINDS.has(f.kind)).map((f) => ({ kind: f.kind, severity: f.severity, line: f.line, message: f.message, ...(f.part === undefined ? {} : { part: f.part }) }));
        expect(m.findings, `${m.id}: hold-down findings`).toEqual(hold);
        expect(m.counts.unheldParts, `${m.id}: unheld parts`).toBe(full.summary.partsUnheld);
        expect(m.counts.looseSlugs).toBe(full.summary.looseSlugs);
        expect(m.counts.sheetLift).toBe(full.findings.filter((f) => f.kind === 'sheet-lift').length + (full.summary.suppressed['sheet-lift'] ?? 0));
      }
    });
  }
});

describe('per-method analysis: the methods and levels analysed', () => {
  it('vacuum at the job level and, when it differs, at the machine level; otherwise the machine level once', () => {
    const job: HoldMethodsJob = { sheet: null, zero: 'top', hold: 'vacuum', vacuumKpa: 60, machineVacuumKpa: 80 };
    expect(plannedMethods(job).map((p) => [p.id, p.vacuumKpa, p.vacuumSource])).toEqual([
      ['vacuum', 60, 'job'],
      ['vacuum-machine', 80, 'machine'],
      ['tape-glue', null, null],
      ['clamps', null, null],
      ['tabs', null, null],
      ['skin', null, null],
    ]);
    expect(plannedMethods({ ...job, machineVacuumKpa: 60 }).map((p) => p.id)).not.toContain('vacuum-machine');
    expect(plannedMethods({ ...job, hold: 'tape-glue', vacuumKpa: null }).slice(0, 2).map((p) => [p.id, p.vacuumKpa, p.vacuumSource])).toEqual([
      ['vacuum', 80, 'machine'],
      ['tape-glue', null, null],
    ]);
    // neither level known: the analysis's default, 18 inHg = 60.95 kPa (NIST SP 811: 1 inHg = 3386.389 Pa)
    const fallback = plannedMethods({ ...job, hold: 'clamps', vacuumKpa: null, machineVacuumKpa: null })[0]!;
    expect(fallback.vacuumSource).toBe('default');
    expect(fallback.vacuumKpa).toBeCloseTo((18 * 3386.389) / 1000, 3);
  });

  it('the nest: vacuum holds none of the 64 parts at 60 kPa, tape and glue all, clamps none with sheet lift', () => {
    const { doc: d } = doc(smallPartsNest(), cases[1]!.job);
    expect(d.parts).toHaveLength(64);
    const by = Object.fromEntries(d.methods.map((m) => [m.id, m]));
    expect(by.vacuum!.holdBy.every((h) => h === 'none')).toBe(true);
    expect(by['tape-glue']!.holdBy.every((h) => h === 'tape-glue')).toBe(true);
    expect(by.clamps!.counts.unheldParts).toBe(64);
    expect(by.clamps!.counts.sheetLift).toBe(1);
    expect(by.skin!.counts.sheetLift).toBe(0);
  });
});
