// Sign-in messages, the callback path filter (no open redirect) and the error codes'
// HTTP statuses (RFC 9110 §15.5: 401, 403, 404, 409, 422; RFC 6585 §4: 429).
import { describe, expect, it } from 'vitest';
import { safeCallbackPath, SIGN_IN_FAILED_MESSAGE, SIGN_IN_RATE_LIMITED_MESSAGE, signInErrorMessage, whoMay } from '@/lib/auth/messages';
import { AppError, appErrorFromBody, isErrorBody, statusForCode } from '@/lib/errors';
import { ROLE_IN_SENTENCE, ROLE_LABELS, ROLES } from '@/lib/validation/enums';

describe('sign-in messages', () => {
  it('say nothing about whether the e-mail exists', () => {
    expect(SIGN_IN_FAILED_MESSAGE).toBe('Wrong e-mail or password. Check both and try again.');
    expect(signInErrorMessage('CredentialsSignin')).toBe(SIGN_IN_FAILED_MESSAGE);
    expect(signInErrorMessage('<script>alert(1)</script>')).toBe(SIGN_IN_FAILED_MESSAGE);
    expect(signInErrorMessage(SIGN_IN_RATE_LIMITED_MESSAGE)).toBe(SIGN_IN_RATE_LIMITED_MESSAGE);
    expect(signInErrorMessage(undefined)).toBeNull();
  });
});

describe('roles in sentences', () => {
  it('take "an" before a vowel sound and "a" before a consonant (English grammar), with the role label in lower case', () => {
    for (const role of ROLES) {
      const label = ROLE_LABELS[role].toLowerCase();
      expect(ROLE_IN_SENTENCE[role]).toBe(`${/^[aeiou]/.test(label) ? 'an' : 'a'} ${label}`);
    }
  });

  // expected values from the role table in the header of lib/auth/roles.ts
  it('name the roles that may do an action, from the role table', () => {
    expect(whoMay('machines:write', true)).toBe('An admin');
    expect(whoMay('jobs:write', true)).toBe('An admin or a programmer');
    expect(whoMay('estimates:write')).toBe('an admin, a programmer or an estimator');
    expect(whoMay('jobs:write')).toBe('an admin or a programmer');
    expect(whoMay('users:write')).toBe('an admin');
  });
});

describe('safeCallbackPath', () => {
  it.each([
    ['/jobs', '/jobs'],
    ['/customers?sort=name', '/customers?sort=name'],
    ['//evil.example/jobs', '/jobs'],
    ['https://evil.example/', '/jobs'],
    ['javascript:alert(1)', '/jobs'],
    ['/sign-in', '/jobs'],
    ['/api/users', '/jobs'],
    [undefined, '/jobs'],
  ])('%s → %s', (raw, expected) => {
    expect(safeCallbackPath(raw)).toBe(expected);
  });
});

describe('AppError', () => {
  it.each([
    ['unauthorized', 401],
    ['forbidden:job', 403],
    ['not-found:customer', 404],
    ['conflict', 409],
    ['invalid:user', 422],
    ['rate-limited', 429],
    ['something-else', 500],
  ])('%s → %i', (code, status) => {
    expect(statusForCode(code)).toBe(status);
  });

  it('survives the trip through JSON with its code and fields', () => {
    const original = new AppError('invalid:job', 'Some of the job details need fixing: each one is named at its field.', { quantity: ['Enter 1 or more.'] });
    const body: unknown = JSON.parse(JSON.stringify(original.toBody()));
    expect(isErrorBody(body)).toBe(true);
    if (!isErrorBody(body)) return;
    const back = appErrorFromBody(body);
    expect(back).toBeInstanceOf(AppError);
    expect([back.code, back.status, back.message, back.fields]).toEqual([original.code, 422, original.message, original.fields]);
    expect(isErrorBody({ error: 'nope' })).toBe(false);
  });
});
