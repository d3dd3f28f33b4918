// What an unexpected server error leaves in the log (issue 18 finding 8; OWASP ASVS
// 4.0.3 V7.1.1 no credentials or sensitive data in logs, V8.3.4). The error is a real
// drizzle-orm DrizzleQueryError around a mysql2-style duplicate-key error, whose message
// (drizzle-orm's own format) carries the query and its parameters.
import { DrizzleQueryError } from 'drizzle-orm/errors';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { errorCode, logUnexpected } from '@/lib/http/log-error';

const HASH = '$2b$10$jW3VTN2ZF5NTa6UAYAbYhOtBee2JGOjfCdHhj2qyQCCH9L7liacDG';

function duplicateKeyError(): DrizzleQueryError {
  const cause = Object.assign(new Error("Duplicate entry '1-noor@alder-finch.example' for key 'users_shop_email_unique'"), { code: 'ER_DUP_ENTRY', errno: 1062 });
  return new DrizzleQueryError('insert into `users` (`shop_id`, `email`, `password_hash`) values (?, ?, ?)', [1, 'noor@alder-finch.example', HASH], cause);
}

afterEach(() => vi.restoreAllMocks());

describe('logUnexpected (ASVS V7.1.1)', () => {
  it('the wrapped error really carries the parameters (why it is not printed)', () => {
    expect(duplicateKeyError().message).toContain(HASH);
  });

  it('prints the place and the driver code only', () => {
    const lines: string[] = [];
    vi.spyOn(console, 'error').mockImplementation((...args: unknown[]) => void lines.push(args.map(String).join(' ')));
    logUnexpected('POST /api/users', duplicateKeyError());
    expect(lines).toEqual(['[kerfcast] unexpected error in POST /api/users: ER_DUP_ENTRY']);
  });

  it('falls back to the error name, and never to a message', () => {
    expect(errorCode(new TypeError('secret details'))).toBe('TypeError');
    expect(errorCode({ code: 'has spaces and a secret' })).toBe('unknown');
  });
});
