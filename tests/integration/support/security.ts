// Helpers of the security tests: a sign-in against any app server (two processes in one
// test), raw requests with the headers a browser or an attacker's page would send, and
// the clean-up of the shared sign-in counters, which live in the test database and
// would otherwise carry failures from one test run into the next.
import { sql } from 'drizzle-orm';
import type { Db } from '@/db/client';
import { CookieJar, SESSION_COOKIE } from './app-server';

export async function clearSignInLimits(db: Db): Promise<void> {
  await db.execute(sql`DELETE FROM sign_in_limits`);
}

export interface Attempt {
  jar: CookieJar;
  signedIn: boolean;
  /** the ?error= text next-auth sends back, null on success */
  error: string | null;
}

/** A browser-like sign-in (CSRF token, then the credentials callback) against baseUrl. */
export async function signInAt(baseUrl: string, email: string, password: string, headers: Record<string, string> = {}): Promise<Attempt> {
  const jar = new CookieJar();
  const csrf = await fetch(`${baseUrl}/api/auth/csrf`);
  jar.take(csrf);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const response = await fetch(`${baseUrl}/api/auth/callback/credentials`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: jar.header(), ...headers },
    body: new URLSearchParams({ csrfToken, email, password, callbackUrl: `${baseUrl}/jobs`, json: 'true' }),
  });
  jar.take(response);
  const body = (await response.json().catch(() => ({}))) as { url?: string };
  const url = body.url ?? response.headers.get('location') ?? '';
  return { jar, signedIn: jar.has(SESSION_COOKIE), error: new URL(url, baseUrl).searchParams.get('error') };
}

/** next-auth's sign-out, as the sign-out button posts it. */
export async function signOutAt(baseUrl: string, jar: CookieJar): Promise<void> {
  const csrf = await fetch(`${baseUrl}/api/auth/csrf`, { headers: { cookie: jar.header() } });
  jar.take(csrf);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const response = await fetch(`${baseUrl}/api/auth/signout`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: jar.header() },
    body: new URLSearchParams({ csrfToken, callbackUrl: `${baseUrl}/sign-in`, json: 'true' }),
  });
  await response.text();
}

export interface Answer<T = unknown> {
  status: number;
  body: T;
  headers: Headers;
}

/** A request with exactly the given headers (and the cookie of `cookie`, a raw Cookie header). */
export async function send<T = unknown>(
  url: string,
  init: { method?: string; cookie?: string; headers?: Record<string, string>; body?: string } = {},
): Promise<Answer<T>> {
  const response = await fetch(url, {
    method: init.method ?? 'GET',
    redirect: 'manual',
    headers: { accept: 'application/json', ...(init.cookie ? { cookie: init.cookie } : {}), ...init.headers },
    body: init.body,
  });
  const text = await response.text();
  let body: unknown = text;
  try {
    body = JSON.parse(text);
  } catch {
    // a page or an empty body
  }
  return { status: response.status, body: body as T, headers: response.headers };
}

