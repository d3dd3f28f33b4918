// Sign-in form input. Deliberately loose on the password (only non-empty): the
// rules for a new password live in users.ts, and a sign-in must not hint at them.
import { z } from '@/lib/validation/zod';

export const signInSchema = z.object({
  // 190 characters, as users.email stores: a longer one cannot be an account (issue 18, finding 2c)
  email: z
    .string({ error: 'Enter your e-mail.' })
    .trim()
    .toLowerCase()
    .min(1, 'Enter your e-mail.')
    .max(190, 'E-mail is too long (190 characters at most).')
    .pipe(z.email('Enter an e-mail like name@example.com.')),
  password: z.string({ error: 'Enter your password.' }).min(1, 'Enter your password.').max(200, 'Password is too long.'),
});

export type SignInInput = z.infer<typeof signInSchema>;
