// Hold-down labour and consumables for ONE sheet, by hold-down method. Pure: no I/O, no
// Drizzle, the same code in the browser (quote builder, hold-down comparison) and on the
// server (stored quotes).
//
// Signature (kept stable; other modules import it):
//
//   holdDownLabour(method: HoldDownMethod, sheet: HoldDownSheet, settings: HoldDownLabourSettings): HoldDownLabour
//
//   sheet    = { partCount, tabCount, partsAreaMm2 } — the parts cut from one sheet, the tabs
//              left on them, and the parts' total area in mm² (what tape covers)
//   settings = the six shop_settings columns of the same camelCase names; a ShopSettings row
//              is assignable as it is
//   result   = { method, labourS, consumablesMinor, steps } — seconds of hand work per sheet,
//              consumables cost per sheet in integer minor units, and one step per line of
//              arithmetic ({ label, arithmetic, labourS, consumablesMinor }) for the quote
//
// What each method costs (the seconds are shop settings; their defaults are common practice
// in small router shops, not measured values):
//   vacuum     no hand work after cutting and no consumables (spoil-board wear is not counted here)
//   tape-glue  tapeGlueSPerPart per part (tape on, glue on, peel, clean); tape by the parts'
//              area at tapeCostMinorPerM2; glue at glueCostMinorPerPart per part
//   tabs       tabSPerTab per tab (cut the tab free, sand its stub flush)
//   skin       skinSPerPart per part (break out of the onion skin, clean the bottom edge)
//   clamps     clampsSPerSheet once per sheet (fix and free the sheet)
//
// Rounding: seconds are not rounded (they are time, not money). The tape cost is computed in
// integers: the area is first rounded to whole mm² (half up), then
// cost = ⌊(tapeCostMinorPerM2 × areaMm2 + 500 000) ÷ 1 000 000⌋, i.e. rounded half up to a
// whole minor unit. Glue cost is an integer times an integer. No money is ever a float.
import type { HoldDown as HoldDownMethod } from '@/lib/validation/enums';

export type { HoldDownMethod };

export interface HoldDownLabourSettings {
  tapeGlueSPerPart: number;
  tabSPerTab: number;
  skinSPerPart: number;
  clampsSPerSheet: number;
  tapeCostMinorPerM2: number;
  glueCostMinorPerPart: number;
}

export interface HoldDownSheet {
  /** parts cut from one sheet (whole number ≥ 0) */
  partCount: number;
  /** tabs left on those parts (whole number ≥ 0) */
  tabCount: number;
  /** the parts' total area in mm² (≥ 0) */
  partsAreaMm2: number;
}

export interface HoldDownLabourStep {
  label: string;
  /** the inputs and the arithmetic, e.g. "6 parts × 40 s = 240 s" */
  arithmetic: string;
  labourS: number;
  consumablesMinor: number;
}

export interface HoldDownLabour {
  method: HoldDownMethod;
  /** hand work per sheet, seconds */
  labourS: number;
  /** consumables per sheet, integer minor units */
  consumablesMinor: number;
  steps: HoldDownLabourStep[];
}

const MM2_PER_M2 = 1_000_000;

function wholeCount(name: string, value: number): number {
  if (!Number.isInteger(value) || value < 0) throw new RangeError(`${name} must be a whole number ≥ 0 (got ${value})`);
  return value;
}

function nonNegative(name: string, value: number): number {
  if (!Number.isFinite(value) || value < 0) throw new RangeError(`${name} must be a number ≥ 0 (got ${value})`);
  return value;
}

function minorAmount(name: string, value: number): number {
  if (!Number.isSafeInteger(value) || value < 0) throw new RangeError(`${name} must be whole minor units ≥ 0 (got ${value})`);
  return value;
}

/** A number as it reads in an explanation: at most 2 decimals, no trailing zeros. */
function num(value: number): string {
  return String(Math.round(value * 100) / 100);
}

function plural(count: number, one: string, many: string): string {
  return `${count} ${count === 1 ? one : many}`;
}

/** Tape cost in minor units for an area, rounded half up (see the header). */
export function tapeCostMinor(areaMm2: number, tapeCostMinorPerM2: number): number {
  const area = Math.floor(nonNegative('partsAreaMm2', areaMm2) + 0.5);
  const rate = minorAmount('tapeCostMinorPerM2', tapeCostMinorPerM2);
  const product = rate * area;
  if (!Number.isSafeInteger(product)) throw new RangeError('tape area × cost is too large to compute exactly');
  return Math.floor((product + MM2_PER_M2 / 2) / MM2_PER_M2);
}

export function holdDownLabour(method: HoldDownMethod, sheet: HoldDownSheet, settings: HoldDownLabourSettings): HoldDownLabour {
  const parts = wholeCount('partCount', sheet.partCount);
  const tabs = wholeCount('tabCount', sheet.tabCount);
  const areaMm2 = nonNegative('partsAreaMm2', sheet.partsAreaMm2);
  const steps: HoldDownLabourStep[] = [];

  switch (method) {
    case 'vacuum':
      steps.push({ label: 'Vacuum', arithmetic: 'no hand work after cutting, no consumables', labourS: 0, consumablesMinor: 0 });
      break;
    case 'tape-glue': {
      const perPart = nonNegative('tapeGlueSPerPart', settings.tapeGlueSPerPart);
      const labourS = parts * perPart;
      steps.push({
        label: 'Tape and glue: taping, peeling and cleaning',
        arithmetic: `${plural(parts, 'part', 'parts')} × ${num(perPart)} s = ${num(labourS)} s`,
        labourS,
        consumablesMinor: 0,
      });
      const rate = minorAmount('tapeCostMinorPerM2', settings.tapeCostMinorPerM2);
      const tape = tapeCostMinor(areaMm2, rate);
      const roundedArea = Math.floor(areaMm2 + 0.5);
      steps.push({
        label: 'Tape',
        arithmetic: `${roundedArea} mm² ÷ 1 000 000 × ${rate} per m² = ${num((rate * roundedArea) / MM2_PER_M2)}, rounded half up = ${tape}`,
        labourS: 0,
        consumablesMinor: tape,
      });
      const gluePerPart = minorAmount('glueCostMinorPerPart', settings.glueCostMinorPerPart);
      const glue = parts * gluePerPart;
      steps.push({
        label: 'Glue',
        arithmetic: `${plural(parts, 'part', 'parts')} × ${gluePerPart} = ${glue}`,
        labourS: 0,
        consumablesMinor: glue,
      });
      break;
    }
    case 'tabs': {
      const perTab = nonNegative('tabSPerTab', settings.tabSPerTab);
      const labourS = tabs * perTab;
      steps.push({
        label: 'Tabs: cutting free and sanding flush',
        arithmetic: `${plural(tabs, 'tab', 'tabs')} × ${num(perTab)} s = ${num(labourS)} s`,
        labourS,
        consumablesMinor: 0,
      });
      break;
    }
    case 'skin': {
      const perPart = nonNegative('skinSPerPart', settings.skinSPerPart);
      const labourS = parts * perPart;
      steps.push({
        label: 'Onion skin: breaking out and cleaning the edge',
        arithmetic: `${plural(parts, 'part', 'parts')} × ${num(perPart)} s = ${num(labourS)} s`,
        labourS,
        consumablesMinor: 0,
      });
      break;
    }
    case 'clamps': {
      const perSheet = nonNegative('clampsSPerSheet', settings.clampsSPerSheet);
      steps.push({
        label: 'Screws or clamps: fixing and freeing the sheet',
        arithmetic: `1 sheet × ${num(perSheet)} s = ${num(perSheet)} s`,
        labourS: perSheet,
        consumablesMinor: 0,
      });
      break;
    }
    default: {
      const never: never = method;
      throw new RangeError(`unknown hold-down method ${String(never)}`);
    }
  }

  return {
    method,
    labourS: steps.reduce((sum, s) => sum + s.labourS, 0),
    consumablesMinor: steps.reduce((sum, s) => sum + s.consumablesMinor, 0),
    steps,
  };
}
