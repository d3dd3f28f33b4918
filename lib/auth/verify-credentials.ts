import 'server-only';
// The credentials check behind sign-in: rate limits first, then the password with
// bcrypt. Every failure (unknown e-mail, wrong password, disabled user, malformed
// input) looks the same to the visitor, and an unknown e-mail still costs a bcrypt
// comparison so that the answer time does not tell whether the e-mail exists.
import bcrypt from 'bcryptjs';
import { findUserForSignIn } from '@/db/queries/users';
import { signInSchema } from '@/lib/validation/sign-in';
import { DUMMY_HASH } from './password-hashing';
import { signInLimiters } from './rate-limit';
import type { SessionUser } from './session-user';

export type CredentialsResult =
  | { ok: true; user: SessionUser }
  | { ok: false; reason: 'failed' | 'rate-limited' };

export async function verifyCredentials(raw: unknown, ip: string): Promise<CredentialsResult> {
  const parsed = signInSchema.safeParse(raw);
  const emailKey = parsed.success ? parsed.data.email : '';
  const ipKey = `ip:${ip}`;
  if (signInLimiters.ip.isBlocked(ipKey) || (emailKey && signInLimiters.email.isBlocked(emailKey))) {
    return { ok: false, reason: 'rate-limited' };
  }
  if (!parsed.success) {
    signInLimiters.ip.recordFailure(ipKey);
    return { ok: false, reason: 'failed' };
  }

  const user = await findUserForSignIn(parsed.data.email);
  const passwordOk = await bcrypt.compare(parsed.data.password, user?.passwordHash ?? DUMMY_HASH);
  if (!user || !passwordOk || user.disabled) {
    signInLimiters.ip.recordFailure(ipKey);
    signInLimiters.email.recordFailure(emailKey);
    return { ok: false, reason: 'failed' };
  }
  signInLimiters.email.reset(emailKey);
  return { ok: true, user: { id: user.id, shopId: user.shopId, role: user.role, name: user.name, email: user.email } };
}

/**
 * The client address for the per-IP limit. `next start` fills x-forwarded-for with the
 * socket address only when the header is missing (next/dist/server/base-server.js), so
 * a visitor reaching it directly could pick their own key: in production a reverse
 * proxy in front must overwrite the header. The per-e-mail limit does not depend on it.
 */
export function clientIp(headers: Record<string, string | string[] | undefined> | undefined): string {
  const raw = headers?.['x-forwarded-for'] ?? headers?.['x-real-ip'];
  const value = Array.isArray(raw) ? raw[0] : raw;
  return value?.split(',')[0]?.trim() || 'unknown';
}
