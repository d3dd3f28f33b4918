// Run input: starting a run of a program version on a machine, finishing it, a run entered
// afterwards by hand, a correction, a void, and the runs list's filters and page. Shared by
// the route handlers and the run forms. Times in seconds, instants as ISO 8601 date-times
// (UTC when no offset is given: the shop has no time zone setting, and pages show UTC).
// JSON bodies take numbers and booleans as such: z.coerce would turn `true` into 1 and
// `[5]` into 5, so only the list query (URL search params, all strings) coerces.
import { z } from '@/lib/validation/zod';
import { isCalendarDate } from './dates';
import { RUN_STATUSES } from './enums';

const MAX_ID = 2_147_483_647;
const id = (what: string) =>
  z.number({ error: `Choose a ${what}.` }).int(`Choose a ${what}.`).positive(`Choose a ${what}.`).max(MAX_ID, `Choose a ${what}.`);
const queryId = (what: string) =>
  z.coerce.number({ error: `Choose a ${what}.` }).int(`Choose a ${what}.`).positive(`Choose a ${what}.`).max(MAX_ID, `Choose a ${what}.`);

/** A run is at most a few days long; a week of seconds catches a duration typed in the wrong unit. */
export const MAX_RUN_SECONDS = 7 * 24 * 3600;
/** Sheets in one run: one program cut on this many sheets, one after another. */
export const MAX_SHEETS = 1000;

const sheetsCut = z
  .number({ error: 'Enter how many sheets were cut.' })
  .int('Enter a whole number of sheets.')
  .min(0, 'Enter 0 or more sheets.')
  .max(MAX_SHEETS, `Enter ${MAX_SHEETS} sheets or fewer.`);
const notes = z.string().trim().max(2000, 'Notes are too long (2000 characters at most).').optional();
const interrupted = z.boolean({ error: 'Say whether the run was interrupted (true or false).' }).default(false);

export const runStartSchema = z.object({
  programId: id('program'),
  version: id('program version'),
  machineId: id('machine'),
});

/** An uninterrupted run cut at least one sheet; an interrupted one may have cut none. */
function sheetsForFinish<T extends { sheetsCut: number; interrupted: boolean }>(v: T, ctx: z.RefinementCtx) {
  if (v.interrupted === false && typeof v.sheetsCut === 'number' && v.sheetsCut < 1) ctx.addIssue({ code: 'custom', path: ['sheetsCut'], message: 'A run that was not interrupted cut at least 1 sheet.' });
}

export const runFinishSchema = z.object({ sheetsCut, interrupted, notes }).superRefine(sheetsForFinish);

const INSTANT = /^(\d{4}-\d{2}-\d{2})T(\d{2}):(\d{2})(?::(\d{2})(?:\.\d{1,3})?)?(Z|[+-]\d{2}:\d{2})?$/;
const withZone = (v: string) => (/(Z|[+-]\d{2}:\d{2})$/.test(v) ? v : `${v}Z`);

/** A real calendar day (Date.parse rolls 2026-02-31 over to 3 March) and time of day. */
function isRealInstant(v: string): boolean {
  const m = INSTANT.exec(v);
  if (!m || !isCalendarDate(m[1])) return false;
  return Number(m[2]) < 24 && Number(m[3]) < 60 && Number(m[4] ?? 0) < 60 && !Number.isNaN(Date.parse(withZone(v)));
}

const instant = (label: string) =>
  z
    .string({ error: `Enter the ${label} as a date and time.` })
    .trim()
    .refine(isRealInstant, `Enter the ${label} as a date and time, like 2026-12-04T08:30.`)
    .transform((v) => new Date(withZone(v)));

const durationS = z
  .number({ error: 'Enter the duration in seconds.' })
  .refine(Number.isFinite, 'Enter the duration in seconds.')
  .gt(0, 'The duration must be more than 0 s.')
  .max(MAX_RUN_SECONDS, `A run is at most ${MAX_RUN_SECONDS} s (7 days).`);

/** A run entered afterwards: its start and its end, or its start and how long it ran. */
export const runManualSchema = z
  .object({
    programId: id('program'),
    version: id('program version'),
    machineId: id('machine'),
    startedAt: instant('start'),
    finishedAt: instant('end').optional(),
    durationSeconds: durationS.optional(),
    sheetsCut,
    interrupted,
    notes,
  })
  .superRefine((v, ctx) => {
    sheetsForFinish(v, ctx);
    // zod 4 runs an object's refinements even when a field failed: a start or end that did
    // not parse is still the string it was, so the checks between them wait for valid ones
    if (!(v.startedAt instanceof Date) || (v.finishedAt !== undefined && !(v.finishedAt instanceof Date))) return;
    if (v.durationSeconds !== undefined && typeof v.durationSeconds !== 'number') return;
    // the runs table keeps TIMESTAMP columns (1970 to 2038); a run before 2000 is a typing slip
    if (v.startedAt.getTime() < Date.UTC(2000, 0, 1)) ctx.addIssue({ code: 'custom', path: ['startedAt'], message: 'Enter a start in the year 2000 or later.' });
    if (v.finishedAt === undefined && v.durationSeconds === undefined) {
      ctx.addIssue({ code: 'custom', path: ['durationSeconds'], message: 'Enter the end, or how long the run took.' });
    }
    if (v.finishedAt !== undefined && v.durationSeconds !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['durationSeconds'], message: 'Enter the end or the duration, not both.' });
    }
    if (v.finishedAt !== undefined) {
      const s = (v.finishedAt.getTime() - v.startedAt.getTime()) / 1000;
      if (s <= 0) ctx.addIssue({ code: 'custom', path: ['finishedAt'], message: 'The end must be after the start.' });
      else if (s > MAX_RUN_SECONDS) ctx.addIssue({ code: 'custom', path: ['finishedAt'], message: 'A run is at most 7 days long.' });
    }
    const end = v.finishedAt ?? (v.durationSeconds !== undefined ? new Date(v.startedAt.getTime() + v.durationSeconds * 1000) : null);
    if (end && end.getTime() > Date.now() + 60_000) ctx.addIssue({ code: 'custom', path: [v.finishedAt ? 'finishedAt' : 'startedAt'], message: 'A run entered afterwards cannot end in the future.' });
  });

/** A correction of a finished run: any of these fields, and why. */
export const runCorrectionSchema = z
  .object({
    actualSeconds: durationS.optional(),
    sheetsCut: sheetsCut.optional(),
    interrupted: z.boolean({ error: 'Say whether the run was interrupted (true or false).' }).optional(),
    notes,
    reason: z.string({ error: 'Say why the run is corrected.' }).trim().min(1, 'Say why the run is corrected.').max(500, 'The reason is too long (500 characters at most).'),
  })
  .refine((v) => v.actualSeconds !== undefined || v.sheetsCut !== undefined || v.interrupted !== undefined || v.notes !== undefined, {
    path: ['_form'],
    message: 'Change at least one of the running time, sheets cut, interrupted or notes.',
  });

export const runVoidSchema = z.object({
  reason: z.string({ error: 'Say why the run is voided.' }).trim().min(1, 'Say why the run is voided.').max(500, 'The reason is too long (500 characters at most).'),
});

export const RUN_PAGE_SIZES = [25, 50, 100] as const;

const day = (label: string) =>
  z
    .string()
    .trim()
    .refine(isCalendarDate, `Enter the ${label} date as a real date, like 2026-12-31.`)
    .optional();

/** The runs list's filters and page: URL search params of /runs, GET /api/runs and the CSV export. */
export const runListQuerySchema = z.object({
  machineId: queryId('machine').optional(),
  operatorId: queryId('operator').optional(),
  jobId: queryId('job').optional(),
  programId: queryId('program').optional(),
  version: queryId('program version').optional(),
  status: z.enum(RUN_STATUSES, { error: `Choose one of: ${RUN_STATUSES.join(', ')}.` }).optional(),
  from: day('from'),
  to: day('to'),
  page: z.coerce.number({ error: 'The page is a whole number from 1.' }).int('The page is a whole number from 1.').min(1, 'The page is a whole number from 1.').max(100_000, 'The page must be 100000 or less.').default(1),
  perPage: z.coerce
    .number({ error: `Show ${RUN_PAGE_SIZES.join(', ')} runs a page.` })
    .refine((n) => (RUN_PAGE_SIZES as readonly number[]).includes(n), `Show ${RUN_PAGE_SIZES.join(', ')} runs a page.`)
    .default(25),
});

export type RunStartInput = z.infer<typeof runStartSchema>;
export type RunFinishInput = z.infer<typeof runFinishSchema>;
export type RunManualInput = z.infer<typeof runManualSchema>;
export type RunCorrectionInput = z.infer<typeof runCorrectionSchema>;
export type RunListQuery = z.infer<typeof runListQuerySchema>;

/** Calibration applied by an admin: the factor they saw, checked against the suggestion now. */
export const calibrationApplySchema = z.object({
  suggestedFactor: z.number({ error: 'Send the suggested factor you saw.' }).gt(0, 'The factor must be more than 0.').max(10, 'The factor must be 10 or less.'),
});
