// Calls the app's real route handlers and server actions outside Next.js, with the session
// lookup and everything behind db/queries mocked, so a unit test can run a handler as a
// request would: a signed-in user of a chosen role (or none), a body, the route params.
//
// What is mocked, and why it is enough to judge the guard:
// - next-auth's getServerSession (the one session lookup lib/auth/require-role.ts's
//   currentUser makes) answers the test's user; requireRole / requireAction themselves run
//   unchanged, reading the role table in lib/auth/roles.ts;
// - every export of db/queries/* and of the modules that reach object storage, the mail
//   server or the estimate queue is a spy that records its call and answers a stand-in row,
//   so a call that reached the data is seen, with the shop id it was given;
// - db/client answers nothing: a handler that goes around db/queries fails loudly;
// - next/cache and next/navigation (revalidatePath, redirect) are stubs; redirect throws
//   a Redirect the caller can tell from an error.
// Route files and action files are found on disk (discoverRoutes, discoverActions), so a new
// one is called too, and fails its test until it has a spec.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { vi } from 'vitest';
import type { SessionUser } from '@/lib/auth/session-user';
import type { Role } from '@/lib/validation/enums';

export const ROOT = path.resolve(__dirname, '../../..');

/** the signed-in user's shop and id: numbers no stand-in row uses, so a wrong one shows */
export const SHOP_ID = 7301;
export const USER_ID = 4207;

export const HTTP_METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const;
export type HttpMethod = (typeof HTTP_METHODS)[number];

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    return statSync(full).isDirectory() ? walk(full) : [full];
  });
}

const rel = (file: string) => path.relative(ROOT, file).split(path.sep).join('/');

/** Every app/api/**\/route.ts except next-auth's own endpoints, as paths from the repository root. */
export function discoverRoutes(): string[] {
  return walk(path.join(ROOT, 'app/api'))
    .filter((f) => path.basename(f) === 'route.ts' || path.basename(f) === 'route.tsx')
    .map(rel)
    .filter((f) => !f.startsWith('app/api/auth/'))
    .sort();
}

/** Every route.ts outside app/api (a page-level route handler, e.g. a public quote's PDF). */
export function discoverOtherRoutes(): string[] {
  return walk(path.join(ROOT, 'app'))
    .filter((f) => /^route\.tsx?$/.test(path.basename(f)))
    .map(rel)
    .filter((f) => !f.startsWith('app/api/'))
    .sort();
}

const USE_SERVER_FILE = /^(?:\s*(?:\/\/[^\n]*|\/\*[\s\S]*?\*\/))*\s*['"]use server['"]/;
const USE_SERVER_ANYWHERE = /['"]use server['"]/;

/** Files under app/ whose first statement is 'use server' (server action modules). */
export function discoverActions(): string[] {
  return walk(path.join(ROOT, 'app'))
    .filter((f) => /\.tsx?$/.test(f) && USE_SERVER_FILE.test(readFileSync(f, 'utf8')))
    .map(rel)
    .sort();
}

/** Files that say 'use server' somewhere other than at the top: inline actions no spec could reach. */
export function inlineActionFiles(): string[] {
  return walk(path.join(ROOT, 'app'))
    .filter((f) => /\.tsx?$/.test(f))
    .filter((f) => {
      const text = readFileSync(f, 'utf8');
      return USE_SERVER_ANYWHERE.test(text) && !USE_SERVER_FILE.test(text);
    })
    .map(rel)
    .sort();
}

/** '[jobId]' segments of a route file: the params its handlers get. */
export function routeParams(file: string): string[] {
  return [...file.matchAll(/\[(\w+)\]/g)].map((m) => m[1]);
}

/** 'app/api/jobs/[jobId]/route.ts' → '/api/jobs/[jobId]' */
export function routeUrlPath(file: string): string {
  return '/' + file.replace(/^app\//, '').replace(/\/route\.tsx?$/, '').replace(/\([^)]*\)\//g, '');
}

// --- the mocks ---------------------------------------------------------------------------

export interface DataCall {
  module: string;
  name: string;
  args: unknown[];
}

/** Functions that run on a refused request by design (they read a refused upload's body away). */
const RUN_ON_REFUSAL = new Set(['drainUnreadBody', 'discardReceived']);

export const calls: DataCall[] = [];

/** What a spy answers: per function name, a value or a function of the call's arguments. */
export type Answers = Record<string, unknown>;
let answers: Answers = {};
/** when set, every data function throws it (an unexpected failure: the database gone, a bug) */
let failure: unknown = null;

/** A stand-in row: enough fields for any handler to build its answer from. */
export function standInRow(): Record<string, unknown> {
  return {
    id: 11,
    shopId: SHOP_ID,
    name: 'Stand-in row',
    title: 'Stand-in row',
    status: 'pending',
    version: 1,
    versioned: true,
    created: true,
    requeued: false,
    tools: [],
    tool: { id: 12, number: 1 },
    machine: { id: 13, name: 'Router 1' },
    sha256: 'a'.repeat(64),
    objectKey: 'shops/7301/programs/stand-in.nc',
    bytes: 3,
    programs: [],
    queued: false,
  };
}

let session: SessionUser | null = null;

export function signInAs(role: Role | null, extra: Partial<SessionUser> = {}): void {
  session = role === null ? null : { id: USER_ID, shopId: SHOP_ID, role, name: 'Test User', email: 'test.user@alder-finch.example', mustChangePassword: false, ...extra };
}

export function reset(next: Answers = {}): void {
  calls.length = 0;
  answers = next;
  failure = null;
}

/** Every data function throws `error` until the next reset(). */
export function failWith(error: unknown): void {
  failure = error;
}

/** Calls that reached the data (queries, storage, mail, the estimate queue). */
export function dataCalls(): DataCall[] {
  return calls.filter((c) => !RUN_ON_REFUSAL.has(c.name));
}

function spied(module: string, real: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [name, value] of Object.entries(real)) {
    if (typeof value !== 'function' || /^[A-Z]/.test(name)) {
      out[name] = value;
      continue;
    }
    out[name] = vi.fn(async (...args: unknown[]) => {
      calls.push({ module, name, args });
      if (failure !== null && !RUN_ON_REFUSAL.has(name)) throw failure;
      const answer = name in answers ? answers[name] : standInRow();
      return typeof answer === 'function' ? (answer as (...a: unknown[]) => unknown)(...args) : answer;
    });
  }
  return out;
}

/** Modules whose functions are spies: the data layer and every outside service. */
export function spiedModules(): string[] {
  const queries = readdirSync(path.join(ROOT, 'db/queries'))
    .filter((f) => f.endsWith('.ts'))
    .map((f) => `db/queries/${f.replace(/\.ts$/, '')}`);
  const services = ['lib/storage', 'lib/mail']
    .filter((dir) => statSync(path.join(ROOT, dir), { throwIfNoEntry: false })?.isDirectory())
    .flatMap((dir) => readdirSync(path.join(ROOT, dir)).filter((f) => f.endsWith('.ts')).map((f) => `${dir}/${f.replace(/\.ts$/, '')}`));
  return [...queries, ...services, 'lib/estimate-server/index', 'lib/estimate-server/wake', 'lib/programs/upload', 'lib/programs/program-storage'];
}

export class Redirect extends Error {
  constructor(readonly url: string) {
    super(`redirect to ${url}`);
  }
}

/** Installs the mocks; call before importing any route or action module. */
export function installMocks(): void {
  vi.doMock('server-only', () => ({}));
  vi.doMock('next-auth', () => ({ getServerSession: vi.fn(async () => (session ? { user: { ...session } } : null)) }));
  vi.doMock('next-auth/jwt', () => ({ decode: vi.fn(async () => null) }));
  vi.doMock(path.join(ROOT, 'lib/auth/options.ts'), () => ({ authOptions: {} }));
  vi.doMock('next/headers', () => ({
    cookies: vi.fn(async () => ({ get: () => undefined, getAll: () => [], has: () => false })),
    headers: vi.fn(async () => new Headers()),
  }));
  vi.doMock('next/cache', () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), unstable_cache: (f: unknown) => f }));
  vi.doMock('next/navigation', () => ({
    redirect: vi.fn((url: string) => {
      throw new Redirect(url);
    }),
    notFound: vi.fn(() => {
      throw new Error('notFound()');
    }),
  }));
  const unreachable = new Proxy(
    {},
    {
      get(_target, key) {
        if (key === 'then' || typeof key === 'symbol') return undefined;
        throw new Error(`the database was reached outside db/queries (db.${String(key)})`);
      },
    },
  );
  vi.doMock(path.join(ROOT, 'db/client.ts'), () => ({ db: unreachable, pool: unreachable, createPool: () => unreachable, closeDb: async () => {} }));
  for (const name of spiedModules()) {
    vi.doMock(path.join(ROOT, `${name}.ts`), async (importOriginal) => spied(name, (await importOriginal()) as Record<string, unknown>));
  }
}

// --- calling ----------------------------------------------------------------------------

export type RouteHandler = (request: Request, context: { params: Promise<Record<string, string>> }) => Promise<Response>;

export interface Call {
  method: HttpMethod;
  url: string;
  params?: Record<string, string>;
  /** a value to send as JSON, or { raw } for bytes sent as they are */
  body?: unknown;
  raw?: string;
  headers?: Record<string, string>;
}

export async function callRoute(handler: RouteHandler, call: Call): Promise<{ status: number; body: unknown; text: string }> {
  const hasBody = call.body !== undefined || call.raw !== undefined;
  const request = new Request(`http://127.0.0.1:3000${call.url}`, {
    method: call.method,
    headers: { ...(hasBody ? { 'content-type': 'application/json' } : {}), ...call.headers },
    body: call.raw !== undefined ? call.raw : call.body !== undefined ? JSON.stringify(call.body) : undefined,
  });
  const response = await handler(request, { params: Promise.resolve(call.params ?? {}) });
  const text = await response.text();
  let body: unknown = text;
  try {
    body = JSON.parse(text);
  } catch {
    // a file or an empty answer
  }
  return { status: response.status, body, text };
}

export type ServerAction = (previous: unknown, form: FormData) => Promise<unknown>;

export type ActionOutcome = { kind: 'state'; state: { status: string; message?: string; fields?: Record<string, string[]> } } | { kind: 'redirect'; url: string };

export async function callAction(action: ServerAction, form: Record<string, string>): Promise<ActionOutcome> {
  const data = new FormData();
  for (const [k, v] of Object.entries(form)) data.set(k, v);
  try {
    return { kind: 'state', state: (await action({ status: 'idle' }, data)) as ActionOutcome extends { state: infer S } ? S : never };
  } catch (error) {
    if (error instanceof Redirect) return { kind: 'redirect', url: error.url };
    throw error;
  }
}

/** Every exported function of a module: the handlers of a route file, the actions of an actions file. */
export function exportedFunctions(module: Record<string, unknown>): string[] {
  return Object.entries(module)
    .filter(([, v]) => typeof v === 'function')
    .map(([k]) => k)
    .sort();
}
