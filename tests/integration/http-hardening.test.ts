// HTTP hardening of the built app (OWASP ASVS 4.0.3 level 2, V14.4 headers and V13 API):
// the security headers on a page, on API JSON (signed in and signed out), on a redirect
// and on static files; the page's policy carries a fresh nonce that Next.js put on every
// script; and JSON bodies over the 1 MiB limit answer 413 with the error shape, whether
// the size is declared (Content-Length) or only found while reading (chunked).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { customers } from '@/db/schema';
import { DEMO_PASSWORD, signInOverHttp, startAppServer, type AppServer, type CookieJar } from './support/app-server';
import { connectTestDb, type TestDb } from './support/db';

let server: AppServer;
let ada: CookieJar;
let testDb: TestDb;
const createdCustomerIds: number[] = [];

beforeAll(async () => {
  server = await startAppServer();
  const signedIn = await signInOverHttp('ada@alder-finch.example', DEMO_PASSWORD);
  expect(signedIn.signedIn).toBe(true);
  ada = signedIn.jar;
  testDb = connectTestDb();
});

afterAll(async () => {
  for (const id of createdCustomerIds) await testDb.db.delete(customers).where(eq(customers.id, id));
  await testDb?.close();
  await server?.stop();
});

/** Directive name → its sources, from one Content-Security-Policy value (CSP Level 3 syntax: `;`-separated directives). */
function directives(policy: string): Map<string, string[]> {
  const map = new Map<string, string[]>();
  for (const part of policy.split(';')) {
    const [name, ...sources] = part.trim().split(/\s+/);
    if (name) map.set(name.toLowerCase(), sources);
  }
  return map;
}

/** The headers every response must carry; returns the CSP's directives for further checks. */
function expectSecurityHeaders(response: Response, { worker = false } = {}): Map<string, string[]> {
  const h = response.headers;
  const policy = h.get('content-security-policy') ?? '';
  // One policy only: fetch joins repeated headers with ", ", and a second policy would be
  // enforced as well (CSP Level 3 enforces every policy delivered), blocking the nonce'd scripts.
  expect(policy.match(/default-src/g)?.length).toBe(1);
  const d = directives(policy);
  expect(d.get('default-src')).toEqual(["'self'"]);
  expect(d.get('script-src')).toContain("'self'");
  expect(d.get('script-src')).toContain("'wasm-unsafe-eval'");
  expect(d.get('script-src')).not.toContain("'unsafe-inline'");
  // eval only in the viewer's Web Worker (the polygon library's WebAssembly bindings), never on a document
  if (worker) expect(d.get('script-src')).toContain("'unsafe-eval'");
  else expect(d.get('script-src')).not.toContain("'unsafe-eval'");
  expect(d.get('style-src')).not.toContain("'unsafe-inline'");
  for (const name of ['style-src', 'font-src', 'img-src', 'connect-src']) expect(d.get(name)).toEqual(expect.arrayContaining(["'self'"]));
  expect(d.get('worker-src')).toContain("'self'");
  expect(d.get('frame-ancestors')).toEqual(["'none'"]);
  expect(d.get('object-src')).toEqual(["'none'"]);
  expect(d.get('base-uri')).toEqual(["'self'"]);
  expect(d.get('form-action')).toEqual(["'self'"]);
  // No other origin anywhere: every source is a keyword, a nonce or blob: (for workers).
  for (const [name, sources] of d) {
    for (const source of sources) expect(`${name} ${source}`).toMatch(/ ('[a-z-]+'|'nonce-[A-Za-z0-9+/=]+'|blob:)$/);
  }
  expect(h.get('x-content-type-options')).toBe('nosniff');
  expect(h.get('referrer-policy')).toBe('strict-origin-when-cross-origin');
  const permissions = h.get('permissions-policy') ?? '';
  for (const feature of ['camera', 'microphone', 'geolocation', 'payment', 'usb', 'serial', 'hid', 'midi']) {
    expect(permissions).toContain(`${feature}=()`);
  }
  // The test server's APP_URL is http://127.0.0.1:3100: no HSTS over plain http
  // (RFC 6797 §7.2: a host sends it only over secure transport).
  expect(h.get('strict-transport-security')).toBeNull();
  return d;
}

function nonceOf(d: Map<string, string[]>): string | undefined {
  return d.get('script-src')?.find((s) => s.startsWith("'nonce-"))?.slice(7, -1);
}

describe('security headers', () => {
  it('on a page: the policy carries a fresh nonce, and every script of the page has it', async () => {
    const first = await fetch(`${server.baseUrl}/sign-in`);
    expect(first.status).toBe(200);
    const d = expectSecurityHeaders(first);
    const nonce = nonceOf(d);
    expect(nonce).toMatch(/^[A-Za-z0-9+/]{22}==$/); // 16 bytes in base64
    const html = await first.text();
    const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
    expect(scripts.length).toBeGreaterThan(0);
    for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`);

    const second = await fetch(`${server.baseUrl}/sign-in`);
    expect(nonceOf(directives(second.headers.get('content-security-policy') ?? ''))).not.toBe(nonce);
  });

  it('on a signed-in page and on the redirect of a signed-out visit', async () => {
    const jobs = await fetch(`${server.baseUrl}/jobs`, { headers: { cookie: ada.header() } });
    expect(jobs.status).toBe(200);
    expect(nonceOf(expectSecurityHeaders(jobs))).toBeDefined();

    const redirect = await fetch(`${server.baseUrl}/jobs`, { redirect: 'manual' });
    expect(redirect.status).toBe(307);
    expectSecurityHeaders(redirect);
  });

  it('on API JSON, signed in and signed out', async () => {
    const listed = await fetch(`${server.baseUrl}/api/customers`, { headers: { cookie: ada.header() } });
    expect(listed.status).toBe(200);
    expect(listed.headers.get('content-type')).toMatch(/^application\/json/);
    expectSecurityHeaders(listed);

    const signedOut = await fetch(`${server.baseUrl}/api/customers`);
    expect(signedOut.status).toBe(401);
    expect(((await signedOut.json()) as { error: { code: string } }).error.code).toBe('unauthorized');
    expectSecurityHeaders(signedOut);
  });

  it('on static files: a script chunk, a shipped font and the icon', async () => {
    const html = await (await fetch(`${server.baseUrl}/sign-in`)).text();
    const chunk = html.match(/src="(\/_next\/static\/[^"]+\.js)"/)?.[1];
    expect(chunk).toBeDefined();
    for (const path of [chunk!, '/fonts/atkinson-hyperlegible/atkinson-hyperlegible-latin-400-normal.woff2', '/icon.svg']) {
      const response = await fetch(`${server.baseUrl}${path}`);
      expect(response.status, path).toBe(200);
      expectSecurityHeaders(response);
    }
  });

  it("on the bundler's worker entry script: the worker policy, with the other headers as on every file", async () => {
    const { readdirSync } = await import('node:fs');
    const { join } = await import('node:path');
    const entry = readdirSync(join(process.cwd(), '.next', 'static', 'chunks')).find((f) => /^turbopack-worker-.*\.js$/.test(f));
    expect(entry, 'the build has a worker entry script').toBeDefined();
    const response = await fetch(`${server.baseUrl}/_next/static/chunks/${entry}`);
    expect(response.status).toBe(200);
    expectSecurityHeaders(response, { worker: true });
  });
});

describe('JSON body limit (1 MiB by default, JSON_BODY_LIMIT_BYTES)', () => {
  const post = (body: BodyInit, extra: Record<string, string> = {}) =>
    fetch(`${server.baseUrl}/api/customers`, {
      method: 'POST',
      headers: { cookie: ada.header(), 'content-type': 'application/json', origin: server.baseUrl, ...extra },
      body,
      duplex: 'half',
    } as RequestInit & { duplex: 'half' });

  /** A valid customer whose notes make the body about 2 MB (2,000,000 bytes of notes). */
  const twoMegabytes = JSON.stringify({ name: 'Oversized Order Ltd', email: 'big@oversized.example', notes: 'x'.repeat(2_000_000) });

  async function expectTooLarge(response: Response) {
    expect(response.status).toBe(413);
    const body = (await response.json()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe('too-large:body');
    expect(body.error.message).toMatch(/1,048,576 bytes/);
    expectSecurityHeaders(response);
  }

  it('a 2 MB body with its Content-Length answers 413 with the error shape', async () => {
    await expectTooLarge(await post(twoMegabytes));
  });

  it('a 2 MB body sent in chunks, no length declared, answers 413 as well', async () => {
    const bytes = new TextEncoder().encode(twoMegabytes);
    const stream = new ReadableStream<Uint8Array>({
      start(controller) {
        for (let at = 0; at < bytes.byteLength; at += 64 * 1024) controller.enqueue(bytes.slice(at, at + 64 * 1024));
        controller.close();
      },
    });
    await expectTooLarge(await post(stream));
  });

  it('a small valid body still creates the customer', async () => {
    const response = await post(JSON.stringify({ name: 'Harbour Lane Florist', email: 'orders@harbour-lane.example', notes: 'Acrylic sign letters.' }));
    expect(response.status).toBe(201);
    const body = (await response.json()) as { customer: { id: number; name: string } };
    createdCustomerIds.push(body.customer.id);
    expect(body.customer.name).toBe('Harbour Lane Florist');
    expectSecurityHeaders(response);
  });
});
