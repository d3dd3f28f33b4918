// Length conversion for inch shops (lib/units/length.ts) against the definition of the
// inch: 1 in = 25.4 mm exactly (international yard and pound agreement, 1959: 1 yd =
// 0.9144 m; NIST SP 811, 2008, Appendix B: inch → meter 2.54 E−02, exact). The other check
// values are derived from that definition by hand, as written beside each.
import { describe, expect, it } from 'vitest';
import { formatLength, fromMm, inputText, MM_PER_INCH, parseLengthText, toMm, unitSymbol } from '@/lib/units/length';

describe('the inch', () => {
  it('is 25.4 mm exactly (NIST SP 811 Appendix B: 2.54 E−02 m)', () => {
    expect(MM_PER_INCH).toBe(25.4);
    expect(toMm(1, 'inch')).toBe(25.4);
    expect(fromMm(25.4, 'inch')).toBe(1);
  });

  it('makes the yard 0.9144 m (the 1959 agreement): 36 in = 914.4 mm', () => {
    expect(toMm(36, 'inch')).toBe(914.4);
  });

  it('gives a 4 × 8 ft sheet as 1219.2 × 2438.4 mm (48 in and 96 in × 25.4)', () => {
    expect(toMm(48, 'inch')).toBe(1219.2);
    expect(toMm(96, 'inch')).toBe(2438.4);
    expect(fromMm(1219.2, 'inch')).toBeCloseTo(48, 12);
  });

  it('names the common router bits: 1/4 in = 6.35 mm, 1/8 in = 3.175 mm, 1/2 in = 12.7 mm (25.4 ÷ 4, ÷ 8, ÷ 2)', () => {
    expect(toMm(parseLengthText('1/4', 'inch')!, 'inch')).toBe(6.35);
    expect(toMm(parseLengthText('1/8', 'inch')!, 'inch')).toBe(3.175);
    expect(toMm(parseLengthText('1/2', 'inch')!, 'inch')).toBe(12.7);
    expect(inputText(6.35, 'inch')).toBe('0.25');
    expect(inputText(3.175, 'inch')).toBe('0.125');
  });

  it('converts feeds and accelerations by the same factor: 100 in/min = 2540 mm/min', () => {
    expect(toMm(100, 'inch')).toBe(2540);
    expect(unitSymbol('feed', 'inch')).toBe('in/min');
    expect(unitSymbol('accel', 'inch')).toBe('in/s²');
    expect(unitSymbol('feed', 'mm')).toBe('mm/min');
  });

  it('stores 0.3 in as 7.62 mm, not 7.619999999999999 (0.3 × 25.4 in binary floating point)', () => {
    expect(0.3 * 25.4).not.toBe(7.62); // the float product this module rounds away
    expect(toMm(0.3, 'inch')).toBe(7.62);
    expect(toMm(2.3, 'inch')).toBe(58.42);
  });

  it('leaves mm as they are', () => {
    expect(toMm(3060, 'mm')).toBe(3060);
    expect(inputText(0.015, 'mm')).toBe('0.015');
    expect(formatLength(1530, 'mm')).toBe('1530');
  });
});

describe('inputs and reading', () => {
  it('shows inch inputs as the pages do: within half of the last digit shown (fixture profile values)', () => {
    // values of fixtures/machines/router-1.json and router-2.json
    for (const mm of [3060, 1530, 180, 2500, 1250, 150, 0.02, 0.015, 0.003, 0.005, 6.35, 3.175, 12.7, 30000, 40000, 1500, 800]) {
      const text = inputText(mm, 'inch');
      const decimals = text.split('.')[1]?.length ?? 0;
      expect(Math.abs(Number(text) - mm / 25.4)).toBeLessThanOrEqual(0.5 * 10 ** -decimals + 1e-15);
    }
    expect(inputText(0.02, 'inch')).toBe('0.000787');
  });

  it('shows a corner tolerance of 0.02 mm as 0.000787 in (0.02 ÷ 25.4 = 0.000787401…), not 0.0008', () => {
    expect(formatLength(0.02, 'inch')).toBe('0.000787');
    expect(formatLength(0.003, 'mm')).toBe('0.003');
    expect(formatLength(3060, 'inch')).toBe('120.4724'); // 3060 ÷ 25.4 = 120.47244…
  });

  it('reads decimals, fractions and mixed numbers; refuses anything else', () => {
    expect(parseLengthText('12.5', 'mm')).toBe(12.5);
    expect(parseLengthText('.25', 'inch')).toBe(0.25);
    expect(parseLengthText('1 1/4', 'inch')).toBe(1.25);
    expect(parseLengthText('1-1/4', 'inch')).toBe(1.25);
    expect(parseLengthText('1/4', 'mm')).toBeNull(); // fractions of a millimetre are not written so
    expect(parseLengthText('1/0', 'inch')).toBeNull();
    expect(parseLengthText('12 mm', 'mm')).toBeNull();
    expect(parseLengthText('', 'mm')).toBeNull();
  });
});
