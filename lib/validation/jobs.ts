// Job input: the customer, machine and material, the sheet, where Z zero is, the
// hold-down method, the quantity, due date and notes; and the jobs list's query (filters,
// sort, page), shared by the /jobs page, GET /api/jobs and the forms. Lengths in mm. Vacuum level in kPa below atmosphere, so it cannot exceed one
// standard atmosphere, 101.325 kPa (NIST SP 811, 2008, Appendix B).
import { z } from '@/lib/validation/zod';
import { HOLD_DOWNS, JOB_STATUSES, Z_ZEROS } from './enums';
import { dueDateSchema } from './dates';

export const ATMOSPHERE_KPA = 101.325;
// The largest common sheet is 5 × 10 ft (1524 × 3048 mm, common practice); 6 m leaves
// room for oversize panels while catching a value typed in the wrong unit.
const MAX_SHEET_MM = 6000;
const MAX_THICKNESS_MM = 300;

const lengthMm = (label: string, max: number) =>
  z.coerce
    .number({ error: `Enter the ${label} in mm.` })
    .refine(Number.isFinite, `Enter the ${label} in mm.`)
    .gt(0, `The ${label} must be more than 0 mm.`)
    .max(max, `The ${label} must be ${max} mm or less.`);

export const jobCreateSchema = z
  .object({
    title: z.string({ error: 'Enter a title.' }).trim().min(1, 'Enter a title.').max(160, 'Title is too long (160 characters at most).'),
    customerId: z.coerce.number({ error: 'Choose a customer.' }).int('Choose a customer.').positive('Choose a customer.'),
    // unset on create: the shop's first machine that is not archived (db/queries/jobs.ts)
    machineId: z.coerce.number({ error: 'Choose a machine.' }).int('Choose a machine.').positive('Choose a machine.').optional(),
    materialId: z.coerce.number().int().positive('Choose a material.').optional(),
    sheetWidthMm: lengthMm('sheet width', MAX_SHEET_MM),
    sheetLengthMm: lengthMm('sheet length', MAX_SHEET_MM),
    sheetThicknessMm: lengthMm('sheet thickness', MAX_THICKNESS_MM),
    zZero: z.enum(Z_ZEROS, { error: 'Choose top of stock or table surface.' }).default('top'),
    holdDown: z.enum(HOLD_DOWNS, { error: 'Choose a hold-down method.' }),
    vacuumKpa: z.coerce
      .number({ error: 'Enter the vacuum level in kPa.' })
      .gt(0, 'The vacuum level must be more than 0 kPa.')
      .max(ATMOSPHERE_KPA, `The vacuum level cannot exceed one atmosphere (${ATMOSPHERE_KPA} kPa).`)
      .optional(),
    quantity: z.coerce.number({ error: 'Enter a quantity.' }).int('Enter a whole number.').min(1, 'Enter 1 or more.').max(100_000, 'Enter 100000 or less.'),
    dueDate: dueDateSchema.optional(),
    notes: z.string().trim().max(2000, 'Notes are too long (2000 characters at most).').optional(),
  })
  .superRefine((job, ctx) => {
    if (job.vacuumKpa !== undefined && job.holdDown !== 'vacuum') {
      ctx.addIssue({ code: 'custom', path: ['vacuumKpa'], message: 'A vacuum level applies only to vacuum hold-down.' });
    }
  });

export const jobStatusSchema = z.object({ status: z.enum(JOB_STATUSES, { error: 'Choose a status.' }) });

/** An edit sends the whole form again, like a create. */
export const jobUpdateSchema = jobCreateSchema;

export const JOB_SORTS = ['updated', 'created', 'title', 'customer', 'machine', 'due', 'status', 'quantity'] as const;
export const JOB_PAGE_SIZES = [25, 50, 100] as const;
export type JobSort = (typeof JOB_SORTS)[number];

const optionalId = (what: string) =>
  z.coerce.number({ error: `Choose a ${what}.` }).int(`Choose a ${what}.`).positive(`Choose a ${what}.`).max(2_147_483_647, `Choose a ${what}.`).optional();

/** The jobs list's filters, sort and page: URL search params of /jobs and GET /api/jobs. */
export const jobListQuerySchema = z.object({
  status: z.enum(JOB_STATUSES, { error: 'Choose one of the job statuses.' }).optional(),
  customerId: optionalId('customer'),
  machineId: optionalId('machine'),
  q: z.string().trim().max(100, 'Search for 100 characters at most.').optional(),
  sort: z.enum(JOB_SORTS, { error: `Sort by one of: ${JOB_SORTS.join(', ')}.` }).default('updated'),
  dir: z.enum(['asc', 'desc'], { error: 'Sort asc or desc.' }).optional(),
  page: z.coerce.number({ error: 'The page is a whole number from 1.' }).int('The page is a whole number from 1.').min(1, 'The page is a whole number from 1.').max(100_000, 'The page must be 100000 or less.').default(1),
  perPage: z.coerce
    .number({ error: `Show ${JOB_PAGE_SIZES.join(', ')} jobs a page.` })
    .refine((n) => (JOB_PAGE_SIZES as readonly number[]).includes(n), `Show ${JOB_PAGE_SIZES.join(', ')} jobs a page.`)
    .default(25),
});

export type JobListQuery = z.infer<typeof jobListQuerySchema>;

/** Text sorts read A to Z, the rest newest or largest first, unless the query says otherwise. */
export function sortDirection(query: Pick<JobListQuery, 'sort' | 'dir'>): 'asc' | 'desc' {
  if (query.dir) return query.dir;
  return query.sort === 'title' || query.sort === 'customer' || query.sort === 'machine' || query.sort === 'due' ? 'asc' : 'desc';
}

/** URLSearchParams (or a page's searchParams) → the plain object the schema reads; the first value of a repeated key, empty as unset. */
export function searchParamsToObject(params: URLSearchParams | Record<string, string | string[] | undefined>): Record<string, string | undefined> {
  const out: Record<string, string | undefined> = {};
  const entries: [string, string | string[] | undefined][] = params instanceof URLSearchParams ? [...params.keys()].map((k) => [k, params.get(k) ?? undefined]) : Object.entries(params);
  for (const [key, raw] of entries) {
    const value = Array.isArray(raw) ? raw[0] : raw;
    out[key] = value === undefined || value.trim() === '' ? undefined : value;
  }
  return out;
}

export type JobCreateInput = z.infer<typeof jobCreateSchema>;
export type JobStatusInput = z.infer<typeof jobStatusSchema>;
export type JobUpdateInput = z.infer<typeof jobUpdateSchema>;
