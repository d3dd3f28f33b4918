// User administration input: creating a user, changing a role, disabling and
// enabling. Shared by the admin page's forms, its server actions and /api/users.
import { z } from '@/lib/validation/zod';
import { ROLES } from './enums';

// bcrypt reads only the first 72 bytes of a password (OpenBSD bcrypt(3)); a longer
// one would silently match any password sharing that prefix, so it is refused.
const BCRYPT_MAX_BYTES = 72;

export const emailSchema = z
  .string({ error: 'Enter an e-mail.' })
  .trim()
  .toLowerCase()
  .min(1, 'Enter an e-mail.')
  .max(190, 'E-mail is too long (190 characters at most).')
  .pipe(z.email('Enter an e-mail like name@example.com.'));

/** ASVS 4.0.3 V2.1.1: at least 12 characters. The common-password list is checked on the server (lib/auth/password-policy.ts). */
export const PASSWORD_MIN_CHARS = 12;

export const newPasswordSchema = z
  .string({ error: 'Enter a password.' })
  .min(PASSWORD_MIN_CHARS, `Use at least ${PASSWORD_MIN_CHARS} characters.`)
  .refine((value) => new TextEncoder().encode(value).length <= BCRYPT_MAX_BYTES, 'Use at most 72 bytes.');

export const roleSchema = z.enum(ROLES, { error: 'Choose a role.' });

export const createUserSchema = z.object({
  name: z.string({ error: 'Enter a name.' }).trim().min(1, 'Enter a name.').max(120, 'Name is too long (120 characters at most).'),
  email: emailSchema,
  role: roleSchema,
  password: newPasswordSchema,
});

export const changeRoleSchema = z.object({ role: roleSchema });

// FormData sends "true"/"false"; JSON sends booleans. z.coerce.boolean() would read
// "false" as true, so the strings are mapped explicitly.
export const disabledFlagSchema = z.union([z.boolean(), z.enum(['true', 'false']).transform((v) => v === 'true')], {
  error: 'Choose enabled or disabled.',
});

export const setDisabledSchema = z.object({ disabled: disabledFlagSchema });

/** PATCH /api/users/[userId]: a role change, a disable/enable, a one-time password, or several. */
export const updateUserSchema = z
  .object({ role: roleSchema.optional(), disabled: disabledFlagSchema.optional(), oneTimePassword: newPasswordSchema.optional() })
  .refine((v) => v.role !== undefined || v.disabled !== undefined || v.oneTimePassword !== undefined, { message: 'Nothing to change.', path: ['_form'] });

/** An admin sets a password the user must replace at their next sign-in (ASVS V2.1.5). */
export const oneTimePasswordSchema = z.object({ oneTimePassword: newPasswordSchema });

/** A user changes their own password; the current one is asked again (ASVS V2.1.5, V3.3.3 for the other sessions). */
export const changeOwnPasswordSchema = z
  .object({
    currentPassword: z.string({ error: 'Enter your current password.' }).min(1, 'Enter your current password.').max(200, 'Password is too long.'),
    newPassword: newPasswordSchema,
    repeatPassword: z.string({ error: 'Type the new password again.' }),
  })
  .refine((v) => v.newPassword === v.repeatPassword, { message: 'The two new passwords differ.', path: ['repeatPassword'] })
  .refine((v) => v.newPassword !== v.currentPassword, { message: 'Choose a password other than the current one.', path: ['newPassword'] });

export type CreateUserInput = z.infer<typeof createUserSchema>;
export type UpdateUserInput = z.infer<typeof updateUserSchema>;
export type ChangeOwnPasswordInput = z.infer<typeof changeOwnPasswordSchema>;
