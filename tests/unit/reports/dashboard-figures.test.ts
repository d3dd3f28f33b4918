// The dashboard's arithmetic (lib/reports/dashboard-figures.ts). ISO weeks run Monday to Sunday
// (ISO 8601-1:2019, week and weekday); the calendar facts below were checked with Python's
// datetime.date.isocalendar(): 2026-12-04 is a Friday of week 49, 2026-12-31 a Thursday and
// 2027-01-01 a Friday, both of week 53 of 2026. Sheets = ⌈quantity ÷ parts per sheet⌉ is the
// quote's rule (lib/quotes/price.ts; common practice, PRODUCT.md "parts per sheet decides how
// many sheets a quantity needs").
import { describe, expect, it } from 'vitest';
import { hoursByMachine, isoWeekDays, nextDays, sheetsNeeded, type WeekProgram } from '@/lib/reports/dashboard-figures';

describe('this week (ISO 8601, UTC)', () => {
  it('a Friday lies in the week from the Monday before to the Sunday after', () => {
    expect(isoWeekDays(new Date('2026-12-04T17:00:00Z'))).toEqual({ monday: '2026-11-30', sunday: '2026-12-06' });
  });
  it('a Sunday late in the evening is still the end of its week; the Monday after starts the next', () => {
    expect(isoWeekDays(new Date('2026-12-06T23:59:59Z'))).toEqual({ monday: '2026-11-30', sunday: '2026-12-06' });
    expect(isoWeekDays(new Date('2026-12-07T00:00:00Z'))).toEqual({ monday: '2026-12-07', sunday: '2026-12-13' });
  });
  it('a week across the new year: 2027-01-01 is in the week of Monday 2026-12-28', () => {
    expect(isoWeekDays(new Date('2027-01-01T08:00:00Z'))).toEqual({ monday: '2026-12-28', sunday: '2027-01-03' });
  });
  it('the next 7 days from today, both ends included', () => {
    expect(nextDays(new Date('2026-12-28T10:00:00Z'), 7)).toEqual({ from: '2026-12-28', to: '2027-01-04' });
  });
});

describe('sheets needed', () => {
  it('⌈quantity ÷ parts per sheet⌉', () => {
    expect(sheetsNeeded(64, 64)).toBe(1);
    expect(sheetsNeeded(65, 64)).toBe(2);
    expect(sheetsNeeded(100, 12)).toBe(9); // 100 / 12 = 8.33…
    expect(sheetsNeeded(10, 0)).toBeNull();
    expect(sheetsNeeded(10, null)).toBeNull();
  });
});

describe('machine hours by machine', () => {
  const p = (o: Partial<WeekProgram>): WeekProgram => ({ jobId: 1, machineId: 1, machineName: 'Router 1', quantity: 10, secondsPerSheet: 1800, partsPerSheet: 4, ...o });

  it('hand-computed: Router 1 = 1800 s × ⌈10/4⌉ + 900 s × ⌈5/5⌉ = 5400 + 900 = 6300 s = 1.75 h; Router 2 = 3600 s × 2 = 2 h', () => {
    const out = hoursByMachine([
      p({ jobId: 1 }),
      p({ jobId: 2, quantity: 5, secondsPerSheet: 900, partsPerSheet: 5 }),
      p({ jobId: 3, machineId: 2, machineName: 'Router 2', quantity: 2, secondsPerSheet: 3600, partsPerSheet: 1 }),
    ]);
    expect(out.map((m) => [m.machineName, m.jobs])).toEqual([
      ['Router 1', 2],
      ['Router 2', 1],
    ]);
    expect(out[0].hours).toBeCloseTo(1.75, 12);
    expect(out[1].hours).toBeCloseTo(2, 12);
  });

  it('two programs of one job count the job once; a program without an estimate is not in the hours; one without parts counts one sheet', () => {
    const [m] = hoursByMachine([p({}), p({ secondsPerSheet: null }), p({ partsPerSheet: 0, secondsPerSheet: 360 })]);
    expect(m.jobs).toBe(1);
    expect(m.programsWithoutEstimate).toBe(1);
    expect(m.programsWithoutParts).toBe(1);
    // 1800 × 3 + 360 × 1 = 5760 s = 1.6 h
    expect(m.hours).toBeCloseTo(1.6, 12);
  });
});
