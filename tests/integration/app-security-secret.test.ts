// No public development secret (issue 18 finding 4; OWASP ASVS 4.0.3 V2.10.4 no shared or
// default secrets, V3.5.3 session tokens signed with a secret only the server holds):
// the built app, in local mode, signs with the random secret of .data/auth-secret, so a
// token signed with the fixed development secret the app used to ship (the value is the
// one of the old lib/env.ts) is no session at all; and a server whose APP_URL is not a
// loopback address refuses to start without AUTH_SECRET.
import { spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { encode } from 'next-auth/jwt';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { startAppServer, TEST_DATABASE_URL, type AppServer } from './support/app-server';
import { send } from './support/security';

const OLD_PUBLIC_SECRET = 'kerfcast-local-development-secret-do-not-deploy';
const ROOT = path.resolve(__dirname, '../..');

type DbModule = typeof import('@/db/client');
type Schema = typeof import('@/db/schema');
let server: AppServer;
let dbm: DbModule;
let s: Schema;

beforeAll(async () => {
  server = await startAppServer();
  dbm = await import('@/db/client');
  s = await import('@/db/schema');
});

afterAll(async () => {
  await dbm?.closeDb();
  await server?.stop();
});

describe('session secret (V2.10.4, V3.5.3)', () => {
  it('a token forged with the old public development secret is refused, even naming a live session', async () => {
    const [ada] = await dbm.db.select().from(s.users).where(eq(s.users.email, 'ada@alder-finch.example'));
    // a live session row, so that only the signature can make the difference
    const sid = randomBytes(16).toString('hex');
    await dbm.db.insert(s.userSessions).values({ id: sid, shopId: ada.shopId, userId: ada.id });
    try {
      const token = await encode({
        secret: OLD_PUBLIC_SECRET,
        token: { uid: ada.id, shopId: ada.shopId, role: 'admin', name: ada.name, email: ada.email, sid },
      });
      const answer = await send(`${server.baseUrl}/api/users`, { cookie: `next-auth.session-token=${token}` });
      expect(answer.status).toBe(401);
      // the same claims signed with this install's own secret do open the session (the control)
      const ownSecret = process.env.AUTH_SECRET || readFileSync(path.join(process.env.KERFCAST_DATA_DIR || path.join(ROOT, '.data'), 'auth-secret'), 'utf8').trim();
      const own = await encode({ secret: ownSecret, token: { uid: ada.id, shopId: ada.shopId, role: 'admin', sid } });
      expect((await send(`${server.baseUrl}/api/users`, { cookie: `next-auth.session-token=${own}` })).status).toBe(200);
    } finally {
      await dbm.db.delete(s.userSessions).where(eq(s.userSessions.id, sid));
    }
  });

  it('next start refuses to start without AUTH_SECRET when APP_URL is not loopback, naming the setting', async () => {
    const child = spawn(process.execPath, [path.join(ROOT, 'node_modules/next/dist/bin/next'), 'start', '-H', '127.0.0.1', '-p', '3109'], {
      cwd: ROOT,
      env: {
        ...process.env,
        NODE_ENV: 'production',
        KERFCAST_LOCAL: '1',
        DATABASE_URL: TEST_DATABASE_URL,
        APP_URL: 'http://192.0.2.10:3109',
        NEXTAUTH_URL: 'http://192.0.2.10:3109',
        AUTH_SECRET: '',
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let log = '';
    child.stdout.on('data', (d: Buffer) => (log += d));
    child.stderr.on('data', (d: Buffer) => (log += d));
    const timer = setTimeout(() => child.kill('SIGKILL'), 30_000);
    const code = await new Promise<number | null>((resolve) => child.on('exit', (c) => resolve(c)));
    clearTimeout(timer);
    expect(code, log).not.toBe(0);
    expect(code, log).not.toBeNull();
    expect(log).toMatch(/AUTH_SECRET: required when APP_URL \(http:\/\/192\.0\.2\.10:3109\) is not a loopback address/);
  }, 40_000);
});
