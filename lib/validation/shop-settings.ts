// The shop settings form (/admin/settings) and PUT /api/shop/settings: every column of
// shop_settings. Shares in percent on the form, basis points in the table (1 % = 100 bp);
// times in seconds; money in whole minor units.
import { z } from '@/lib/validation/zod';

const num = (label: string, max: number) =>
  z.coerce
    .number({ error: `Enter the ${label}.` })
    .refine(Number.isFinite, `Enter the ${label} as a number.`)
    .min(0, `The ${label} must be 0 or more.`)
    .max(max, `The ${label} must be ${max.toLocaleString('en')} or less.`);

const whole = (label: string, min: number, max: number) =>
  z.coerce
    .number({ error: `Enter the ${label}.` })
    .int(`The ${label} must be a whole number.`)
    .min(min, `The ${label} must be ${min} or more.`)
    .max(max, `The ${label} must be ${max.toLocaleString('en')} or less.`);

export const shopSettingsSchema = z
  .object({
    address: z.string().max(500, 'The address is too long (500 characters at most).').default(''),
    quoteTerms: z.string().max(2000, 'The terms are too long (2000 characters at most).').default(''),
    quoteValidityDays: whole('validity (days)', 1, 365),
    setupS: num('setup time (s)', 86_400),
    loadUnloadSPerSheet: num('load/unload time per sheet (s)', 86_400),
    wasteAllowanceBp: whole('waste allowance (bp)', 0, 10_000),
    marginBp: whole('margin (bp)', 0, 100_000),
    taxBp: whole('tax (bp)', 0, 10_000),
    roundToMinor: whole('rounding step (minor units)', 1, 1_000_000),
    roundingMode: z.enum(['nearest', 'up'], { error: 'Choose how to round.' }),
    labourRateMinorPerHour: whole('labour rate (minor units per hour)', 0, 10_000_000),
    tapeGlueSPerPart: num('tape-and-glue time per part (s)', 3600),
    tabSPerTab: num('time per tab (s)', 3600),
    skinSPerPart: num('onion-skin time per part (s)', 3600),
    clampsSPerSheet: num('clamping time per sheet (s)', 3600),
    tapeCostMinorPerM2: whole('tape cost (minor units per m²)', 0, 1_000_000),
    glueCostMinorPerPart: whole('glue cost (minor units per part)', 0, 1_000_000),
    calibrationRuns: whole('runs used by calibration', 1, 1000),
    calibrationMinRuns: whole('minimum runs for calibration', 1, 1000),
  })
  .strict()
  .refine((v) => v.calibrationMinRuns <= v.calibrationRuns, {
    message: 'The minimum runs cannot be more than the runs used.',
    path: ['calibrationMinRuns'],
  });

export type ShopSettingsInput = z.infer<typeof shopSettingsSchema>;
