// The client address the per-address sign-in limit counts (issue 18 finding 2a; OWASP
// ASVS 4.0.3 V2.2.1). X-Forwarded-For's form is from MDN's reference and RFC 7239 §5.2's
// discussion of the same list: each proxy appends the address it received the request
// from, so only the right-most entries added by one's own proxies can be believed.
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { describe, expect, it } from 'vitest';
import { CLIENT_ADDRESS_HEADER, clientAddressFrom, installClientAddressHook, normaliseAddress, resolveClientAddress } from '@/lib/http/client-address';

describe('resolveClientAddress', () => {
  it('ignores X-Forwarded-For from a connection that is not a trusted proxy', () => {
    expect(resolveClientAddress('198.51.100.4', '203.0.113.7', [])).toBe('198.51.100.4');
    expect(resolveClientAddress('198.51.100.4', '203.0.113.7', ['10.0.0.2'])).toBe('198.51.100.4');
  });

  it('behind a trusted proxy takes the right-most address that is not a trusted proxy', () => {
    // the client forged the first entry; the proxy appended the real one
    expect(resolveClientAddress('10.0.0.2', '1.2.3.4, 203.0.113.7', ['10.0.0.2'])).toBe('203.0.113.7');
    expect(resolveClientAddress('10.0.0.2', '203.0.113.7, 10.0.0.3', ['10.0.0.2', '10.0.0.3'])).toBe('203.0.113.7');
    expect(resolveClientAddress('10.0.0.2', undefined, ['10.0.0.2'])).toBe('10.0.0.2');
  });

  it('writes IPv4-mapped IPv6 (RFC 4291 §2.5.5.2) as plain IPv4', () => {
    expect(normaliseAddress('::ffff:127.0.0.1')).toBe('127.0.0.1');
    expect(resolveClientAddress('::ffff:10.0.0.2', '203.0.113.7', ['10.0.0.2'])).toBe('203.0.113.7');
  });
});

describe('installClientAddressHook', () => {
  it('replaces a header the client sent with the connection\'s address', async () => {
    installClientAddressHook([]);
    const server = http.createServer((req, res) => res.end(JSON.stringify({ seen: clientAddressFrom(req.headers) })));
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    try {
      const { port } = server.address() as AddressInfo;
      const answer = await fetch(`http://127.0.0.1:${port}/`, {
        headers: { 'x-forwarded-for': '203.0.113.7', [CLIENT_ADDRESS_HEADER]: '203.0.113.8' },
      });
      expect(await answer.json()).toEqual({ seen: '127.0.0.1' });
    } finally {
      await new Promise((resolve) => server.close(resolve));
    }
  });
});
