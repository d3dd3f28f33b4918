// One bcrypt cost everywhere, so a sign-in takes as long for an unknown e-mail as for
// a real account (the cost is the "$10$" field of the hash, read with bcryptjs).
import bcrypt from 'bcryptjs';
import { describe, expect, it } from 'vitest';
import { BCRYPT_COST } from '@/db/seed-data';
import { BCRYPT_ROUNDS, DUMMY_HASH } from '@/lib/auth/password-hashing';

describe('password hashing settings', () => {
  it('uses the same cost for new users, the demo seed and the unknown-e-mail hash', () => {
    expect(bcrypt.getRounds(DUMMY_HASH)).toBe(BCRYPT_ROUNDS);
    expect(BCRYPT_COST).toBe(BCRYPT_ROUNDS);
  });

  it('meets the OWASP password-storage floor for bcrypt (cost 10)', () => {
    expect(BCRYPT_ROUNDS).toBeGreaterThanOrEqual(10);
  });

  it('has a dummy hash that does not match an empty or demo password', () => {
    expect(bcrypt.compareSync('', DUMMY_HASH)).toBe(false);
    expect(bcrypt.compareSync('kerfcast-demo', DUMMY_HASH)).toBe(false);
  });
});
