// Keys and limits of the shared sign-in counters (issue 18 finding 2c, OWASP ASVS 4.0.3
// V2.2.1). The counting itself runs in MariaDB: tests/integration/app-security-sign-in.test.ts.
import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { limitKey, signInLimits } from '@/lib/auth/rate-limit';
import { signInSchema } from '@/lib/validation/sign-in';

describe('sign-in limit keys', () => {
  it('are 64 hex characters whatever the value, and carry neither the e-mail nor the address', () => {
    const email = `${'a'.repeat(180)}@x.example`;
    for (const [kind, value] of [['email', email], ['ip', '2001:db8::1'], ['ip', '203.0.113.7']] as const) {
      const key = limitKey(kind, value);
      expect(key).toMatch(/^[0-9a-f]{64}$/);
      expect(key).not.toContain(value);
    }
  });

  it('is SHA-256 (FIPS 180-4) of kind:value, so an e-mail and an address never share a key', () => {
    // FIPS 180-4 / NIST CSRC example: SHA-256("abc") = ba7816bf…f20015ad; node:crypto is the reference implementation here.
    expect(createHash('sha256').update('abc').digest('hex')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(limitKey('email', 'x')).toBe(createHash('sha256').update('email:x').digest('hex'));
    expect(limitKey('email', '203.0.113.7')).not.toBe(limitKey('ip', '203.0.113.7'));
  });

  it('an e-mail longer than the 190 characters users.email stores is refused before it is counted', () => {
    const long = `${'a'.repeat(181)}@x.example`; // 191 characters
    expect(signInSchema.safeParse({ email: long, password: 'x' }).success).toBe(false);
    expect(signInSchema.safeParse({ email: long.slice(1), password: 'x' }).success).toBe(true);
  });
});

describe('sign-in limits', () => {
  it('per e-mail 5 in 15 minutes, per address more (a shared workshop address), same window', () => {
    expect(signInLimits.perEmail).toEqual({ windowS: 900, maxAttempts: 5 });
    expect(signInLimits.perIp.maxAttempts).toBeGreaterThan(signInLimits.perEmail.maxAttempts);
    expect(signInLimits.perIp.windowS).toBe(signInLimits.perEmail.windowS);
  });
});
