// Run input schemas (lib/validation/runs.ts): JSON numbers and booleans taken as such (no
// coercion of true to 1), ISO 8601 date-times (ISO 8601-1:2019 §5.4: calendar date, "T",
// time of day; no offset read as UTC, the clock the pages show) that are real calendar days,
// the end-or-duration rule of a run entered afterwards, the sheets rule, and the list query.
import { describe, expect, it } from 'vitest';
import { fieldErrors } from '@/lib/validation/form';
import { calibrationApplySchema, runCorrectionSchema, runFinishSchema, runListQuerySchema, runManualSchema, runStartSchema, runVoidSchema } from '@/lib/validation/runs';

const fields = (r: { success: boolean; error?: unknown }) => (r.success ? {} : fieldErrors(r.error as Parameters<typeof fieldErrors>[0]));
const manual = { programId: 5, version: 1, machineId: 2, startedAt: '2026-12-03T08:30', sheetsCut: 2 };

describe('runStartSchema', () => {
  it('takes ids as JSON numbers', () => {
    expect(runStartSchema.parse({ programId: 5, version: 1, machineId: 2 })).toEqual({ programId: 5, version: 1, machineId: 2 });
  });
  it.each([
    ['true', true],
    ['"2"', '2'],
    ['[2]', [2]],
    ['0', 0],
    ['2.5', 2.5],
    ['2^31', 2 ** 31],
  ])('refuses machineId %s', (_label, machineId) => {
    expect(Object.keys(fields(runStartSchema.safeParse({ programId: 5, version: 1, machineId })))).toEqual(['machineId']);
  });
});

describe('runFinishSchema', () => {
  it('an uninterrupted run cut at least one sheet; an interrupted one may have cut none', () => {
    expect(fields(runFinishSchema.safeParse({ sheetsCut: 0 }))).toEqual({ sheetsCut: ['A run that was not interrupted cut at least 1 sheet.'] });
    expect(runFinishSchema.parse({ sheetsCut: 0, interrupted: true })).toEqual({ sheetsCut: 0, interrupted: true });
    expect(runFinishSchema.parse({ sheetsCut: 3 })).toEqual({ sheetsCut: 3, interrupted: false });
  });
  it('refuses "yes" for interrupted and "4" for sheets, naming both, without a false sheets message', () => {
    expect(Object.keys(fields(runFinishSchema.safeParse({ sheetsCut: '4', interrupted: 'yes' }))).sort()).toEqual(['interrupted', 'sheetsCut']);
    expect(fields(runFinishSchema.safeParse({ sheetsCut: '4' })).sheetsCut).toHaveLength(1);
  });
  it('keeps notes to 2000 characters, trimmed', () => {
    expect(runFinishSchema.parse({ sheetsCut: 1, notes: '  warp at one corner  ' }).notes).toBe('warp at one corner');
    expect(Object.keys(fields(runFinishSchema.safeParse({ sheetsCut: 1, notes: 'x'.repeat(2001) })))).toEqual(['notes']);
  });
});

describe('runManualSchema', () => {
  it('reads a date-time without an offset as UTC, and one with an offset as given', () => {
    expect(runManualSchema.parse({ ...manual, durationSeconds: 60 }).startedAt.toISOString()).toBe('2026-12-03T08:30:00.000Z');
    // 09:30 at +01:00 is 08:30 UTC (ISO 8601-1:2019 §5.4.2 time shift)
    expect(runManualSchema.parse({ ...manual, startedAt: '2026-12-03T09:30:00+01:00', durationSeconds: 60 }).startedAt.toISOString()).toBe('2026-12-03T08:30:00.000Z');
  });
  it.each(['2026-02-31T08:30', '2026-02-29T08:30', '2026-13-01T08:30', '2026-12-03T24:00', '2026-12-03T08:60', '3 Dec 2026 08:30', '2026-12-03'])('refuses the start %s at its field, without throwing', (startedAt) => {
    expect(fields(runManualSchema.safeParse({ ...manual, startedAt, durationSeconds: 60 })).startedAt).toBeDefined();
  });
  it('accepts 29 February in a leap year (2024)', () => {
    expect(runManualSchema.safeParse({ ...manual, startedAt: '2024-02-29T08:30', durationSeconds: 60 }).success).toBe(true);
  });
  it('needs the end or the duration, not both, and an end after the start', () => {
    expect(Object.keys(fields(runManualSchema.safeParse(manual)))).toEqual(['durationSeconds']);
    expect(Object.keys(fields(runManualSchema.safeParse({ ...manual, finishedAt: '2026-12-03T09:00', durationSeconds: 60 })))).toEqual(['durationSeconds']);
    expect(Object.keys(fields(runManualSchema.safeParse({ ...manual, finishedAt: '2026-12-03T08:29' })))).toEqual(['finishedAt']);
    expect(runManualSchema.parse({ ...manual, finishedAt: '2026-12-03T09:15:30' }).finishedAt!.toISOString()).toBe('2026-12-03T09:15:30.000Z');
  });
  it('limits a run to 7 days (604,800 s) and refuses one that ends in the future or starts before 2000', () => {
    expect(runManualSchema.safeParse({ ...manual, startedAt: '2026-11-20T08:30', durationSeconds: 604_800 }).success).toBe(true);
    expect(Object.keys(fields(runManualSchema.safeParse({ ...manual, startedAt: '2026-11-20T08:30', durationSeconds: 604_801 })))).toEqual(['durationSeconds']);
    expect(Object.keys(fields(runManualSchema.safeParse({ ...manual, startedAt: '2099-01-01T08:00', durationSeconds: 60 })))).toEqual(['startedAt']);
    expect(Object.keys(fields(runManualSchema.safeParse({ ...manual, startedAt: '1999-12-31T08:00', durationSeconds: 60 })))).toEqual(['startedAt']);
  });
  it('refuses a duration typed as text or as Infinity', () => {
    expect(Object.keys(fields(runManualSchema.safeParse({ ...manual, durationSeconds: '45 min' })))).toEqual(['durationSeconds']);
    expect(Object.keys(fields(runManualSchema.safeParse({ ...manual, durationSeconds: Infinity })))).toEqual(['durationSeconds']);
  });
});

describe('corrections, voiding and applying a calibration', () => {
  it('a correction names a reason and changes at least one field', () => {
    expect(Object.keys(fields(runCorrectionSchema.safeParse({ reason: 'Checked.' })))).toEqual(['_form']);
    expect(Object.keys(fields(runCorrectionSchema.safeParse({ sheetsCut: 2 })))).toEqual(['reason']);
    expect(runCorrectionSchema.parse({ notes: '', reason: 'Cleared the note.' })).toEqual({ notes: '', reason: 'Cleared the note.' });
  });
  it('a void needs a reason that is not blank', () => {
    expect(Object.keys(fields(runVoidSchema.safeParse({ reason: '   ' })))).toEqual(['reason']);
  });
  it('a factor is a number above 0 and at most 10', () => {
    expect(calibrationApplySchema.parse({ suggestedFactor: 1.084 })).toEqual({ suggestedFactor: 1.084 });
    for (const suggestedFactor of [0, -1, 10.5, '1.084']) expect(calibrationApplySchema.safeParse({ suggestedFactor }).success, String(suggestedFactor)).toBe(false);
  });
});

describe('runListQuerySchema (URL search params, all strings)', () => {
  it('coerces ids and pages, defaults to 25 a page', () => {
    expect(runListQuerySchema.parse({ machineId: '2', version: '3' })).toEqual({ machineId: 2, version: 3, page: 1, perPage: 25 });
  });
  it('refuses a day that is not a real date, a page size not offered and an unknown status', () => {
    expect(Object.keys(fields(runListQuerySchema.safeParse({ from: '2026-02-30', perPage: '30', status: 'stopped' }))).sort()).toEqual(['from', 'perPage', 'status']);
  });
});
