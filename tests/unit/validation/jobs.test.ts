// Job schema: FormData strings coerced to numbers, sheet limits, vacuum level limits.
import { describe, expect, it } from 'vitest';
import { fieldErrors } from '@/lib/validation/form';
import { isCalendarDate } from '@/lib/validation/dates';
import { jobCreateSchema, jobListQuerySchema, jobStatusSchema, searchParamsToObject, sortDirection } from '@/lib/validation/jobs';

// 4 × 8 ft metric nominal sheet, 18 mm birch plywood (common practice)
const form = {
  title: 'Shelf brackets, 40 off',
  customerId: '3',
  materialId: '1',
  sheetWidthMm: '1220',
  sheetLengthMm: '2440',
  sheetThicknessMm: '18',
  holdDown: 'vacuum',
  vacuumKpa: '67.73',
  quantity: '40',
};

describe('jobCreateSchema', () => {
  it('coerces FormData strings and defaults Z zero to the top of stock', () => {
    const job = jobCreateSchema.parse(form);
    expect(job).toMatchObject({ customerId: 3, materialId: 1, sheetWidthMm: 1220, sheetThicknessMm: 18, quantity: 40, zZero: 'top' });
  });

  it('accepts 20 inHg of vacuum, 67.728 kPa (NIST SP 811 App. B: 1 inHg = 3386.389 Pa)', () => {
    expect(jobCreateSchema.safeParse({ ...form, vacuumKpa: String((20 * 3386.389) / 1000) }).success).toBe(true);
  });

  it('refuses a vacuum level above one standard atmosphere, 101.325 kPa (NIST SP 811 App. B)', () => {
    expect(jobCreateSchema.safeParse({ ...form, vacuumKpa: '101.325' }).success).toBe(true);
    const over = jobCreateSchema.safeParse({ ...form, vacuumKpa: '101.4' });
    expect(over.success).toBe(false);
    if (!over.success) expect(Object.keys(fieldErrors(over.error))).toEqual(['vacuumKpa']);
  });

  it('refuses a vacuum level on a job held by clamps', () => {
    const result = jobCreateSchema.safeParse({ ...form, holdDown: 'clamps' });
    expect(result.success).toBe(false);
    if (!result.success) expect(fieldErrors(result.error).vacuumKpa).toEqual(['A vacuum level applies only to vacuum hold-down.']);
    expect(jobCreateSchema.safeParse({ ...form, holdDown: 'clamps', vacuumKpa: undefined }).success).toBe(true);
  });

  it('names zero, negative, non-numeric and oversize dimensions', () => {
    const result = jobCreateSchema.safeParse({ ...form, sheetWidthMm: '0', sheetLengthMm: 'long', sheetThicknessMm: '301', quantity: '1.5' });
    expect(result.success).toBe(false);
    if (result.success) return;
    expect(Object.keys(fieldErrors(result.error)).sort()).toEqual(['quantity', 'sheetLengthMm', 'sheetThicknessMm', 'sheetWidthMm']);
  });

  it('takes a 5 × 10 ft sheet (1524 × 3048 mm, 1 ft = 304.8 mm, NIST SP 811)', () => {
    expect(jobCreateSchema.safeParse({ ...form, sheetWidthMm: '1524', sheetLengthMm: '3048' }).success).toBe(true);
  });

  it('refuses an unknown hold-down or Z zero', () => {
    expect(jobCreateSchema.safeParse({ ...form, holdDown: 'magnets' }).success).toBe(false);
    expect(jobCreateSchema.safeParse({ ...form, zZero: 'spoilboard' }).success).toBe(false);
    expect(jobCreateSchema.parse({ ...form, zZero: 'table' }).zZero).toBe('table');
  });
});

describe('jobStatusSchema', () => {
  it('takes the statuses of the schema only', () => {
    expect(jobStatusSchema.parse({ status: 'running' })).toEqual({ status: 'running' });
    expect(jobStatusSchema.safeParse({ status: 'paused' }).success).toBe(false);
  });
});

describe('due date and notes', () => {
  // ISO 8601-1:2019 §5.2.2.1 calendar date YYYY-MM-DD; Gregorian leap years: divisible by 4,
  // except centuries not divisible by 400 (ISO 8601-1:2019 §3.2.1)
  it('takes real calendar dates only, leap days included', () => {
    expect(isCalendarDate('2028-02-29')).toBe(true);
    expect(isCalendarDate('2000-02-29')).toBe(true);
    expect(isCalendarDate('2100-02-29')).toBe(false);
    expect(isCalendarDate('2027-02-29')).toBe(false);
    expect(isCalendarDate('2027-04-31')).toBe(false);
    expect(isCalendarDate('2027-13-01')).toBe(false);
    expect(isCalendarDate('31/03/2027')).toBe(false);
  });

  it('names the due date and over-long notes as fields', () => {
    const result = jobCreateSchema.safeParse({ ...form, dueDate: '2027-02-30', notes: 'x'.repeat(2001) });
    expect(result.success).toBe(false);
    if (!result.success) expect(Object.keys(fieldErrors(result.error)).sort()).toEqual(['dueDate', 'notes']);
    expect(jobCreateSchema.parse({ ...form, dueDate: '2027-03-31', notes: 'Edge-band after cutting.', machineId: '2' })).toMatchObject({
      dueDate: '2027-03-31',
      notes: 'Edge-band after cutting.',
      machineId: 2,
    });
  });
});

describe('jobListQuerySchema', () => {
  it('defaults to the latest changes first, 25 a page', () => {
    const query = jobListQuerySchema.parse({});
    expect(query).toMatchObject({ sort: 'updated', page: 1, perPage: 25 });
    expect(sortDirection(query)).toBe('desc');
    expect(sortDirection({ sort: 'title' })).toBe('asc');
    expect(sortDirection({ sort: 'title', dir: 'desc' })).toBe('desc');
  });

  it('reads URL search params, empty ones as unset', () => {
    const params = new URLSearchParams('status=quoted&customerId=&machineId=2&q=%20bracket%20&sort=due&page=3&perPage=50');
    expect(jobListQuerySchema.parse(searchParamsToObject(params))).toEqual({
      status: 'quoted',
      machineId: 2,
      q: 'bracket',
      sort: 'due',
      page: 3,
      perPage: 50,
    });
  });

  it('names each bad parameter', () => {
    const result = jobListQuerySchema.safeParse({ status: 'paused', machineId: 'two', sort: 'colour', page: '0', perPage: '30', dir: 'up' });
    expect(result.success).toBe(false);
    if (!result.success) expect(Object.keys(fieldErrors(result.error)).sort()).toEqual(['dir', 'machineId', 'page', 'perPage', 'sort', 'status']);
  });
});
