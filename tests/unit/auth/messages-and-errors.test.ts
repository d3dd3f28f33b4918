// Sign-in messages, the callback path filter (no open redirect) and the error codes'
// HTTP statuses (RFC 9110 §15.5: 401, 403, 404, 409, 422; RFC 6585 §4: 429).
import { describe, expect, it } from 'vitest';
import { safeCallbackPath, SIGN_IN_FAILED_MESSAGE, SIGN_IN_RATE_LIMITED_MESSAGE, signInErrorMessage } from '@/lib/auth/messages';
import { AppError, appErrorFromBody, isErrorBody, statusForCode } from '@/lib/errors';

describe('sign-in messages', () => {
  it('say nothing about whether the e-mail exists', () => {
    expect(SIGN_IN_FAILED_MESSAGE).toBe('E-mail or password is not right.');
    expect(signInErrorMessage('CredentialsSignin')).toBe(SIGN_IN_FAILED_MESSAGE);
    expect(signInErrorMessage('<script>alert(1)</script>')).toBe(SIGN_IN_FAILED_MESSAGE);
    expect(signInErrorMessage(SIGN_IN_RATE_LIMITED_MESSAGE)).toBe(SIGN_IN_RATE_LIMITED_MESSAGE);
    expect(signInErrorMessage(undefined)).toBeNull();
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
    const original = new AppError('invalid:job', 'Some job fields are not right.', { quantity: ['Enter 1 or more.'] });
    const body: unknown = JSON.parse(JSON.stringify(original.toBody()));
    expect(isErrorBody(body)).toBe(true);
    if (!isErrorBody(body)) return;
    const back = appErrorFromBody(body);
    expect(back).toBeInstanceOf(AppError);
    expect([back.code, back.status, back.message, back.fields]).toEqual([original.code, 422, original.message, original.fields]);
    expect(isErrorBody({ error: 'nope' })).toBe(false);
  });
});
