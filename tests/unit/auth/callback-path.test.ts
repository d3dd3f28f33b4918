// Where the browser goes after sign-in (issue 18 finding 1, OWASP ASVS 4.0.3 V5.1.5:
// redirects only to allow-listed destinations). The hostile values are the issue's own
// probes; what a browser makes of them follows the WHATWG URL Standard's path parsing
// (single-dot and double-dot segments, "%2e" counting as ".", "\" as "/" in special URLs).
import { describe, expect, it } from 'vitest';
import { safeCallbackPath } from '@/lib/auth/messages';

const ORIGIN = 'http://127.0.0.1:3000';
const staysHome = (path: string) => new URL(path, ORIGIN).origin === ORIGIN && !path.startsWith('//');

describe('safeCallbackPath (ASVS V5.1.5)', () => {
  it.each([
    '/.//evil.example/phish',
    '/jobs/..//x',
    '/%2e//x',
    '/%2E//evil.example',
    '//evil.example/phish',
    '/\\evil.example',
    '/jobs/\\..\\..\\/evil.example',
    'https://evil.example/',
    'javascript:alert(1)',
    '/jobs\n//evil.example',
    ' /jobs',
  ])('refuses %j and falls back to the home page', (raw) => {
    expect(safeCallbackPath(raw, '/machines')).toBe('/machines');
  });

  it('the WHATWG parser really turns the dot forms into another host (the reason for the check)', () => {
    expect(new URL('/.//evil.example/phish', ORIGIN).pathname).toBe('//evil.example/phish');
    expect(new URL('/%2e//x', ORIGIN).pathname).toBe('//x');
    // …which, given to a browser as a location, is protocol-relative: another origin
    expect(new URL('//evil.example/phish', ORIGIN).origin).toBe('http://evil.example');
  });

  it.each([
    ['/jobs', '/jobs'],
    ['/jobs/12?tab=programs', '/jobs/12?tab=programs'],
    ['/jobs/./12', '/jobs/12'],
    ['/machines/../jobs', '/jobs'],
    ['/jobs#top', '/jobs'],
  ])('keeps the app path %j as %j', (raw, expected) => {
    expect(safeCallbackPath(raw)).toBe(expected);
    expect(staysHome(expected)).toBe(true);
  });

  it('never sends back to the sign-in page or into the API', () => {
    expect(safeCallbackPath('/sign-in?callbackUrl=/jobs', '/jobs')).toBe('/jobs');
    expect(safeCallbackPath('/api/users', '/jobs')).toBe('/jobs');
  });
});
