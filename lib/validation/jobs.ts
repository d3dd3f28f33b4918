// Job input: the sheet, where Z zero is, the hold-down method and the quantity.
// Lengths in mm. Vacuum level in kPa below atmosphere, so it cannot exceed one
// standard atmosphere, 101.325 kPa (NIST SP 811, 2008, Appendix B).
import { z } from '@/lib/validation/zod';
import { HOLD_DOWNS, JOB_STATUSES, Z_ZEROS } from './enums';

const ATMOSPHERE_KPA = 101.325;
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
  })
  .superRefine((job, ctx) => {
    if (job.vacuumKpa !== undefined && job.holdDown !== 'vacuum') {
      ctx.addIssue({ code: 'custom', path: ['vacuumKpa'], message: 'A vacuum level applies only to vacuum hold-down.' });
    }
  });

export const jobStatusSchema = z.object({ status: z.enum(JOB_STATUSES, { error: 'Choose a status.' }) });

export type JobCreateInput = z.infer<typeof jobCreateSchema>;
export type JobStatusInput = z.infer<typeof jobStatusSchema>;
