// Bad input on every route handler (the house rule in DEVELOPERS.md: bad input answers 422
// with field issues, in the one error shape { error: { code, message, fields? } } of
// lib/errors.ts; an unexpected failure answers 500 in the same shape, never a stack trace:
// OWASP ASVS 4.0.3 V7.4.1). Each handler of every app/api/**/route.ts, found on disk, is
// called as a role the table allows, with the data layer mocked (tests/unit/support/handlers.ts):
// - a handler that reads JSON: a body that is not JSON; {}; JSON that is not an object; a
//   body of the right keys with values of the wrong types; the boundary values of its
//   schema (tests/unit/support/handler-specs.ts names them and their sources). A refused
//   body reaches no data; a value inside the limit does;
// - a handler that reads no body ignores one;
// - a route id that is not a row id (letters, 0, 2^31) is 404, not a crash;
// - a list route's bad query parameter is 422 naming it;
// - every handler: an unexpected error in the data layer answers 500 with the error shape,
//   and neither the answer nor the log line carries the error's message or stack.
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { Action } from '@/lib/auth/roles';
import * as harness from '../support/handlers';
import { OWN_PASSWORD, PUBLIC, ROUTE_SPECS, type RouteSpec } from '../support/handler-specs';

harness.installMocks();
const { canDo } = await import('@/lib/auth/roles');
const { ROLES } = await import('@/lib/validation/enums');

type ErrorAnswer = { error: { code: string; message: string; fields?: Record<string, string[]> } };

/** a role the spec allows: the bad input must be judged past the guard */
function signInAllowed(spec: RouteSpec) {
  if (spec.action === PUBLIC) return harness.signInAs(null);
  if (spec.action === OWN_PASSWORD) return harness.signInAs('operator');
  const action = spec.action as Action;
  harness.signInAs(ROLES.find((role) => canDo(role, action)) ?? null);
}

const routes: { key: string; file: string; method: harness.HttpMethod; handler: harness.RouteHandler; spec: RouteSpec }[] = [];
for (const file of harness.discoverRoutes()) {
  const exports = (await import(`@/${file}`)) as Record<string, unknown>;
  for (const name of harness.exportedFunctions(exports)) {
    const key = `${name} ${harness.routeUrlPath(file)}`;
    // a handler without a spec fails tests/unit/auth/route-guards.test.ts's discovery
    if (ROUTE_SPECS[key]) routes.push({ key, file, method: name as harness.HttpMethod, handler: exports[name] as harness.RouteHandler, spec: ROUTE_SPECS[key] });
  }
}

function params(route: (typeof routes)[number], override: Record<string, string> = {}) {
  return Object.fromEntries(harness.routeParams(route.file).map((p) => [p, override[p] ?? route.spec.params?.[p] ?? '5']));
}

async function call(route: (typeof routes)[number], send: { body?: unknown; raw?: string; query?: string; params?: Record<string, string> }) {
  harness.reset(route.spec.answers);
  signInAllowed(route.spec);
  const p = params(route, send.params);
  const url = harness.routeUrlPath(route.file).replace(/\[(\w+)\]/g, (_, k: string) => p[k]) + (send.query ?? route.spec.query ?? '');
  return harness.callRoute(route.handler, { method: route.method, url, params: p, body: send.body, raw: send.raw });
}

/** 422 in the error shape with fields, every message a sentence, and nothing reached the data */
function expectRefused(answer: { status: number; body: unknown }, field?: string) {
  expect(answer.status, JSON.stringify(answer.body)).toBe(422);
  const { error } = answer.body as ErrorAnswer;
  expect(error.code).toMatch(/^invalid:[\w -]+$/);
  expect(error.message.length).toBeGreaterThan(10);
  expect(error.fields, 'the answer names the fields').toBeDefined();
  const fields = error.fields ?? {};
  expect(Object.keys(fields).length).toBeGreaterThan(0);
  for (const [key, messages] of Object.entries(fields)) {
    expect(messages.length, key).toBeGreaterThan(0);
    for (const m of messages) expect(m, key).toMatch(/\w{2,}/);
  }
  if (field) expect(Object.keys(fields)).toContain(field);
  expect(harness.dataCalls(), 'a refused body reaches no data').toEqual([]);
  return fields;
}

const withBody = routes.filter((r) => r.spec.input);
const noBody = routes.filter((r) => !r.spec.input && !r.spec.inputElsewhere && r.method !== 'GET');
const withIds = routes.filter((r) => harness.routeParams(r.file).some((p) => p.endsWith('Id') || p === 'version'));

describe('the routes under test', () => {
  it('every handler other than GET either checks a JSON body here or names where its input is tested', () => {
    expect(withBody.length).toBeGreaterThanOrEqual(18);
    for (const r of routes.filter((x) => x.method !== 'GET')) expect(Boolean(r.spec.input) || Boolean(r.spec.inputElsewhere) || noBody.includes(r), r.key).toBe(true);
  });
});

describe('a JSON body that is not what the route takes: 422 with fields, nothing stored', () => {
  for (const route of withBody) {
    const checks = route.spec.input!;
    describe(route.key, () => {
      it('a body that is not JSON: 422 invalid:body', async () => {
        const answer = await call(route, { raw: '{"name": "Marlow Street Bakery", ' });
        expect(answer.status).toBe(422);
        expect(answer.body).toEqual({ error: { code: 'invalid:body', message: 'The request body is not valid JSON.' } });
        expect(harness.dataCalls()).toEqual([]);
      });

      it('{}: 422 naming the fields', async () => {
        expectRefused(await call(route, { body: {} }));
      });

      it.each([['null'], ['[]'], ['"Marlow Street Bakery"'], ['42']])('JSON that is not an object (%s): 422', async (raw) => {
        expectRefused(await call(route, { raw }));
      });

      it(`values of the wrong types: 422 naming ${checks.wrongTypes.fields.join(', ')}`, async () => {
        const fields = expectRefused(await call(route, { body: checks.wrongTypes.body }));
        expect(Object.keys(fields).sort()).toEqual([...checks.wrongTypes.fields].sort());
      });

      it('the valid body reaches the data (so the refusals above are about the input)', async () => {
        const answer = await call(route, { body: route.spec.body });
        expect(answer.status, JSON.stringify(answer.body)).toBe(route.spec.status ?? 200);
        expect(harness.dataCalls().length).toBeGreaterThan(0);
      });

      for (const b of checks.boundaries ?? []) {
        it(`${b.label}: ${b.expect === true ? 'accepted' : `422 at ${b.expect}`}`, async () => {
          const answer = await call(route, b.raw !== undefined ? { raw: b.raw } : { body: b.body });
          if (b.expect === true) {
            expect(answer.status, JSON.stringify(answer.body)).toBe(route.spec.status ?? 200);
            expect(harness.dataCalls().length).toBeGreaterThan(0);
          } else {
            expectRefused(answer, b.expect);
          }
        });
      }
    });
  }
});

describe('a handler that reads no body ignores one', () => {
  for (const route of noBody) {
    it(`${route.key}: a body that is not JSON changes nothing`, async () => {
      const answer = await call(route, { raw: 'not json at all' });
      expect(answer.status, JSON.stringify(answer.body)).toBe(route.spec.status ?? 200);
    });
  }
});

describe('a route id that is not a row id answers 404, not a crash', () => {
  for (const route of withIds) {
    const idParams = harness.routeParams(route.file).filter((p) => p.endsWith('Id') || p === 'version');
    for (const p of idParams) {
      it.each([['12abc'], ['0'], ['-3'], ['2147483648'], ['1e3'], [' 7']])(`${route.key} with ${p} %j`, async (raw) => {
        const answer = await call(route, { params: { [p]: raw }, body: route.spec.body });
        expect(answer.status, JSON.stringify(answer.body)).toBe(404);
        expect((answer.body as ErrorAnswer).error.code).toMatch(/^not-found:/);
        expect(harness.dataCalls().filter((c) => c.module.startsWith('db/queries/'))).toEqual([]);
      });
    }
  }
});

describe("a list route's bad query parameter is 422 naming it", () => {
  for (const route of routes.filter((r) => r.spec.badQueries)) {
    for (const q of route.spec.badQueries!) {
      it(`${route.key}${q.query}`, async () => {
        expectRefused(await call(route, { query: q.query }), q.field);
      });
    }
  }
});

describe('an unexpected error answers 500 in the error shape, with no message or stack of the error', () => {
  const secret = 'ER_ACCESS_DENIED for kerfcast@127.0.0.1 SELECT password_hash FROM users';
  afterEach(() => vi.restoreAllMocks());

  for (const route of routes) {
    it(route.key, async () => {
      const log = vi.spyOn(console, 'error').mockImplementation(() => {});
      harness.reset(route.spec.answers);
      signInAllowed(route.spec);
      const failure = Object.assign(new Error(secret), { code: 'ER_ACCESS_DENIED_ERROR' });
      harness.failWith(failure);
      const p = params(route);
      const url = harness.routeUrlPath(route.file).replace(/\[(\w+)\]/g, (_, k: string) => p[k]) + (route.spec.query ?? '');
      const answer = await harness.callRoute(route.handler, { method: route.method, url, params: p, body: route.spec.body });
      expect(harness.dataCalls().length, 'the failing data layer was reached').toBeGreaterThan(0);
      expect(answer.status).toBe(500);
      expect(answer.body).toEqual({ error: { code: 'internal', message: 'Something went wrong on the server.' } });
      expect(answer.text).not.toContain('password_hash');
      expect(answer.text).not.toMatch(/\bat \S+ \(|\.ts:\d+/);
      const logged = log.mock.calls.map((args) => args.map(String).join(' ')).join('\n');
      expect(logged).toContain('ER_ACCESS_DENIED_ERROR');
      expect(logged).not.toContain('password_hash');
      expect(logged).not.toMatch(/\bat \S+ \(/);
    });
  }
});
