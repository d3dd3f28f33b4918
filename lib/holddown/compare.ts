// The hold-down comparison of one stored estimate: every way of holding the parts side by side
// (vacuum at the job's level and at the machine's own, tape and glue, screws or clamps, the
// program's own tabs, onion skin), with what each holds and why, its warnings, its hand work,
// machine time and consumables, what it costs per sheet and for the job's quantity, and a
// recommendation worded as an aid. Pure: the same code on the server (GET
// /api/estimates/:id/hold-down) and in the browser (the program page, the quote builder).
//
// Inputs: the per-method analysis the estimate worker stored (lib/estimate/hold-methods.ts,
// types.ts), the shop's labour and consumable settings and labour rate (shop_settings; their
// defaults are common practice, db/schema.ts), the machine's hourly rate and the job's quantity.
//
// The model, stated once:
// - what holds a part is the engine's verdict (lib/analysis/checks/hold.ts): vacuum holds a
//   freed part when μ·ΔP·A ≥ the tool's side force; clamps hold the sheet, not a part cut free;
//   tabs and onion skin hold only where the program leaves them; tape and glue holds any part.
// - hand work per sheet and consumables per sheet: lib/quotes/hold-down-labour.ts (the quote's
//   own function, so the quote's hold-down labour for a method equals this one's).
// - machine time: only onion skin changes it, and only where the program really leaves a skin:
//   one more pass along the skinned parts' outlines at the program's achieved cutting feed
//   (length ÷ feed; corners and acceleration not counted, so it is a lower bound). Nothing is
//   added where the program leaves no skin.
// - money: integer minor units; seconds are rounded to whole seconds (half up) and priced with
//   ⌊(s × rate + 1800) ÷ 3600⌋, as the quote's price build-up does (lib/quotes/price.ts).
// - recommended: the cheapest method, for the job's quantity, that holds every part and raises
//   no error; a method whose own hold may fail (sheet lift) comes after those that have no such
//   warning. The runner-up is the next such method. Each other method says why it was ruled out.
import { fmt } from '../analysis/checks/findings';
import { cuttingForceFor, vacuumLateralHoldN } from '../analysis/checks/hold';
import { resolveSettings } from '../analysis/settings';
import { holdDownLabour, type HoldDownLabourSettings, type HoldDownLabourStep } from '../quotes/hold-down-labour';
import { formatMoney, mulDivRound } from '../quotes/price';
import type { HoldDown } from '../validation/enums';
import { partRuns } from './rule-out';
import type { HoldMethodAnalysis, HoldMethodsDoc, HoldOptionId, HoldPart } from './types';

export const HOLD_DOWN_CAUTION =
  'This comparison is an aid, not a guarantee: the vacuum figures depend on the seal, the spoilboard and the pump, the side force on the tool and the feed, and the operator decides how the sheet is held, with the machine’s manual, the shop’s safety rules and local codes.';

export interface CompareSettings extends HoldDownLabourSettings {
  labourRateMinorPerHour: number;
}

export interface CompareInput {
  doc: HoldMethodsDoc;
  settings: CompareSettings;
  machineRateMinorPerHour: number;
  currency: string;
  /** pieces the job wants */
  quantity: number;
  /** parts one sheet gives; default: the parts the program frees (the program is one sheet) */
  partsPerSheet?: number;
  /** methods ruled out for this job before any figure (no vacuum table, parts that may not be glued), with the reason */
  excluded?: Partial<Record<HoldOptionId, string>>;
}

export interface PartVerdict {
  /** the analysis's part id */
  part: number;
  /** the order the part comes free: the number the report and the viewer show */
  order: number;
  reason: string;
}

export interface HoldOption {
  method: HoldOptionId;
  /** the job's hold-down word for this method (both vacuum options are 'vacuum'): the quote's choice */
  holdDown: HoldDown;
  label: string;
  vacuumKpa: number | null;
  heldParts: PartVerdict[];
  unheldParts: PartVerdict[];
  warnings: string[];
  /** hold-down errors of this method (unheld parts), counted; program errors are the doc's */
  errorCount: number;
  /** hand work per sheet, s */
  labourSeconds: number;
  labourSteps: HoldDownLabourStep[];
  /** machine time added per sheet, s (onion skin's extra pass only) */
  machineSecondsDelta: number;
  machineArithmetic: string;
  consumablesMinor: number;
  /** per sheet: labour + machine time added + consumables */
  costMinor: number;
  /** for the job's quantity (sheets × per sheet, each time rounded once) */
  jobCostMinor: number;
  costArithmetic: string;
  holdsAll: boolean;
  /** why it is not the recommendation (null for the recommended one) */
  ruledOut: string | null;
}

export interface HoldComparison {
  currency: string;
  quantity: number;
  partsPerSheet: number;
  sheets: number;
  partCount: number;
  options: HoldOption[];
  recommended: HoldOptionId | null;
  runnerUp: HoldOptionId | null;
  /** the recommendation or the no-method-holds verdict, in words, with the caution */
  note: string;
  /** for the no-method-holds case: what would change the verdict */
  wouldChange: string[];
  /** findings of the program that no hold-down changes */
  programErrors: number;
  programWarnings: number;
  caution: string;
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;
const wholeS = (s: number) => Math.floor(s + 0.5);

function labelOf(m: HoldMethodAnalysis): string {
  const source = m.vacuumSource === 'job' ? 'the job’s level' : m.vacuumSource === 'machine' ? 'the machine’s level' : 'assumed: no level given';
  switch (m.id) {
    case 'vacuum':
    case 'vacuum-machine':
      return `Vacuum at ${fmt(m.vacuumKpa ?? 0, 1)} kPa (${source})`;
    case 'tape-glue':
      return 'Tape and glue';
    case 'clamps':
      return 'Screws or clamps';
    case 'tabs':
      return 'The program’s tabs';
    case 'skin':
      return 'Onion skin';
  }
}

/** Why this part is or is not held under this method, in words with the figures. */
export function partReason(m: HoldMethodAnalysis, part: HoldPart, holdBy: HoldMethodAnalysis['holdBy'][number], doc: HoldMethodsDoc): string {
  const area = `area ${fmt(part.areaMm2, 0)} mm²`;
  if (holdBy === 'tabs') return `held by ${plural(part.tabs, 'tab')} the program leaves on it`;
  if (holdBy === 'skin') return `held by the ${fmt(part.skinMm, 2)} mm onion skin the program leaves under it`;
  if (holdBy === 'tape-glue') return `${area}: taped and glued, held by the bond whatever its size`;
  const settings = resolveSettings({ frictionMu: doc.frictionMu, cuttingForceN: doc.cuttingForceN, cuttingForceByToolN: doc.cuttingForceByToolN });
  if (m.holdDown === 'vacuum') {
    const kPa = m.vacuumKpa ?? 0;
    const hold = vacuumLateralHoldN(kPa, part.areaMm2, doc.frictionMu);
    const force = cuttingForceFor(part.tool, settings);
    const sum = `${area}: vacuum at ${fmt(kPa, 1)} kPa holds ${fmt(hold, 1)} N (μ ${fmt(doc.frictionMu, 2)} × ${fmt(kPa, 1)} kPa × ${fmt(part.areaMm2, 0)} mm²)`;
    return holdBy === 'vacuum' ? `${sum}, at least the ${fmt(force, 0)} N the cutter T${part.tool} pushes` : `${sum}, the cutter T${part.tool} pushes ${fmt(force, 0)} N`;
  }
  switch (m.holdDown) {
    case 'clamps':
      return 'clamps or screws hold the sheet, not a part cut free of it, and the program leaves no tabs or skin on this part';
    case 'tabs':
      return 'the program leaves no tabs on this part';
    case 'skin':
      return 'the program cuts this part through and leaves no onion skin';
    default:
      return 'nothing holds it';
  }
}

function machineDelta(m: HoldMethodAnalysis, doc: HoldMethodsDoc): { seconds: number; arithmetic: string } {
  if (m.holdDown !== 'skin') return { seconds: 0, arithmetic: 'no machine time added' };
  const skinned = doc.parts.filter((p) => p.skinMm > 0);
  if (skinned.length === 0) return { seconds: 0, arithmetic: 'the program leaves no onion skin, so no skin pass is counted' };
  const feed = doc.achievedCuttingFeedMmPerMin;
  if (feed === null || !(feed > 0)) return { seconds: 0, arithmetic: 'the program has no cutting feed to time a skin pass with, so none is counted' };
  const lengthMm = skinned.reduce((sum, p) => sum + p.perimeterMm, 0);
  const seconds = (lengthMm / feed) * 60;
  return {
    seconds,
    arithmetic: `skin pass along ${plural(skinned.length, 'skinned part')}: ${fmt(lengthMm, 0)} mm ÷ ${fmt(feed, 0)} mm/min (the program’s achieved cutting feed) × 60 = ${fmt(seconds, 1)} s (length ÷ feed, no acceleration: at least this)`,
  };
}

function warningsOf(m: HoldMethodAnalysis): string[] {
  const out: string[] = [];
  for (const f of m.findings) if (f.kind === 'sheet-lift') out.push(`Line ${f.line}: ${f.message}`);
  const liftUnlisted = m.counts.sheetLift - m.findings.filter((f) => f.kind === 'sheet-lift').length;
  if (liftUnlisted > 0) out.push(`${plural(liftUnlisted, 'more sheet-lift warning')} not listed.`);
  if (m.counts.looseSlugs > 0) out.push(`${plural(m.counts.looseSlugs, 'slug')} (pieces freed from holes) not held: the cutter can throw them. Stand clear and keep the guards closed.`);
  if (m.holdDown === 'vacuum' && m.vacuumSource === 'default') out.push(`No vacuum level is known for this job or machine: ${fmt(m.vacuumKpa ?? 0, 1)} kPa (18 inHg, common practice) is assumed.`);
  return out;
}

/** The comparison; throws RangeError on a setting or figure that is not a valid amount. */
export function compareHoldDowns(input: CompareInput): HoldComparison {
  const { doc, settings } = input;
  if (!Number.isSafeInteger(input.quantity) || input.quantity < 1) throw new RangeError(`quantity must be a whole number ≥ 1 (got ${input.quantity})`);
  const partCount = doc.parts.length;
  const partsPerSheet = input.partsPerSheet ?? Math.max(1, partCount);
  if (!Number.isSafeInteger(partsPerSheet) || partsPerSheet < 1) throw new RangeError(`partsPerSheet must be a whole number ≥ 1 (got ${partsPerSheet})`);
  const sheets = Math.floor((input.quantity + partsPerSheet - 1) / partsPerSheet);
  const labourRate = input.settings.labourRateMinorPerHour;
  const machineRate = input.machineRateMinorPerHour;
  for (const [name, v] of [['labourRateMinorPerHour', labourRate], ['machineRateMinorPerHour', machineRate]] as const) {
    if (!Number.isSafeInteger(v) || v < 0) throw new RangeError(`${name} must be whole minor units ≥ 0 (got ${v})`);
  }
  const money = (m: number) => formatMoney(m, input.currency);
  const sheet = {
    partCount,
    tabCount: doc.parts.reduce((sum, p) => sum + p.tabs, 0),
    partsAreaMm2: doc.parts.reduce((sum, p) => sum + p.areaMm2, 0),
  };

  const options: HoldOption[] = doc.methods.map((m) => {
    const held: PartVerdict[] = [];
    const unheld: PartVerdict[] = [];
    doc.parts.forEach((part, i) => {
      const by = m.holdBy[i] ?? 'none';
      (by === 'none' ? unheld : held).push({ part: part.id, order: part.order, reason: partReason(m, part, by, doc) });
    });
    const labour = holdDownLabour(m.holdDown, sheet, settings);
    const delta = machineDelta(m, doc);
    const labourS = wholeS(labour.labourS);
    const deltaS = wholeS(delta.seconds);
    const labourMinor = mulDivRound(labourS, labourRate, 3600);
    const machineMinor = mulDivRound(deltaS, machineRate, 3600);
    const costMinor = labourMinor + machineMinor + labour.consumablesMinor;
    const jobLabourS = wholeS(labour.labourS * sheets);
    const jobDeltaS = wholeS(delta.seconds * sheets);
    const jobLabourMinor = mulDivRound(jobLabourS, labourRate, 3600);
    const jobMachineMinor = mulDivRound(jobDeltaS, machineRate, 3600);
    const jobConsumables = labour.consumablesMinor * sheets;
    const jobCostMinor = jobLabourMinor + jobMachineMinor + jobConsumables;
    const costArithmetic =
      `per sheet: labour ${labourS} s ÷ 3600 × ${money(labourRate)}/h = ${money(labourMinor)}` +
      ` + machine ${deltaS} s ÷ 3600 × ${money(machineRate)}/h = ${money(machineMinor)}` +
      ` + consumables ${money(labour.consumablesMinor)} = ${money(costMinor)}; ` +
      `${plural(sheets, 'sheet')}: labour ${jobLabourS} s = ${money(jobLabourMinor)} + machine ${jobDeltaS} s = ${money(jobMachineMinor)} + consumables ${sheets} × ${money(labour.consumablesMinor)} = ${money(jobConsumables)}, total ${money(jobCostMinor)}`;
    return {
      method: m.id,
      holdDown: m.holdDown,
      label: labelOf(m),
      vacuumKpa: m.vacuumKpa,
      heldParts: held,
      unheldParts: unheld,
      warnings: warningsOf(m),
      errorCount: m.counts.errors,
      labourSeconds: labour.labourS,
      labourSteps: labour.steps,
      machineSecondsDelta: delta.seconds,
      machineArithmetic: delta.arithmetic,
      consumablesMinor: labour.consumablesMinor,
      costMinor,
      jobCostMinor,
      costArithmetic,
      holdsAll: unheld.length === 0 && m.counts.unheldParts === 0,
      ruledOut: null,
    };
  });

  // the order of choice: eligible ones without a hold-may-fail warning, then eligible with one, by job cost (ties: listing order)
  const excluded = input.excluded ?? {};
  const liftOf = (o: HoldOption) => doc.methods.find((m) => m.id === o.method)!.counts.sheetLift > 0;
  const eligible = options.filter((o) => !excluded[o.method] && o.holdsAll && o.errorCount === 0);
  const ranked = [...eligible].sort((a, b) => Number(liftOf(a)) - Number(liftOf(b)) || a.jobCostMinor - b.jobCostMinor);
  const recommended = doc.sheetThicknessMm === null ? null : (ranked[0] ?? null);
  const runnerUp = recommended ? (ranked[1] ?? null) : null;
  for (const o of options) {
    if (o === recommended) continue;
    const why = excluded[o.method];
    if (why) o.ruledOut = `ruled out for this job: ${why}`;
    else if (o.unheldParts.length > 0) {
      const first = o.unheldParts[0]!;
      o.ruledOut = `does not hold ${o.unheldParts.length} of ${partCount} parts (part ${first.order}: ${first.reason})`;
    } else if (o.errorCount > 0) o.ruledOut = `raises ${plural(o.errorCount, 'error')}`;
    else if (recommended && liftOf(o) && !liftOf(recommended)) o.ruledOut = `its hold may fail: ${o.warnings[0] ?? 'sheet lift'}`;
    else if (recommended) o.ruledOut = `holds every part but costs ${money(o.jobCostMinor)} for the job against ${money(recommended.jobCostMinor)}${o === runnerUp ? ' (the runner-up)' : ''}`;
    else o.ruledOut = 'no comparison could be made';
  }

  const wouldChange: string[] = [];
  let note: string;
  const qty = `${input.quantity.toLocaleString('en')} pieces (${plural(sheets, 'sheet')} of ${partsPerSheet})`;
  if (doc.sheetThicknessMm === null) {
    note = 'The estimate was made without a sheet, so no part was analysed under any method: give the job its sheet and request a new estimate.';
  } else if (partCount === 0) {
    note = recommended
      ? `The program cuts no part free of the sheet, so every method holds what there is; the cheapest is ${recommended.label.toLowerCase()}.`
      : 'The program cuts no part free of the sheet.';
  } else if (recommended) {
    note =
      `Suggested: ${recommended.label.toLowerCase()}, the cheapest method that holds all ${partCount} parts and raises no error: ${money(recommended.costMinor)} per sheet, ${money(recommended.jobCostMinor)} for ${qty}.` +
      (runnerUp ? ` Runner-up: ${runnerUp.label.toLowerCase()} at ${money(runnerUp.jobCostMinor)}.` : ' No other method holds every part.') +
      (liftOf(recommended) ? ` It carries a warning: ${recommended.warnings[0] ?? 'sheet lift'}` : '');
  } else {
    const worst = options
      .map((o) =>
        excluded[o.method]
          ? `${o.label}: ruled out for this job`
          : o.unheldParts.length > 0
            ? `${o.label}: ${o.unheldParts.length} of ${partCount} not held (${partRuns(o.unheldParts.map((u) => u.order))})`
            : o.errorCount > 0
              ? `${o.label}: holds every part but raises ${plural(o.errorCount, 'error')}`
              : `${o.label}: holds every part`,
      )
      .join('; ');
    note = `No method holds every part. ${worst}.`;
    const vac = options.filter((o) => o.holdDown === 'vacuum' && !excluded[o.method]);
    for (const o of vac) {
      if (o.unheldParts.length === 0 || o.vacuumKpa === null) continue;
      const parts = o.unheldParts.map((u) => doc.parts.find((p) => p.id === u.part)!);
      const settingsOf = resolveSettings({ frictionMu: doc.frictionMu, cuttingForceN: doc.cuttingForceN, cuttingForceByToolN: doc.cuttingForceByToolN });
      const force = Math.max(...parts.map((p) => cuttingForceFor(p.tool, settingsOf)));
      const needMm2 = force / (doc.frictionMu * o.vacuumKpa * 1000) * 1_000_000;
      const largest = Math.max(...parts.map((p) => p.areaMm2));
      wouldChange.push(`Larger parts: at ${fmt(o.vacuumKpa, 1)} kPa a part needs at least ${fmt(needMm2, 0)} mm² (F ÷ (μ·ΔP) = ${fmt(force, 0)} N ÷ (${fmt(doc.frictionMu, 2)} × ${fmt(o.vacuumKpa, 1)} kPa)); the largest part not held has ${fmt(largest, 0)} mm².`);
      break;
    }
    const noTabs = doc.parts.filter((p) => p.tabs === 0 && p.skinMm === 0).length;
    if (noTabs > 0) wouldChange.push(`Tabs or an onion skin left in the CAM program on the ${plural(noTabs, 'part')} that have neither: they would hold under any method, at the cost of trimming per tab or a skin pass.`);
    if (excluded['tape-glue']) {
      wouldChange.push('A method that does not depend on friction: tape and glue, ruled out here, holds a part by its bond whatever its size.');
    } else if (options.some((o) => o.method === 'tape-glue' && !o.holdsAll)) {
      wouldChange.push('A method that does not depend on friction, such as tape and glue, which holds a part by its bond whatever its size.');
    }
  }
  if (doc.programErrors > 0) note += ` The program itself has ${plural(doc.programErrors, 'error')} whatever the hold-down: see the findings.`;
  note += ` ${HOLD_DOWN_CAUTION}`;

  return {
    currency: input.currency,
    quantity: input.quantity,
    partsPerSheet,
    sheets,
    partCount,
    options,
    recommended: recommended?.method ?? null,
    runnerUp: runnerUp?.method ?? null,
    note,
    wouldChange,
    programErrors: doc.programErrors,
    programWarnings: doc.programWarnings,
    caution: HOLD_DOWN_CAUTION,
  };
}
