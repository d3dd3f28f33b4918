// Sign-in limits that hold (issue 18 finding 2 and issue 17 point 2; OWASP ASVS 4.0.3
// V2.2.1 anti-automation), through next-auth's credentials callback of the built app on
// the real test database. The counters are rows of sign_in_limits, so they are emptied
// before and after each test.
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import bcrypt from 'bcryptjs';
import { eq, sql } from 'drizzle-orm';
import { DEMO_PASSWORD, startAppServer, type AppServer } from './support/app-server';
import { clearSignInLimits, signInAt } from './support/security';

type DbModule = typeof import('@/db/client');
type Schema = typeof import('@/db/schema');

const FAILED = 'Wrong e-mail or password. Check both and try again.';
const LIMITED = 'Too many failed sign-ins. Wait 15 minutes and try again.';
const TARGET = 'rhea.limits@alder-finch.example';
const SECOND_PORT = 3102;

let server: AppServer;
let second: AppServer | null = null;
let dbm: DbModule;
let s: Schema;

beforeAll(async () => {
  dbm = await import('@/db/client');
  s = await import('@/db/schema');
  // The second process first: startAppServer points the shared helpers at the last one.
  second = await startAppServer(SECOND_PORT);
  server = await startAppServer();
  const [shop] = await dbm.db.select().from(s.shops).where(eq(s.shops.slug, 'alder-finch'));
  await dbm.db.delete(s.users).where(eq(s.users.email, TARGET));
  await dbm.db.insert(s.users).values({ shopId: shop.id, email: TARGET, name: 'Rhea', role: 'operator', passwordHash: await bcrypt.hash(DEMO_PASSWORD, 4) });
}, 180_000);

beforeEach(() => clearSignInLimits(dbm.db));
afterEach(() => clearSignInLimits(dbm.db));

afterAll(async () => {
  if (dbm) {
    await dbm.db.delete(s.users).where(eq(s.users.email, TARGET));
    await clearSignInLimits(dbm.db);
    await dbm.closeDb();
  }
  await second?.stop();
  await server?.stop();
});

describe('per-address limit (V2.2.1, finding 2a)', () => {
  it('X-Forwarded-For from the client does not pick the key: changing it per attempt does not reset the limit', async () => {
    // 50 failures, each claiming another address (and naming none of them twice)
    for (let batch = 0; batch < 5; batch++) {
      const attempts = await Promise.all(
        Array.from({ length: 10 }, (_, i) =>
          signInAt(server.baseUrl, `nobody-${batch}-${i}@spray.example`, 'wrong-password', { 'x-forwarded-for': `203.0.113.${batch * 10 + i + 1}` }),
        ),
      );
      for (const a of attempts) expect(a.error).toBe(FAILED);
    }
    // A 51st from yet another claimed address, with a real account's right password:
    const next = await signInAt(server.baseUrl, TARGET, DEMO_PASSWORD, { 'x-forwarded-for': '198.51.100.99' });
    expect(next.signedIn).toBe(false);
    expect(next.error).toBe(LIMITED);
  });

  it('a forged X-Forwarded-For naming a shop\'s address does not lock that address out', async () => {
    const attempt = await signInAt(server.baseUrl, 'x@spray.example', 'wrong', { 'x-forwarded-for': '192.0.2.10' });
    expect(attempt.error).toBe(FAILED);
    // The counted address is the connection's (loopback here), never the claimed one.
    const keys = ((await dbm.db.execute(sql`SELECT key_hash FROM sign_in_limits WHERE kind = 'ip'`))[0] as unknown as { key_hash: string }[]).map((r) => r.key_hash);
    expect(keys).toEqual([createHash('sha256').update('ip:127.0.0.1').digest('hex')]);
  });
});

describe('per-e-mail limit (V2.2.1, finding 2b)', () => {
  it('30 parallel wrong passwords for one e-mail: exactly 5 are checked, 25 refused at once', async () => {
    const attempts = await Promise.all(Array.from({ length: 30 }, (_, i) => signInAt(server.baseUrl, TARGET, `wrong-${i}`)));
    expect(attempts.filter((a) => a.error === FAILED)).toHaveLength(5);
    expect(attempts.filter((a) => a.error === LIMITED)).toHaveLength(25);
    expect((await signInAt(server.baseUrl, TARGET, DEMO_PASSWORD)).error).toBe(LIMITED);
  });

  it('a success clears the e-mail\'s count', async () => {
    for (let i = 0; i < 4; i++) expect((await signInAt(server.baseUrl, TARGET, `wrong-${i}`)).error).toBe(FAILED);
    expect((await signInAt(server.baseUrl, TARGET, DEMO_PASSWORD)).signedIn).toBe(true);
    for (let i = 0; i < 4; i++) expect((await signInAt(server.baseUrl, TARGET, `wrong-${i}`)).error).toBe(FAILED);
    expect((await signInAt(server.baseUrl, TARGET, DEMO_PASSWORD)).signedIn).toBe(true);
  });
});

describe('memory and storage of the counters (V2.2.1, finding 2c)', () => {
  it('a 1 MB e-mail is refused and counted on the address only; keys are hashes', async () => {
    const huge = `${'a'.repeat(1024 * 1024)}@x.example`;
    expect((await signInAt(server.baseUrl, huge, 'whatever')).error).toBe(FAILED);
    expect((await signInAt(server.baseUrl, 'someone@spray.example', 'whatever')).error).toBe(FAILED);
    const rows = (await dbm.db.execute(sql`SELECT key_hash, kind, attempts FROM sign_in_limits ORDER BY kind`))[0] as unknown as {
      key_hash: string;
      kind: string;
      attempts: number;
    }[];
    expect(rows.map((r) => [r.kind, Number(r.attempts)])).toEqual([
      ['email', 1],
      ['ip', 2],
    ]);
    for (const r of rows) expect(r.key_hash).toMatch(/^[0-9a-f]{64}$/);
  });
});

describe('two server processes (issue 17 point 2)', () => {
  it('failures counted on one process limit the other', async () => {
    expect(second).not.toBeNull();
    for (let i = 0; i < 5; i++) expect((await signInAt(server.baseUrl, TARGET, `wrong-${i}`)).error).toBe(FAILED);
    const elsewhere = await signInAt(second!.baseUrl, TARGET, DEMO_PASSWORD);
    expect(elsewhere.signedIn).toBe(false);
    expect(elsewhere.error).toBe(LIMITED);
  });
});
