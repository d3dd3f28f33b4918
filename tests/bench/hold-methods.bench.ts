// What the hold-down comparison adds to a stored estimate: the worker runs the through-cut
// analysis once more per method it cannot derive (lib/estimate/hold-methods.ts: vacuum at the
// job's and the machine's level, and clamps; tape and glue, tabs and onion skin are derived),
// on the move list the estimate already interpreted. Printed per program: the estimate
// (runEstimate: interpret, plan, analyse, report), holdMethods() after it, and the share it
// adds, best of 5 rounds each after a warm-up. Jobs: a vacuum job whose level (60 kPa) differs
// from the machine's (80 kPa), the most analyses holdMethods() makes (vacuum at the machine's
// level, clamps), and a tape-and-glue job (vacuum at the machine's level, clamps).
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { priceTagNest } from '@/fixtures/price-tag-nest';
import { BIRCH_18, generateProgram, nestExtentMm, sheetsIn } from '@/fixtures/program-generator';
import { loadAnalysis } from '@/lib/analysis';
import { holdMethods, type HoldMethodsJob } from '@/lib/estimate/hold-methods';
import { runEstimate } from '@/lib/estimate/run-estimate';
import { parseMachineProfile } from '@/lib/validation/machine-profile';

const ROUNDS = 5;

function best<T>(f: () => T): { ms: number; value: T } {
  let value = f();
  let ms = Infinity;
  for (let r = 0; r < ROUNDS; r++) {
    const t0 = performance.now();
    value = f();
    ms = Math.min(ms, performance.now() - t0);
  }
  return { ms, value };
}

export default async function bench(): Promise<void> {
  await loadAnalysis();
  const root = path.resolve(__dirname, '../..');
  const raw = JSON.parse(readFileSync(path.join(root, 'fixtures/machines/router-1.json'), 'utf8'));
  const parsed = parseMachineProfile(raw);
  if (!parsed.ok) throw new Error(parsed.message);
  const big = generateProgram(100_000, 7);
  const extent = nestExtentMm(sheetsIn(big));
  const bigProfile = { ...parsed.profile, travelMm: { x: extent.widthMm + 100, y: extent.lengthMm + 100, z: parsed.profile.travelMm.z } };
  const programs: Array<{ name: string; text: string; thicknessMm: number; widthMm: number; lengthMm: number; profile: typeof parsed.profile }> = [
    { name: 'shelf-brackets-birch-18mm.nc', text: readFileSync(path.join(root, 'fixtures/programs/shelf-brackets-birch-18mm.nc'), 'utf8'), thicknessMm: 18, widthMm: 1220, lengthMm: 2440, profile: parsed.profile },
    { name: 'price-tag-holders-acrylic-3mm.tap', text: readFileSync(path.join(root, 'fixtures/programs/price-tag-holders-acrylic-3mm.tap'), 'utf8'), thicknessMm: 3, widthMm: 1250, lengthMm: 2500, profile: parsed.profile },
    { name: 'sign-letters-acrylic-3mm.gcode', text: readFileSync(path.join(root, 'fixtures/programs/sign-letters-acrylic-3mm.gcode'), 'utf8'), thicknessMm: 3, widthMm: 1250, lengthMm: 2500, profile: parsed.profile },
    { name: 'cutting-boards-hdpe-12mm-inch.nc', text: readFileSync(path.join(root, 'fixtures/programs/cutting-boards-hdpe-12mm-inch.nc'), 'utf8'), thicknessMm: 12, widthMm: 1220, lengthMm: 2440, profile: parsed.profile },
    { name: 'price-tag-holders-64-up.nc (the demo nest)', text: priceTagNest().text, thicknessMm: 3, widthMm: 1250, lengthMm: 2500, profile: parsed.profile },
    { name: 'generated 100,000-line program', text: big, thicknessMm: BIRCH_18.thicknessMm, widthMm: extent.widthMm, lengthMm: extent.lengthMm, profile: bigProfile },
  ];
  const jobs: Array<{ label: string; job: Omit<HoldMethodsJob, 'sheet'> }> = [
    { label: 'vacuum job 60 kPa, machine 80 kPa', job: { zero: 'top', hold: 'vacuum', vacuumKpa: 60, machineVacuumKpa: 80 } },
    { label: 'tape-and-glue job, machine 61 kPa', job: { zero: 'top', hold: 'tape-glue', vacuumKpa: null, machineVacuumKpa: 61 } },
  ];
  for (const p of programs) {
    for (const j of jobs) {
      const job: HoldMethodsJob = { ...j.job, sheet: { widthMm: p.widthMm, lengthMm: p.lengthMm, thicknessMm: p.thicknessMm } };
      const est = best(() => runEstimate(p.text, p.profile, job, { name: p.name, sha256: '0'.repeat(64) }));
      const run = est.value;
      const hm = best(() => holdMethods({ moves: run.interpretation.moves, profile: p.profile, job, base: run.checks, achievedCuttingFeedMmPerMin: run.report.cuttingFeed.achievedMmPerMin, now: () => performance.now() }));
      const analysed = hm.value.methods.filter((m) => m.analysisMs > 0 || m.holdDown === 'vacuum' || m.id === 'clamps').length;
      console.log(
        `${p.name}, ${j.label}: ${run.interpretation.facts.lineCount.toLocaleString('en')} lines, ${run.checks.parts.length} parts; estimate ${est.ms.toFixed(1)} ms, hold-down methods ${hm.ms.toFixed(1)} ms (${analysed} of ${hm.value.methods.length} methods analysed or reused, the rest derived), +${((100 * hm.ms) / est.ms).toFixed(1)} % of the estimate`,
      );
    }
  }
}
