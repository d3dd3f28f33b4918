// The server's check of a new password beyond its length (lib/validation/users.ts):
// it must not be one of the 50,000 most common passwords of eight characters or more
// in the list fxa-common-password-list ships (drawn from the "10 million password list"
// top million), compared as typed and lower-cased (ASVS 4.0.3 V2.1.7). The list stays
// on the server: the forms' schema runs in the browser too and should not carry it, so
// only server code (db/queries/users.ts) imports this module.
import commonPasswords from 'fxa-common-password-list';
import { AppError } from '@/lib/errors';

export const COMMON_PASSWORD_MESSAGE = 'This password is on a list of the most common passwords. Choose another.';

export function isCommonPassword(password: string): boolean {
  return commonPasswords.test(password) || commonPasswords.test(password.toLowerCase());
}

/** Throws invalid:<what> with the message on `field` when the password is a common one. */
export function assertUncommonPassword(password: string, field: string, what = 'user'): void {
  if (isCommonPassword(password)) {
    throw new AppError(`invalid:${what}`, 'Some fields are not right.', { [field]: [COMMON_PASSWORD_MESSAGE] });
  }
}
