// The cross-site write check of lib/http/same-origin.ts (issue 18 finding 7; OWASP ASVS
// 4.0.3 V13.2.5, V4.2.2). Header meanings: Fetch Metadata (W3C, Sec-Fetch-Site values
// same-origin / same-site / cross-site / none), RFC 6454 §7 (Origin, "null"), and the
// WHATWG Fetch Standard's CORS-safelisted request content types (a form or a no-cors
// fetch may send text/plain, application/x-www-form-urlencoded and multipart/form-data
// without a preflight).
import { describe, expect, it } from 'vitest';
import { crossSiteWriteError } from '@/lib/http/same-origin';

const APP = 'http://127.0.0.1:3000';

function request(method: string, headers: Record<string, string>, body?: string): Request {
  return new Request(`${APP}/api/customers`, { method, headers: { host: '127.0.0.1:3000', ...headers }, body });
}

const code = (r: Request, app = APP) => crossSiteWriteError(r, app)?.code ?? null;

describe('cross-site writes (ASVS V13.2.5)', () => {
  it('refuses the probe of the review: text/plain from a foreign Origin', () => {
    const probe = request('POST', { origin: 'https://evil.example', 'content-type': 'text/plain' }, '{"name":"x"}');
    expect(code(probe)).toBe('forbidden:origin');
  });

  it.each(['cross-site', 'same-site', 'none'])('refuses Sec-Fetch-Site: %s', (site) => {
    expect(code(request('PATCH', { 'sec-fetch-site': site, 'content-type': 'application/json' }, '{}'))).toBe('forbidden:origin');
  });

  it('refuses Origin: null (sandboxed frames, RFC 6454 §7.3) and a sibling port', () => {
    expect(code(request('DELETE', { origin: 'null' }))).toBe('forbidden:origin');
    expect(code(request('POST', { origin: 'http://127.0.0.1:3001', 'content-type': 'application/json' }, '{}'))).toBe('forbidden:origin');
  });

  it.each(['text/plain', 'application/x-www-form-urlencoded', 'text/plain;charset=UTF-8'])(
    'refuses a %s body even from the app itself: 415',
    (type) => {
      const r = request('POST', { origin: APP, 'sec-fetch-site': 'same-origin', 'content-type': type }, 'a=1');
      expect(code(r)).toBe('unsupported:content-type');
      expect(crossSiteWriteError(r, APP)?.status).toBe(415);
    },
  );

  it('lets the app\'s own pages send JSON and multipart uploads', () => {
    const own = { origin: APP, 'sec-fetch-site': 'same-origin' };
    expect(code(request('POST', { ...own, 'content-type': 'application/json; charset=utf-8' }, '{}'))).toBeNull();
    expect(code(request('POST', { ...own, 'content-type': 'multipart/form-data; boundary=x' }, '--x--'))).toBeNull();
    expect(code(request('DELETE', own))).toBeNull();
  });

  it('takes localhost and 127.0.0.1 as the same local app, but not another host name', () => {
    const viaLocalhost = new Request('http://localhost:3000/api/customers', {
      method: 'POST',
      headers: { host: 'localhost:3000', origin: 'http://localhost:3000', 'content-type': 'application/json' },
      body: '{}',
    });
    expect(code(viaLocalhost)).toBeNull();
    const rebound = new Request('http://rebound.example:3000/api/customers', {
      method: 'POST',
      headers: { host: 'rebound.example:3000', origin: 'http://rebound.example:3000', 'content-type': 'application/json' },
      body: '{}',
    });
    expect(code(rebound)).toBe('forbidden:origin');
  });

  it('leaves reads alone and lets non-browser clients (no Origin, no Sec-Fetch-Site) send JSON', () => {
    expect(code(request('GET', { origin: 'https://evil.example', 'sec-fetch-site': 'cross-site' }))).toBeNull();
    expect(code(request('POST', { 'content-type': 'application/json' }, '{}'))).toBeNull();
  });
});
