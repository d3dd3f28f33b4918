// Test harness for the built app: serves the production build with `next start` on
// 127.0.0.1:3100 against the test database (kerfcast_test), once per test file,
// unless a server already answers there (then it is reused and left running). The e2e
// project passes port 3101: vitest runs the projects side by side, and one project's
// afterAll must not stop the server the other one is using. Also
// signs in over HTTP the way a browser does: CSRF token from next-auth, then the
// credentials callback, keeping the session cookie.
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { localDatabaseUrl } from '@/lib/local-secrets';

export const INTEGRATION_PORT = 3100;
export const E2E_PORT = 3101;
/** the server the helpers below talk to; set by startAppServer */
let BASE_URL = `http://127.0.0.1:${INTEGRATION_PORT}`;
export const TEST_DATABASE_URL = process.env.DATABASE_URL ?? localDatabaseUrl('kerfcast_test');
export const DEMO_PASSWORD = 'kerfcast-demo';

// The tests write rows (a second shop, extra users); never let them near a real database.
if (!/_test(\?|$)/.test(TEST_DATABASE_URL)) {
  throw new Error(`Refusing to run app tests against ${TEST_DATABASE_URL}: the database name must end in _test.`);
}
process.env.DATABASE_URL = TEST_DATABASE_URL;

const ROOT = path.resolve(__dirname, '../../..');

export interface AppServer {
  baseUrl: string;
  stop(): Promise<void>;
}

async function answers(): Promise<boolean> {
  try {
    const response = await fetch(`${BASE_URL}/api/auth/csrf`, { signal: AbortSignal.timeout(5000) });
    return response.ok;
  } catch {
    return false;
  }
}

export async function startAppServer(port: number = INTEGRATION_PORT): Promise<AppServer> {
  BASE_URL = `http://127.0.0.1:${port}`;
  if (await answers()) return { baseUrl: BASE_URL, stop: async () => {} };
  if (!existsSync(path.join(ROOT, '.next', 'BUILD_ID'))) {
    throw new Error('No production build in .next: run `npx next build` first (npm test does it).');
  }
  const child: ChildProcess = spawn(
    process.execPath,
    [path.join(ROOT, 'node_modules/next/dist/bin/next'), 'start', '-H', '127.0.0.1', '-p', String(port)],
    {
      cwd: ROOT,
      env: {
        ...process.env,
        NODE_ENV: 'production',
        KERFCAST_LOCAL: '1',
        NEXT_TELEMETRY_DISABLED: '1',
        DATABASE_URL: TEST_DATABASE_URL,
        APP_URL: BASE_URL,
        NEXTAUTH_URL: BASE_URL,
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    },
  );
  let log = '';
  child.stdout?.on('data', (d) => (log += d));
  child.stderr?.on('data', (d) => (log += d));
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));

  const deadline = Date.now() + 60_000;
  while (!(await answers())) {
    if (child.exitCode !== null) throw new Error(`next start exited with ${child.exitCode}:\n${log.slice(-2000)}`);
    if (Date.now() > deadline) {
      child.kill('SIGTERM');
      throw new Error(`next start did not answer on ${BASE_URL} within 60 s:\n${log.slice(-2000)}`);
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  return {
    baseUrl: BASE_URL,
    async stop() {
      if (child.exitCode !== null) return;
      child.kill('SIGTERM');
      const timer = setTimeout(() => child.kill('SIGKILL'), 10_000);
      await exited;
      clearTimeout(timer);
    },
  };
}

/** Cookie jar of one visitor: name → value, from Set-Cookie headers. */
export class CookieJar {
  private readonly cookies = new Map<string, string>();

  take(response: Response): void {
    for (const line of response.headers.getSetCookie()) {
      const [pair] = line.split(';');
      const eq = pair.indexOf('=');
      const name = pair.slice(0, eq).trim();
      const value = pair.slice(eq + 1).trim();
      if (value === '' || /max-age=0/i.test(line)) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }

  has(name: string): boolean {
    return this.cookies.has(name);
  }

  header(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }
}

export interface SignInResult {
  jar: CookieJar;
  signedIn: boolean;
  /** the URL next-auth sends the browser to: /sign-in?error=… on failure */
  url: string;
}

export const SESSION_COOKIE = 'next-auth.session-token';

export async function signInOverHttp(email: string, password: string): Promise<SignInResult> {
  const jar = new CookieJar();
  const csrf = await fetch(`${BASE_URL}/api/auth/csrf`);
  jar.take(csrf);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const response = await fetch(`${BASE_URL}/api/auth/callback/credentials`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: jar.header() },
    body: new URLSearchParams({ csrfToken, email, password, callbackUrl: `${BASE_URL}/jobs`, json: 'true' }),
  });
  jar.take(response);
  const body = (await response.json().catch(() => ({}))) as { url?: string };
  return { jar, signedIn: jar.has(SESSION_COOKIE), url: body.url ?? response.headers.get('location') ?? '' };
}

export interface ApiAnswer<T = unknown> {
  status: number;
  body: T;
}

/** Calls the app with the visitor's cookies; JSON in, JSON out. */
export async function callApi<T = unknown>(jar: CookieJar | null, method: string, route: string, body?: unknown): Promise<ApiAnswer<T>> {
  const response = await fetch(`${BASE_URL}${route}`, {
    method,
    redirect: 'manual',
    headers: {
      accept: 'application/json',
      ...(jar ? { cookie: jar.header() } : {}),
      ...(body !== undefined ? { 'content-type': 'application/json' } : {}),
    },
    body: body !== undefined ? JSON.stringify(body) : undefined,
  });
  const text = await response.text();
  let parsed: unknown = text;
  try {
    parsed = JSON.parse(text);
  } catch {
    // pages answer HTML; keep the text
  }
  return { status: response.status, body: parsed as T };
}
