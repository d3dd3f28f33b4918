// Sign-in through next-auth's credentials callback of the built app, against the
// real test database: disabled users, the generic failure message, the per-e-mail
// rate limit, and a disable taking effect on a session that is already open.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import bcrypt from 'bcryptjs';
import { eq } from 'drizzle-orm';
import { callApi, DEMO_PASSWORD, SESSION_COOKIE, signInOverHttp, startAppServer, type AppServer } from './support/app-server';
import { clearSignInLimits } from './support/security';

type DbModule = typeof import('@/db/client');
type Schema = typeof import('@/db/schema');

let server: AppServer;
let dbm: DbModule;
let s: Schema;
let shopId = 0;

// Invented accounts of the demo shop, removed again afterwards.
const DISABLED = 'ivo.disabled@alder-finch.example';
const LIMITED = 'mira.limited@alder-finch.example';
const LATE = 'otto.late@alder-finch.example';

function errorOf(url: string): string | null {
  return new URL(url, 'http://x').searchParams.get('error');
}

async function addUser(email: string, disabled: boolean) {
  const passwordHash = await bcrypt.hash(DEMO_PASSWORD, 4);
  const [{ id }] = await dbm.db
    .insert(s.users)
    .values({ shopId, email, name: email.split('@')[0], role: 'operator', disabled, passwordHash })
    .$returningId();
  return id;
}

async function removeTestUsers() {
  for (const email of [DISABLED, LIMITED, LATE]) await dbm.db.delete(s.users).where(eq(s.users.email, email));
}

beforeAll(async () => {
  server = await startAppServer();
  dbm = await import('@/db/client');
  s = await import('@/db/schema');
  const [shop] = await dbm.db.select().from(s.shops).where(eq(s.shops.name, 'Alder & Finch Shopfitting'));
  shopId = shop.id;
  await removeTestUsers();
  // the failure counters live in the database now and would carry over from earlier runs
  await clearSignInLimits(dbm.db);
});

afterAll(async () => {
  if (dbm) {
    await removeTestUsers();
    await clearSignInLimits(dbm.db);
    await dbm.closeDb();
  }
  await server?.stop();
});

describe('sign-in', () => {
  it('a demo user signs in and the session carries user id, shop id and role', async () => {
    const result = await signInOverHttp('priya@alder-finch.example', DEMO_PASSWORD);
    expect(result.signedIn).toBe(true);
    const session = await callApi<{ user: { id: number; shopId: number; role: string } }>(result.jar, 'GET', '/api/auth/session');
    expect(session.body.user).toMatchObject({ shopId, role: 'programmer' });
    expect(typeof session.body.user.id).toBe('number');
  });

  it('a disabled user cannot sign in, even with the right password', async () => {
    await addUser(DISABLED, true);
    const result = await signInOverHttp(DISABLED, DEMO_PASSWORD);
    expect(result.signedIn).toBe(false);
    expect(errorOf(result.url)).toBe('Wrong e-mail or password. Check both and try again.');
  });

  it('an unknown e-mail and a wrong password get the same answer', async () => {
    const unknown = await signInOverHttp('nobody-here@alder-finch.example', DEMO_PASSWORD);
    const wrong = await signInOverHttp('tomas@alder-finch.example', 'not-the-password');
    expect(unknown.signedIn).toBe(false);
    expect(wrong.signedIn).toBe(false);
    expect(errorOf(unknown.url)).toBe(errorOf(wrong.url));
    expect(errorOf(unknown.url)).toBe('Wrong e-mail or password. Check both and try again.');
  });

  it('after 5 failures for one e-mail, even the right password is refused for a while', async () => {
    await addUser(LIMITED, false);
    for (let i = 0; i < 5; i++) {
      const attempt = await signInOverHttp(LIMITED, `wrong-${i}`);
      expect(attempt.signedIn).toBe(false);
    }
    const blocked = await signInOverHttp(LIMITED, DEMO_PASSWORD);
    expect(blocked.signedIn).toBe(false);
    expect(errorOf(blocked.url)).toBe('Too many failed sign-ins. Wait 15 minutes and try again.');
    // The limit is per e-mail: another user from the same address still gets in.
    expect((await signInOverHttp('lena@alder-finch.example', DEMO_PASSWORD)).signedIn).toBe(true);
  });

  it('disabling a user ends their open session on the next request', async () => {
    const id = await addUser(LATE, false);
    const user = await signInOverHttp(LATE, DEMO_PASSWORD);
    expect(user.signedIn).toBe(true);
    expect((await callApi(user.jar, 'GET', '/api/jobs')).status).toBe(200);
    const admin = await signInOverHttp('ada@alder-finch.example', DEMO_PASSWORD);
    expect((await callApi(admin.jar, 'PATCH', `/api/users/${id}`, { disabled: true })).status).toBe(200);
    const after = await callApi<{ error: { code: string } }>(user.jar, 'GET', '/api/jobs');
    expect(after.status).toBe(401);
    expect(after.body.error.code).toBe('unauthorized');
  });

  it('the session cookie is HttpOnly', async () => {
    const csrf = await fetch(`${server.baseUrl}/api/auth/csrf`);
    const cookie = csrf.headers.getSetCookie().join('\n');
    const { csrfToken } = (await csrf.json()) as { csrfToken: string };
    const response = await fetch(`${server.baseUrl}/api/auth/callback/credentials`, {
      method: 'POST',
      redirect: 'manual',
      headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: cookie.split('\n').map((l) => l.split(';')[0]).join('; ') },
      body: new URLSearchParams({ csrfToken, email: 'ada@alder-finch.example', password: DEMO_PASSWORD, json: 'true' }),
    });
    const line = response.headers.getSetCookie().find((l) => l.startsWith(`${SESSION_COOKIE}=`));
    expect(line).toBeDefined();
    expect(line).toMatch(/HttpOnly/i);
  });
});

describe('pages', () => {
  it('a signed-out visitor of a page is sent to /sign-in', async () => {
    const response = await fetch(`${server.baseUrl}/jobs`, { redirect: 'manual' });
    expect([302, 307, 308]).toContain(response.status);
    expect(response.headers.get('location')).toMatch(/\/sign-in/);
  });

  it('the root address sends a signed-in user to the jobs page', async () => {
    const lena = await signInOverHttp('lena@alder-finch.example', DEMO_PASSWORD);
    const response = await fetch(`${server.baseUrl}/`, { headers: { cookie: lena.jar.header() }, redirect: 'manual' });
    expect([302, 303, 307, 308]).toContain(response.status);
    expect(new URL(response.headers.get('location') ?? '', server.baseUrl).pathname).toBe('/jobs');
  });

  it('an operator opening the users page gets status 403 and the 403 page', async () => {
    const lena = await signInOverHttp('lena@alder-finch.example', DEMO_PASSWORD);
    const response = await fetch(`${server.baseUrl}/admin/users`, { headers: { cookie: lena.jar.header() }, redirect: 'manual' });
    expect(response.status).toBe(403);
    expect(await response.text()).toContain('This page is not open to your role');
  });

  it('an admin opening the users page gets 200 with the demo users', async () => {
    const ada = await signInOverHttp('ada@alder-finch.example', DEMO_PASSWORD);
    const response = await fetch(`${server.baseUrl}/admin/users`, { headers: { cookie: ada.jar.header() } });
    expect(response.status).toBe(200);
    const html = await response.text();
    for (const email of ['ada@', 'priya@', 'tomas@', 'lena@']) expect(html).toContain(email);
  });

});
