// User administration schemas: e-mail, password rules, role and the disabled flag as
// forms (strings) and JSON (booleans) send them.
import bcrypt from 'bcryptjs';
import { describe, expect, it } from 'vitest';
import { fieldErrors } from '@/lib/validation/form';
import { createUserSchema, disabledFlagSchema, updateUserSchema } from '@/lib/validation/users';

const valid = { name: 'Noor Example', email: '  Noor@Alder-Finch.Example ', role: 'programmer', password: 'sheet-of-birch' };

describe('createUserSchema', () => {
  it('accepts a complete user and normalises the e-mail to trimmed lower case', () => {
    const parsed = createUserSchema.parse(valid);
    expect(parsed.email).toBe('noor@alder-finch.example');
    expect(parsed.role).toBe('programmer');
  });

  it('names every bad field', () => {
    const result = createUserSchema.safeParse({ name: ' ', email: 'noor-at-example', role: 'owner', password: 'short' });
    expect(result.success).toBe(false);
    if (result.success) return;
    const fields = fieldErrors(result.error);
    expect(Object.keys(fields).sort()).toEqual(['email', 'name', 'password', 'role']);
    expect(fields.password).toEqual(['Use at least 12 characters.']);
  });

  it('refuses passwords over 72 bytes, because bcrypt ignores the rest', () => {
    // The reference library shows the reason: two passwords sharing their first 72
    // bytes match the same hash. Provos & Mazières (USENIX 1999) state a 56-byte key, but the
    // key schedule fills Blowfish's 18 32-bit subkeys, 72 bytes, and implementations read that
    // many (docs/references.md); this test's first assertion is what pins the 72.
    const prefix = 'k'.repeat(72);
    expect(bcrypt.compareSync(`${prefix}-one`, bcrypt.hashSync(`${prefix}-two`, 4))).toBe(true);
    expect(createUserSchema.safeParse({ ...valid, password: 'k'.repeat(72) }).success).toBe(true);
    expect(createUserSchema.safeParse({ ...valid, password: 'k'.repeat(73) }).success).toBe(false);
    // bytes, not characters: "é" is 2 bytes in UTF-8 (RFC 3629), so 36 of them are 72 bytes, 37 are 74
    expect(createUserSchema.safeParse({ ...valid, password: 'é'.repeat(36) }).success).toBe(true);
    expect(createUserSchema.safeParse({ ...valid, password: 'é'.repeat(37) }).success).toBe(false);
  });
});

describe('disabled flag', () => {
  it('reads form strings and JSON booleans, and refuses anything else', () => {
    expect(disabledFlagSchema.parse('true')).toBe(true);
    expect(disabledFlagSchema.parse('false')).toBe(false);
    expect(disabledFlagSchema.parse(false)).toBe(false);
    expect(disabledFlagSchema.safeParse('yes').success).toBe(false);
    expect(disabledFlagSchema.safeParse(1).success).toBe(false);
  });
});

describe('updateUserSchema', () => {
  it('needs a role or a disabled flag', () => {
    expect(updateUserSchema.safeParse({}).success).toBe(false);
    expect(updateUserSchema.parse({ role: 'operator' })).toEqual({ role: 'operator' });
    expect(updateUserSchema.parse({ disabled: true })).toEqual({ disabled: true });
  });
});
