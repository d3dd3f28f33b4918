// Sheet material input, shared by the materials form, its server actions and the
// /api/materials route handlers. Lengths in mm (the form converts inches before sending),
// cost in integer minor units of the shop's currency. The limits match the job form's
// (lib/validation/jobs.ts), so a material always gives a job a sheet it accepts.
import { z } from '@/lib/validation/zod';

const INT_MAX = 2_147_483_647;
// The largest common sheet is 5 × 10 ft (1524 × 3048 mm, common practice); as in the job
// form, 6 m leaves room for oversize panels while catching a value typed in the wrong unit.
export const MAX_SHEET_MM = 6000;
export const MAX_THICKNESS_MM = 300;

// Messages name the limit in mm and inches (25.4 mm per inch), as the form may show either.
const lengthMm = (label: string, max: number) =>
  z.coerce
    .number({ error: `Enter the ${label}.` })
    .refine(Number.isFinite, `Enter the ${label} as a number.`)
    .gt(0, `The ${label} must be more than 0.`)
    .max(max, `The ${label} must be ${max} mm (${Math.round((max / 25.4) * 10) / 10} in) or less.`);

const materialFields = z.object({
  name: z.string({ error: 'Enter a name.' }).trim().min(1, 'Enter a name.').max(120, 'Name is too long (120 characters at most).'),
  thicknessMm: lengthMm('thickness', MAX_THICKNESS_MM),
  sheetWidthMm: lengthMm('sheet width', MAX_SHEET_MM),
  sheetLengthMm: lengthMm('sheet length', MAX_SHEET_MM),
  costPerSheetMinor: z.coerce
    .number({ error: 'Enter the cost per sheet.' })
    .int('Enter the cost per sheet in whole minor units (cents).')
    .min(0, 'The cost per sheet must be 0 or more.')
    .max(INT_MAX, 'The cost per sheet is too large.'),
});

export const materialInputSchema = materialFields;
export const materialUpdateSchema = materialFields
  .partial()
  .strict()
  .refine((v) => Object.values(v).some((x) => x !== undefined), { message: 'Nothing to change.', path: ['_form'] });

export type MaterialInput = z.infer<typeof materialInputSchema>;
export type MaterialUpdate = z.infer<typeof materialUpdateSchema>;
