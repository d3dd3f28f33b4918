// Sessions that end (issue 18 finding 3; OWASP ASVS 4.0.3 V3.3.1 sign-out and
// expiry invalidate the session, V3.3.2 idle and absolute limits, V3.3.3 other sessions
// end on a password change) and passwords (finding 5; V2.1.1 length, V2.1.5 users can
// change their password, V2.1.7 common passwords refused), against the built app and
// the real test database. Idle and absolute ages are made by moving a session row's
// times back, the way the clock would.
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import bcrypt from 'bcryptjs';
import { eq, sql } from 'drizzle-orm';
import { DEMO_PASSWORD, startAppServer, type AppServer } from './support/app-server';
import { clearSignInLimits, send, signInAt, signOutAt } from './support/security';

type DbModule = typeof import('@/db/client');
type Schema = typeof import('@/db/schema');

let server: AppServer;
let dbm: DbModule;
let s: Schema;
let shopId = 0;
let adminCookie = '';

const OPERATOR = 'sven.sessions@alder-finch.example';
let operatorId = 0;

async function resetOperator() {
  await dbm.db
    .update(s.users)
    .set({ passwordHash: await bcrypt.hash(DEMO_PASSWORD, 4), disabled: false, role: 'operator', mustChangePassword: false })
    .where(eq(s.users.id, operatorId));
}

const jobs = (cookie: string) => send<{ error?: { code: string } }>(`${server.baseUrl}/api/jobs`, { cookie });

async function signIn(email = OPERATOR, password = DEMO_PASSWORD) {
  const attempt = await signInAt(server.baseUrl, email, password);
  expect(attempt.signedIn, attempt.error ?? '').toBe(true);
  return attempt;
}

beforeAll(async () => {
  server = await startAppServer();
  dbm = await import('@/db/client');
  s = await import('@/db/schema');
  await clearSignInLimits(dbm.db);
  const [shop] = await dbm.db.select().from(s.shops).where(eq(s.shops.slug, 'alder-finch'));
  shopId = shop.id;
  await dbm.db.delete(s.users).where(eq(s.users.email, OPERATOR));
  [{ id: operatorId }] = await dbm.db
    .insert(s.users)
    .values({ shopId, email: OPERATOR, name: 'Sven', role: 'operator', passwordHash: await bcrypt.hash(DEMO_PASSWORD, 4) })
    .$returningId();
  adminCookie = (await signIn('ada@alder-finch.example')).jar.header();
});

beforeEach(async () => {
  await resetOperator();
});

afterAll(async () => {
  if (dbm) {
    await dbm.db.delete(s.users).where(eq(s.users.email, OPERATOR));
    await clearSignInLimits(dbm.db);
    await dbm.closeDb();
  }
  await server?.stop();
});

const patchUser = (body: unknown) =>
  send<{ error?: { code: string; fields?: Record<string, string[]> } }>(`${server.baseUrl}/api/users/${operatorId}`, {
    method: 'PATCH',
    cookie: adminCookie,
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify(body),
  });

describe('sessions end (V3.3.1)', () => {
  it('a token copied before sign-out no longer works after it', async () => {
    const { jar } = await signIn();
    const copied = jar.header();
    expect((await jobs(copied)).status).toBe(200);
    await signOutAt(server.baseUrl, jar);
    const after = await jobs(copied);
    expect(after.status).toBe(401);
    // next-auth's own endpoint agrees: no user on the copied token
    const session = await send<{ user?: unknown }>(`${server.baseUrl}/api/auth/session`, { cookie: copied });
    expect(session.body.user).toBeUndefined();
  });

  it('a disabled user\'s old token stays dead after the account is enabled again', async () => {
    const old = (await signIn()).jar.header();
    expect((await patchUser({ disabled: true })).status).toBe(200);
    expect((await patchUser({ disabled: false })).status).toBe(200);
    expect((await jobs(old)).status).toBe(401);
  });

  it('a role change ends the sessions that carried the old role', async () => {
    const old = (await signIn()).jar.header();
    expect((await patchUser({ role: 'estimator' })).status).toBe(200);
    expect((await jobs(old)).status).toBe(401);
  });
});

describe('idle and absolute limits (V3.3.2)', () => {
  it('30 minutes without a request end a session; a request within them keeps it', async () => {
    const cookie = (await signIn()).jar.header();
    await dbm.db.execute(sql`UPDATE user_sessions SET last_seen_at = NOW() - INTERVAL 29 MINUTE WHERE user_id = ${operatorId} AND ended_at IS NULL`);
    expect((await jobs(cookie)).status).toBe(200);
    // the request marked it as seen again, so the idle clock restarted
    await dbm.db.execute(sql`UPDATE user_sessions SET last_seen_at = NOW() - INTERVAL 31 MINUTE WHERE user_id = ${operatorId} AND ended_at IS NULL`);
    expect((await jobs(cookie)).status).toBe(401);
  });

  it('12 hours after sign-in a session ends however active, and /api/auth/session does not extend it', async () => {
    const cookie = (await signIn()).jar.header();
    await dbm.db.execute(sql`UPDATE user_sessions SET created_at = NOW() - INTERVAL 721 MINUTE WHERE user_id = ${operatorId} AND ended_at IS NULL`);
    const session = await send<{ user?: unknown }>(`${server.baseUrl}/api/auth/session`, { cookie });
    expect(session.body.user).toBeUndefined();
    expect((await jobs(cookie)).status).toBe(401);
  });
});

describe('passwords (V2.1.1, V2.1.5, V2.1.7)', () => {
  const changeOwn = (cookie: string, body: unknown) =>
    send<{ changed?: boolean; error?: { code: string; fields?: Record<string, string[]> } }>(`${server.baseUrl}/api/users/me/password`, {
      method: 'PUT',
      cookie,
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify(body),
    });

  it('a user changes their own password with the current one; their other sessions end, this one goes on', async () => {
    const here = (await signIn()).jar.header();
    const elsewhere = (await signIn()).jar.header();
    const wrong = await changeOwn(here, { currentPassword: 'not-it-at-all', newPassword: 'offcut-shelf-77', repeatPassword: 'offcut-shelf-77' });
    expect(wrong.status).toBe(422);
    expect(wrong.body.error?.fields?.currentPassword).toBeDefined();
    const done = await changeOwn(here, { currentPassword: DEMO_PASSWORD, newPassword: 'offcut-shelf-77', repeatPassword: 'offcut-shelf-77' });
    expect(done.status).toBe(200);
    expect((await jobs(here)).status).toBe(200);
    expect((await jobs(elsewhere)).status).toBe(401);
    expect((await signInAt(server.baseUrl, OPERATOR, 'offcut-shelf-77')).signedIn).toBe(true);
  });

  it('refuses a new password under 12 characters or on the common list', async () => {
    const here = (await signIn()).jar.header();
    const short = await changeOwn(here, { currentPassword: DEMO_PASSWORD, newPassword: 'eleven-char', repeatPassword: 'eleven-char' });
    expect(short.status).toBe(422);
    expect(short.body.error?.fields?.newPassword).toEqual(['Use at least 12 characters.']);
    const common = await changeOwn(here, { currentPassword: DEMO_PASSWORD, newPassword: 'password1234', repeatPassword: 'password1234' });
    expect(common.status).toBe(422);
    expect(common.body.error?.fields?.newPassword?.[0]).toMatch(/most common passwords/);
    const created = await send<{ error?: { fields?: Record<string, string[]> } }>(`${server.baseUrl}/api/users`, {
      method: 'POST',
      cookie: adminCookie,
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ name: 'Common', email: 'common.pw@alder-finch.example', role: 'operator', password: 'qwertyuiop123' }),
    });
    expect(created.status).toBe(422);
    expect(created.body.error?.fields?.password?.[0]).toMatch(/most common passwords/);
  });

  it('an admin\'s one-time password ends the user\'s sessions and must be replaced at the next sign-in', async () => {
    const old = (await signIn()).jar.header();
    expect((await patchUser({ oneTimePassword: 'temporary-sheet-9' })).status).toBe(200);
    expect((await jobs(old)).status).toBe(401);

    const fresh = (await signIn(OPERATOR, 'temporary-sheet-9')).jar.header();
    const blocked = await jobs(fresh);
    expect(blocked.status).toBe(403);
    expect(blocked.body.error?.code).toBe('forbidden:password-change');
    const page = await send(`${server.baseUrl}/jobs`, { cookie: fresh, headers: { accept: 'text/html' } });
    expect([303, 307, 308]).toContain(page.status);
    expect(new URL(page.headers.get('location') ?? '', server.baseUrl).pathname).toBe('/change-password');

    const changed = await changeOwn(fresh, { currentPassword: 'temporary-sheet-9', newPassword: 'my-own-birch-42', repeatPassword: 'my-own-birch-42' });
    expect(changed.status).toBe(200);
    expect((await jobs(fresh)).status).toBe(200);
  });
});
