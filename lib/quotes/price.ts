// The price build-up of a quote: pure, integer money, the same function in the quote builder
// (the browser, live as inputs change) and on the server (the stored quote). Every line
// carries its inputs and arithmetic as text, so the quote explains itself.
//
// The steps (PRODUCT.md, "Quote"):
//   sheets         = ⌈quantity ÷ parts per sheet⌉ (integers)
//   machine time   = calibrated estimate per sheet × sheets + setup + load/unload per sheet × sheets
//   machine        = machine time × hourly rate
//   material       = sheets × cost per sheet × (1 + waste allowance)
//   hold-down      = hand work per sheet (lib/quotes/hold-down-labour.ts) × sheets at the labour
//                    rate, plus consumables per sheet × sheets
//   other lines    typed by hand (whole minor units)
//   margin         = subtotal × margin share
//   rounding       the net (subtotal + margin) to a multiple of roundToMinor, nearest or up
//   tax            = net × tax share
//   total          = net + tax
//
// Rounding, stated once: money is integer minor units throughout. Times are rounded to whole
// seconds (half up) before they are priced; each money product is rounded half up to a whole
// minor unit by integer arithmetic (⌊(a × b + d/2) ÷ d⌋, a, b, d integers, never a float
// product of money); shares are basis points (1 % = 100 bp). Rounding to roundToMinor is
// applied to the net before tax, so the tax is computed on the figure the customer sees.
import { minorDigits } from '../units/money';
import { holdDownLabour, type HoldDownLabourSettings, type HoldDownMethod } from './hold-down-labour';

export interface PriceSettings extends HoldDownLabourSettings {
  setupS: number;
  loadUnloadSPerSheet: number;
  wasteAllowanceBp: number;
  marginBp: number;
  taxBp: number;
  roundToMinor: number;
  roundingMode: 'nearest' | 'up';
  labourRateMinorPerHour: number;
}

/** The estimate, machine and material figures a quote uses; frozen into the quote record. */
export interface PriceFigures {
  estimateId: number;
  /** the calibrated estimate for one run of the program (one sheet), seconds */
  secondsPerSheet: number;
  /** the parts the estimate found in the program, their tabs and their total area */
  estimatePartCount: number;
  estimateTabCount: number;
  estimatePartsAreaMm2: number;
  machineName: string;
  machineRateMinorPerHour: number;
  materialName: string;
  materialCostMinorPerSheet: number;
  currency: string;
  settings: PriceSettings;
}

export interface ExtraLine {
  label: string;
  amountMinor: number;
}

/** What the estimator types. */
export interface PriceInputs {
  quantity: number;
  partsPerSheet: number;
  holdDown: HoldDownMethod;
  extraLines: ExtraLine[];
}

export interface PriceLine {
  key: string;
  label: string;
  /** the inputs and the arithmetic, as the quote prints them */
  arithmetic: string;
  /** null for a step that is not money (sheets, machine time) */
  amountMinor: number | null;
}

export interface PriceBuildUp {
  currency: string;
  sheets: number;
  machineS: number;
  holdDownS: number;
  subtotalMinor: number;
  marginMinor: number;
  roundingMinor: number;
  netMinor: number;
  taxMinor: number;
  totalMinor: number;
  lines: PriceLine[];
}

export class PriceInputError extends RangeError {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message);
    this.name = 'PriceInputError';
  }
}

function whole(field: string, v: number, min = 0): number {
  if (!Number.isSafeInteger(v) || v < min) throw new PriceInputError(field, `${field} must be a whole number ≥ ${min}`);
  return v;
}

function finite(field: string, v: number): number {
  if (!Number.isFinite(v) || v < 0) throw new PriceInputError(field, `${field} must be a number ≥ 0`);
  return v;
}

/** ⌊(a × b + d/2) ÷ d⌋ for non-negative integers: a × b ÷ d rounded half up, exactly. */
export function mulDivRound(a: number, b: number, d: number): number {
  const p = a * b;
  if (!Number.isSafeInteger(p)) throw new RangeError('amount too large to compute exactly');
  return Math.floor((p + Math.floor(d / 2)) / d);
}

/** Rounds a non-negative amount to a multiple of step: half up ('nearest') or up. */
export function roundToStep(amountMinor: number, step: number, mode: 'nearest' | 'up'): number {
  if (step <= 1) return amountMinor;
  const q = mode === 'up' ? Math.ceil(amountMinor / step) : Math.floor((amountMinor + Math.floor(step / 2)) / step);
  return q * step;
}

/** Whole seconds, half up. */
const wholeS = (s: number) => Math.floor(s + 0.5);

export function formatSeconds(s: number): string {
  const t = wholeS(s);
  const h = Math.floor(t / 3600);
  const m = Math.floor((t % 3600) / 60);
  const sec = t % 60;
  return `${h} h ${String(m).padStart(2, '0')} min ${String(sec).padStart(2, '0')} s`;
}

/** "EUR 1,234.50" from 123450 minor units, by integer division (no float money). */
export function formatMoney(minor: number, currency: string): string {
  const digits = minorDigits(currency);
  const sign = minor < 0 ? '−' : '';
  const abs = Math.abs(minor);
  const unit = 10 ** digits;
  const major = Math.floor(abs / unit).toLocaleString('en');
  const frac = digits > 0 ? '.' + String(abs % unit).padStart(digits, '0') : '';
  return `${currency} ${sign}${major}${frac}`;
}

const pct = (bp: number) => `${bp / 100} %`;
const n2 = (v: number) => String(Math.round(v * 100) / 100);

export function buildPrice(inputs: PriceInputs, figures: PriceFigures): PriceBuildUp {
  const s = figures.settings;
  const cur = figures.currency;
  const money = (m: number) => formatMoney(m, cur);
  const quantity = whole('quantity', inputs.quantity, 1);
  const partsPerSheet = whole('partsPerSheet', inputs.partsPerSheet, 1);
  const secondsPerSheet = finite('secondsPerSheet', figures.secondsPerSheet);
  const rate = whole('machineRateMinorPerHour', figures.machineRateMinorPerHour);
  const sheetCost = whole('materialCostMinorPerSheet', figures.materialCostMinorPerSheet);
  const lines: PriceLine[] = [];

  // 1. sheets, in integers
  const sheets = Math.floor((quantity + partsPerSheet - 1) / partsPerSheet);
  lines.push({ key: 'sheets', label: 'Sheets', arithmetic: `⌈${quantity} pieces ÷ ${partsPerSheet} per sheet⌉ = ${sheets}`, amountMinor: null });

  // 2. machine time and cost
  const setupS = finite('setupS', s.setupS);
  const loadS = finite('loadUnloadSPerSheet', s.loadUnloadSPerSheet);
  const machineS = wholeS(secondsPerSheet * sheets + setupS + loadS * sheets);
  lines.push({
    key: 'machine-time',
    label: 'Machine time',
    arithmetic: `${n2(secondsPerSheet)} s × ${sheets} sheets + ${n2(setupS)} s setup + ${n2(loadS)} s × ${sheets} load/unload = ${machineS} s (${formatSeconds(machineS)})`,
    amountMinor: null,
  });
  const machineMinor = mulDivRound(machineS, rate, 3600);
  lines.push({
    key: 'machine',
    label: `Machine: ${figures.machineName}`,
    arithmetic: `${machineS} s ÷ 3600 × ${money(rate)} per hour = ${money(machineMinor)}`,
    amountMinor: machineMinor,
  });

  // 3. material with waste allowance
  const waste = whole('wasteAllowanceBp', s.wasteAllowanceBp);
  const materialMinor = mulDivRound(sheets * sheetCost, 10_000 + waste, 10_000);
  lines.push({
    key: 'material',
    label: `Material: ${figures.materialName}`,
    arithmetic: `${sheets} sheets × ${money(sheetCost)} × (1 + ${pct(waste)} waste) = ${money(materialMinor)}`,
    amountMinor: materialMinor,
  });

  // 4. hold-down labour and consumables; the estimate's tabs and area scaled to the parts per sheet
  const estParts = whole('estimatePartCount', figures.estimatePartCount);
  const scale = (v: number) => (estParts > 0 ? (v * partsPerSheet) / estParts : 0);
  const tabsPerSheet = Math.round(scale(whole('estimateTabCount', figures.estimateTabCount)));
  const areaPerSheet = scale(finite('estimatePartsAreaMm2', figures.estimatePartsAreaMm2));
  const hold = holdDownLabour(inputs.holdDown, { partCount: partsPerSheet, tabCount: tabsPerSheet, partsAreaMm2: areaPerSheet }, s);
  const holdDownS = wholeS(hold.labourS * sheets);
  const labourRate = whole('labourRateMinorPerHour', s.labourRateMinorPerHour);
  const labourMinor = mulDivRound(holdDownS, labourRate, 3600);
  const perSheet = hold.steps.filter((st) => st.labourS > 0).map((st) => st.arithmetic).join('; ');
  lines.push({
    key: 'hold-down-labour',
    label: `Hold-down labour (${hold.steps[0]?.label ?? inputs.holdDown})`,
    arithmetic:
      hold.labourS > 0
        ? `per sheet ${perSheet}; × ${sheets} sheets = ${holdDownS} s ÷ 3600 × ${money(labourRate)} per hour = ${money(labourMinor)}`
        : `no hand work for this method = ${money(0)}`,
    amountMinor: labourMinor,
  });
  if (hold.consumablesMinor > 0) {
    const consumablesMinor = hold.consumablesMinor * sheets;
    const parts = hold.steps.filter((st) => st.consumablesMinor > 0).map((st) => `${st.label.toLowerCase()} ${money(st.consumablesMinor)}`);
    lines.push({
      key: 'consumables',
      label: 'Hold-down consumables',
      arithmetic: `per sheet ${parts.join(' + ')} = ${money(hold.consumablesMinor)}; × ${sheets} sheets = ${money(consumablesMinor)}`,
      amountMinor: consumablesMinor,
    });
  }

  // 5. lines typed by hand
  inputs.extraLines.forEach((x, i) => {
    const amount = whole(`extraLines.${i}.amountMinor`, x.amountMinor);
    if (!x.label.trim()) throw new PriceInputError(`extraLines.${i}.label`, 'a line needs a label');
    lines.push({ key: `extra-${i}`, label: x.label.trim(), arithmetic: 'typed by hand', amountMinor: amount });
  });

  // 6. subtotal, margin, rounding, tax
  const subtotalMinor = lines.reduce((sum, l) => sum + (l.amountMinor ?? 0), 0);
  lines.push({ key: 'subtotal', label: 'Subtotal', arithmetic: 'sum of the lines above', amountMinor: subtotalMinor });
  const marginBp = whole('marginBp', s.marginBp);
  const marginMinor = mulDivRound(subtotalMinor, marginBp, 10_000);
  lines.push({ key: 'margin', label: 'Margin', arithmetic: `${money(subtotalMinor)} × ${pct(marginBp)} = ${money(marginMinor)}`, amountMinor: marginMinor });
  const beforeRounding = subtotalMinor + marginMinor;
  const step = whole('roundToMinor', s.roundToMinor, 1);
  const netMinor = roundToStep(beforeRounding, step, s.roundingMode);
  const roundingMinor = netMinor - beforeRounding;
  lines.push({
    key: 'rounding',
    label: 'Rounding',
    arithmetic:
      step <= 1
        ? 'no rounding'
        : `${money(beforeRounding)} rounded ${s.roundingMode === 'up' ? 'up' : 'to the nearest (half up)'} multiple of ${money(step)} = ${money(netMinor)}`,
    amountMinor: roundingMinor,
  });
  lines.push({
    key: 'net',
    label: 'Net',
    arithmetic: `${money(subtotalMinor)} + ${money(marginMinor)} ${roundingMinor < 0 ? '−' : '+'} ${money(Math.abs(roundingMinor))} = ${money(netMinor)}`,
    amountMinor: netMinor,
  });
  const taxBp = whole('taxBp', s.taxBp);
  const taxMinor = mulDivRound(netMinor, taxBp, 10_000);
  lines.push({ key: 'tax', label: 'Tax', arithmetic: `${money(netMinor)} × ${pct(taxBp)} = ${money(taxMinor)}`, amountMinor: taxMinor });
  const totalMinor = netMinor + taxMinor;
  lines.push({ key: 'total', label: 'Total', arithmetic: `${money(netMinor)} + ${money(taxMinor)} = ${money(totalMinor)}`, amountMinor: totalMinor });

  return { currency: cur, sheets, machineS, holdDownS, subtotalMinor, marginMinor, roundingMinor, netMinor, taxMinor, totalMinor, lines };
}
