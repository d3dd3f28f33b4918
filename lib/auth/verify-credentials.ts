import 'server-only';
// The credentials check behind sign-in. The attempt is counted first, per client address
// and per e-mail, in the shared table (db/queries/sign-in-limits.ts), and only an attempt
// within both limits reaches bcrypt, so parallel guesses cannot slip past the limit
// while the comparisons run (ASVS 4.0.3 V2.2.1). Every failure (unknown e-mail, wrong
// password, disabled user, malformed input) looks the same to the visitor, and an
// unknown e-mail still costs a bcrypt comparison, so the answer time does not tell
// whether the e-mail exists.
//
// An e-mail is unique per shop (issue 18 finding 9), so one address may have accounts
// in two shops: the password is compared with each, and the first enabled account it
// opens (the oldest) is signed in.
import bcrypt from 'bcryptjs';
import { clearAttempts, releaseAttempt, reserveAttempt } from '@/db/queries/sign-in-limits';
import { findUsersForSignIn } from '@/db/queries/users';
import { signInSchema } from '@/lib/validation/sign-in';
import { DUMMY_HASH } from './password-hashing';
import { limitKey, signInLimits } from './rate-limit';
import type { SessionUser } from './session-user';

export type CredentialsResult =
  | { ok: true; user: SessionUser }
  | { ok: false; reason: 'failed' | 'rate-limited' };

export async function verifyCredentials(raw: unknown, clientAddress: string): Promise<CredentialsResult> {
  const ipKey = limitKey('ip', clientAddress);
  if (!(await reserveAttempt(ipKey, 'ip', signInLimits.perIp)).allowed) return { ok: false, reason: 'rate-limited' };

  // Malformed input (no e-mail, one over 190 characters) counts against the address only.
  const parsed = signInSchema.safeParse(raw);
  if (!parsed.success) return { ok: false, reason: 'failed' };

  const emailKey = limitKey('email', parsed.data.email);
  if (!(await reserveAttempt(emailKey, 'email', signInLimits.perEmail)).allowed) {
    // No password was tried, so the address gets its attempt back.
    await releaseAttempt(ipKey);
    return { ok: false, reason: 'rate-limited' };
  }

  const accounts = await findUsersForSignIn(parsed.data.email);
  let match: (typeof accounts)[number] | null = null;
  if (accounts.length === 0) await bcrypt.compare(parsed.data.password, DUMMY_HASH);
  for (const account of accounts) {
    const passwordOk = await bcrypt.compare(parsed.data.password, account.passwordHash);
    if (passwordOk && !account.disabled && !match) match = account;
  }
  if (!match) return { ok: false, reason: 'failed' };

  await clearAttempts(emailKey);
  await releaseAttempt(ipKey);
  return {
    ok: true,
    user: { id: match.id, shopId: match.shopId, role: match.role, name: match.name, email: match.email, mustChangePassword: match.mustChangePassword },
  };
}
