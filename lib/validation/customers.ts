// Customer input, shared by the create-customer form, its server action and the
// /api/customers route handlers.
import { z } from '@/lib/validation/zod';
import { emailSchema } from './users';

// Without defaults, so that the partial update schema does not invent a change.
const customerFields = z.object({
  name: z.string({ error: 'Enter a name.' }).trim().min(1, 'Enter a name.').max(160, 'Name is too long (160 characters at most).'),
  email: emailSchema,
  phone: z
    .string()
    .trim()
    .max(40, 'Phone is too long (40 characters at most).')
    .regex(/^[0-9+()\-./ ]*$/, 'Use digits, spaces and + ( ) - . / only.')
    .optional(),
  notes: z.string().trim().max(2000, 'Notes are too long (2000 characters at most).').optional(),
});

export const customerInputSchema = customerFields.extend({ phone: customerFields.shape.phone.default('') });

export const customerUpdateSchema = customerFields.partial().refine((v) => Object.values(v).some((x) => x !== undefined), {
  message: 'Nothing to change.',
  path: ['_form'],
});

export type CustomerInput = z.infer<typeof customerInputSchema>;
export type CustomerUpdate = z.infer<typeof customerUpdateSchema>;
