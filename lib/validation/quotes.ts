// Quote input from the quote builder and POST /api/jobs/:jobId/quotes, the customer's answer
// on /q/:token, and a quote's send request. Money in whole minor units of the shop's currency.
import { z } from '@/lib/validation/zod';
import { HOLD_DOWNS } from '@/lib/validation/enums';

const INT_MAX = 2_147_483_647;

const wholeNumber = (label: string, min: number, max: number) =>
  z.coerce
    .number({ error: `Enter the ${label}.` })
    .int(`The ${label} must be a whole number.`)
    .min(min, `The ${label} must be ${min} or more.`)
    .max(max, `The ${label} must be ${max.toLocaleString('en')} or less.`);

export const extraLineSchema = z.object({
  label: z.string({ error: 'Name the line.' }).trim().min(1, 'Name the line.').max(200, 'The line name is too long (200 characters at most).'),
  amountMinor: wholeNumber('amount (minor units)', 0, 100_000_000),
});

export const quoteInputSchema = z.object({
  estimateId: wholeNumber('estimate', 1, INT_MAX),
  quantity: wholeNumber('quantity', 1, 1_000_000),
  partsPerSheet: wholeNumber('parts per sheet', 1, 100_000),
  holdDown: z.enum(HOLD_DOWNS, { error: 'Choose a hold-down method.' }),
  extraLines: z.array(extraLineSchema).max(20, 'At most 20 lines of your own.').default([]),
  /** the quote this one revises, if any */
  revisionOf: wholeNumber('quote revised', 1, INT_MAX).optional(),
});

export type QuoteInput = z.infer<typeof quoteInputSchema>;

export const quoteAcceptSchema = z.object({
  name: z.string({ error: 'Enter your name.' }).trim().min(1, 'Enter your name.').max(160, 'The name is too long (160 characters at most).'),
  purchaseOrder: z.string().trim().max(80, 'The purchase-order number is too long (80 characters at most).').optional(),
});

export const quoteDeclineSchema = z.object({
  reason: z.string().trim().max(1000, 'The reason is too long (1000 characters at most).').optional(),
});
