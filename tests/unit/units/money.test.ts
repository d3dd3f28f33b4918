// Money in minor units (lib/units/money.ts). The digits per currency are ISO 4217's minor
// unit column (EUR 2, GBP 2, JPY 0, BHD 3; the list's values from memory), which the
// runtime's CLDR data follows for these codes.
import { describe, expect, it } from 'vitest';
import { formatMinor, minorDigits, minorToInput, parseMajorToMinor } from '@/lib/units/money';

describe('minor units', () => {
  it('follows ISO 4217: EUR 2, GBP 2, JPY 0, BHD 3', () => {
    expect(minorDigits('EUR')).toBe(2);
    expect(minorDigits('GBP')).toBe(2);
    expect(minorDigits('JPY')).toBe(0);
    expect(minorDigits('BHD')).toBe(3);
  });

  it('shows 8900 EUR cents as €89.00 and 1250 yen as ¥1,250', () => {
    expect(formatMinor(8900, 'EUR')).toBe('€89.00');
    expect(formatMinor(1250, 'JPY')).toBe('JP¥1,250');
    expect(formatMinor(500, 'BHD')).toMatch(/0\.500$/);
  });

  it('gives inputs the major amount with all minor digits', () => {
    expect(minorToInput(8900, 'EUR')).toBe('89.00');
    expect(minorToInput(5, 'EUR')).toBe('0.05');
    expect(minorToInput(1250, 'JPY')).toBe('1250');
    expect(minorToInput(500, 'BHD')).toBe('0.500');
  });
});

describe('typed amounts', () => {
  it('reads 0.29 as 29 cents, where 0.29 × 100 in floating point is 28.999999999999996', () => {
    expect(0.29 * 100).not.toBe(29);
    expect(parseMajorToMinor('0.29', 'EUR')).toEqual({ ok: true, minor: 29 });
  });

  it('reads whole, short and grouped amounts', () => {
    expect(parseMajorToMinor('89', 'EUR')).toEqual({ ok: true, minor: 8900 });
    expect(parseMajorToMinor('89.5', 'EUR')).toEqual({ ok: true, minor: 8950 });
    expect(parseMajorToMinor('1,250.00', 'EUR')).toEqual({ ok: true, minor: 125000 });
    expect(parseMajorToMinor('.5', 'EUR')).toEqual({ ok: true, minor: 50 });
    expect(parseMajorToMinor('1250', 'JPY')).toEqual({ ok: true, minor: 1250 });
  });

  it('refuses more decimals than the currency has, signs, words and bad grouping', () => {
    expect(parseMajorToMinor('89.505', 'EUR').ok).toBe(false);
    expect(parseMajorToMinor('12.5', 'JPY').ok).toBe(false);
    expect(parseMajorToMinor('-5', 'EUR').ok).toBe(false);
    expect(parseMajorToMinor('ten', 'EUR').ok).toBe(false);
    expect(parseMajorToMinor('1,25', 'EUR').ok).toBe(false);
    expect(parseMajorToMinor('', 'EUR').ok).toBe(false);
    expect(parseMajorToMinor('99999999999', 'EUR').ok).toBe(false); // over the INT column
  });
});
