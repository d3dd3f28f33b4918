// Limits of failed sign-ins and the keys they are counted under. The counts live in
// MariaDB (db/queries/sign-in-limits.ts), so every server process shares them (issue 17)
// and nothing grows in a process's memory. A key is the sha256 of its kind and value:
// a 190-character e-mail and an IPv6 address both become 64 hex characters, and neither
// is stored in clear.
import { createHash } from 'node:crypto';

// Per e-mail: 5 attempts in 15 minutes (a common practice for password forms; OWASP's
// authentication cheat sheet recommends a lockout threshold without fixing a number).
// Per address: more, because a workshop often shares one address behind its router.
export const signInLimits = {
  perEmail: { windowS: 15 * 60, maxAttempts: 5 },
  perIp: { windowS: 15 * 60, maxAttempts: 50 },
} as const;

export function limitKey(kind: 'email' | 'ip', value: string): string {
  return createHash('sha256').update(`${kind}:${value}`).digest('hex');
}
