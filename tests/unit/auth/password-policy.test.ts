// New-password rules (issue 18 finding 5; OWASP ASVS 4.0.3 V2.1.1 at least 12
// characters, V2.1.7 refuse passwords found in breach or common-password lists). The
// common list is fxa-common-password-list 0.0.4 (the 50,000 most common of the
// "10 million password list" top million, 8 characters or longer).
import { describe, expect, it } from 'vitest';
import { isCommonPassword } from '@/lib/auth/password-policy';
import { changeOwnPasswordSchema, createUserSchema } from '@/lib/validation/users';

const valid = { name: 'Noor Example', email: 'noor@alder-finch.example', role: 'programmer', password: 'sheet-of-birch' };

describe('password length (ASVS V2.1.1)', () => {
  it('refuses 11 characters and takes 12', () => {
    const short = createUserSchema.safeParse({ ...valid, password: 'k'.repeat(11) });
    expect(short.success).toBe(false);
    if (!short.success) expect(short.error.issues[0].message).toBe('Use at least 12 characters.');
    expect(createUserSchema.safeParse({ ...valid, password: 'k'.repeat(12) }).success).toBe(true);
  });
});

describe('common passwords (ASVS V2.1.7)', () => {
  it.each(['password1234', '123456789012', 'qwertyuiop123', 'PASSWORD1234'])('refuses %j, which is on the list', (password) => {
    expect(isCommonPassword(password)).toBe(true);
  });

  it.each(['sheet-of-birch', 'spoilboard-42', 'kerfcast-demo'])('takes %j', (password) => {
    expect(isCommonPassword(password)).toBe(false);
  });
});

describe('changing one\'s own password (ASVS V2.1.5)', () => {
  it('needs the current password, the new one twice, and a new one that differs', () => {
    const ok = { currentPassword: 'kerfcast-demo', newPassword: 'offcut-shelf-77', repeatPassword: 'offcut-shelf-77' };
    expect(changeOwnPasswordSchema.safeParse(ok).success).toBe(true);
    const fields = (input: object) => {
      const r = changeOwnPasswordSchema.safeParse(input);
      return r.success ? [] : r.error.issues.map((i) => i.path.join('.'));
    };
    expect(fields({ ...ok, currentPassword: '' })).toContain('currentPassword');
    expect(fields({ ...ok, repeatPassword: 'offcut-shelf-78' })).toEqual(['repeatPassword']);
    expect(fields({ ...ok, currentPassword: ok.newPassword })).toEqual(['newPassword']);
  });
});
