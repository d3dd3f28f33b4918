// Route ids and the sign-in form.
import { describe, expect, it } from 'vitest';
import { AppError } from '@/lib/errors';
import { parseId } from '@/lib/validation/ids';
import { signInSchema } from '@/lib/validation/sign-in';

describe('parseId', () => {
  it('takes positive integers up to INT’s maximum, 2147483647 (MariaDB INT, signed)', () => {
    expect(parseId('12', 'job')).toBe(12);
    expect(parseId('2147483647', 'job')).toBe(2147483647);
  });

  it.each(['0', '-3', '12abc', '1.5', '1e3', '', '2147483648', ' 7'])('answers "%s" with not-found', (raw) => {
    try {
      parseId(raw, 'job');
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(AppError);
      expect((error as AppError).code).toBe('not-found:job');
      expect((error as AppError).status).toBe(404);
    }
  });
});

describe('signInSchema', () => {
  it('trims and lower-cases the e-mail, keeps the password as typed', () => {
    expect(signInSchema.parse({ email: ' Ada@Alder-Finch.Example ', password: ' Pass ' })).toEqual({
      email: 'ada@alder-finch.example',
      password: ' Pass ',
    });
  });

  it('asks for both fields', () => {
    const result = signInSchema.safeParse({ email: '', password: '' });
    expect(result.success).toBe(false);
    if (!result.success) expect(result.error.issues.map((i) => i.path[0]).sort()).toEqual(['email', 'password']);
  });
});
