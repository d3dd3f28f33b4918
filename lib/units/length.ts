// Lengths for display and input. Kerfcast stores and computes every length in mm (feeds in
// mm/min, accelerations in mm/s²); a shop whose length unit is the inch sees and types
// inches, converted here and nowhere else. Pure: the forms, the pages and the tests use it.
//
// 1 in = 25.4 mm exactly, by definition: the international yard and pound agreement of
// 1959 fixed the yard at 0.9144 m, and the inch is 1/36 yard; NIST SP 811 (2008 edition),
// Appendix B, gives inch → meter as 2.54 E−02 among its exact factors (the appendix's
// section number and typeface from memory). See docs/references.md.
export const MM_PER_INCH = 25.4;

export const LENGTH_UNITS = ['mm', 'inch'] as const;
export type LengthUnit = (typeof LENGTH_UNITS)[number];

/** What a number measures: a length, a feed (length per minute) or an acceleration (length per s²). */
export type LengthQuantity = 'length' | 'feed' | 'accel';

const SYMBOLS: Record<LengthQuantity, Record<LengthUnit, string>> = {
  length: { mm: 'mm', inch: 'in' },
  feed: { mm: 'mm/min', inch: 'in/min' },
  accel: { mm: 'mm/s²', inch: 'in/s²' },
};

export const LENGTH_UNIT_LABELS: Record<LengthUnit, string> = { mm: 'Millimetres (mm)', inch: 'Inches (in)' };

/** The unit symbol shown in a label: "mm", "in/min", "in/s²". */
export function unitSymbol(quantity: LengthQuantity, unit: LengthUnit): string {
  return SYMBOLS[quantity][unit];
}

// Feeds and accelerations scale by the same factor: the time part of the unit stays.
/** A stored mm value (or mm/min, mm/s²) in the display unit. */
export function fromMm(valueMm: number, unit: LengthUnit): number {
  return unit === 'mm' ? valueMm : valueMm / MM_PER_INCH;
}

/**
 * A value typed in the display unit, as mm for storage. Inch values are rounded to 12
 * significant digits after the multiplication, so 0.3 in is stored as 7.62 and not as
 * 7.619999999999999 (a picometre is far below anything a router resolves).
 */
export function toMm(value: number, unit: LengthUnit): number {
  if (unit === 'mm') return value;
  return Number((value * MM_PER_INCH).toPrecision(12));
}

/**
 * The text an input shows for a stored value: mm as stored; inches as they read on the
 * pages (formatLength: 4 decimals, at least 3 significant digits). Nothing is lost by the
 * shorter text: a form sends the stored mm of every field whose text nobody changed, and
 * a changed field is taken as typed.
 */
export function inputText(valueMm: number, unit: LengthUnit): string {
  if (unit === 'mm') return String(valueMm);
  return formatLength(valueMm, unit);
}

/**
 * A stored value for reading: up to 3 decimals in mm (a micrometre), up to 4 in inches
 * (a ten-thousandth, 2.54 µm), but never fewer than 3 significant digits, so that a
 * corner tolerance of 0.02 mm reads 0.000787 in, not 0.0008. Thousands are not grouped:
 * the figure columns are read as numbers beside the machine, not as prices.
 */
export function formatLength(valueMm: number, unit: LengthUnit): string {
  const v = fromMm(valueMm, unit);
  if (v === 0) return '0';
  const decimals = unit === 'mm' ? 3 : 4;
  const magnitude = Math.floor(Math.log10(Math.abs(v)));
  const needed = Math.max(decimals, 2 - magnitude); // 3 significant digits below 1
  return String(Number(v.toFixed(Math.min(needed, 12))));
}

/**
 * Reads a number as a person types it: "12.5", "-3", ".25", and in inches also a fraction
 * or a mixed number ("1/4", "1 1/4", "1-1/4"), as router bits and sheet sizes are
 * commonly named (common practice). Returns null for anything else.
 */
export function parseLengthText(text: string, unit: LengthUnit): number | null {
  const t = text.trim();
  if (/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(t)) return Number(t);
  if (unit !== 'inch') return null;
  const m = /^(?:(\d+)(?:\s+|-))?(\d+)\s*\/\s*(\d+)$/.exec(t);
  if (!m) return null;
  const whole = m[1] ? Number(m[1]) : 0;
  const num = Number(m[2]);
  const den = Number(m[3]);
  if (den === 0) return null;
  return whole + num / den;
}
