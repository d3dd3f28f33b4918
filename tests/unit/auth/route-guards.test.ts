// "Every route handler and server action is role-guarded" (DEVELOPERS.md, house rules), run
// rather than read: each exported handler of every app/api/**/route.ts and each export of
// every 'use server' file under app/ is CALLED, signed in as every role in turn, and its answer
// is judged against the role table in lib/auth/roles.ts (the oracle; the table itself is
// checked against PRODUCT.md in tests/unit/auth/roles.test.ts):
// - a role the table allows reaches the data (a db/queries call) with its own shop id first,
//   and the call succeeds;
// - a role it does not allow gets 403 forbidden:<the action's subject> and reaches no data;
// - signed out: 401 and no data; a one-time password not yet replaced: 403
//   forbidden:password-change (only the password change itself is open then).
// The files are found on disk: a new route or action without a spec in
// tests/unit/support/handler-specs.ts fails here. The session lookup (next-auth's
// getServerSession) and the data layer are mocked (tests/unit/support/handlers.ts).
import { describe, expect, it } from 'vitest';
import type { Action } from '@/lib/auth/roles';
import * as harness from '../support/handlers';
import { ACTION_SPECS, OWN_PASSWORD, PUBLIC, ROUTE_SPECS, ROUTES_OUTSIDE_API, type ActionSpec, type RouteSpec } from '../support/handler-specs';

harness.installMocks();
const { canDo } = await import('@/lib/auth/roles');
const { PASSWORD_CHANGE_FIRST } = await import('@/lib/auth/require-role');
const { ROLES } = await import('@/lib/validation/enums');
type Role = (typeof ROLES)[number];

/**
 * The error code's subject for an action, as lib/errors.ts documents the codes
 * ("forbidden:job" for the jobs resource): the resource in the singular.
 */
const subject = (spec: { action: string }) => (spec.action === OWN_PASSWORD ? 'password' : spec.action.split(':')[0].replace(/s$/, ''));
const allowed = (spec: { action: Action | typeof OWN_PASSWORD | typeof PUBLIC }, role: Role) => spec.action === OWN_PASSWORD || spec.action === PUBLIC || canDo(role, spec.action);

const routeFiles = harness.discoverRoutes();
const actionFiles = harness.discoverActions();

const routes: { key: string; file: string; method: string; handler: harness.RouteHandler }[] = [];
for (const file of routeFiles) {
  const exports = (await import(`@/${file}`)) as Record<string, unknown>;
  for (const name of harness.exportedFunctions(exports)) {
    routes.push({ key: `${name} ${harness.routeUrlPath(file)}`, file, method: name, handler: exports[name] as harness.RouteHandler });
  }
}
const actions: { key: string; action: harness.ServerAction }[] = [];
for (const file of actionFiles) {
  const exports = (await import(`@/${file}`)) as Record<string, unknown>;
  for (const name of harness.exportedFunctions(exports)) actions.push({ key: `${file} ${name}`, action: exports[name] as harness.ServerAction });
}

function callOf(route: (typeof routes)[number], spec: RouteSpec): harness.Call {
  const params = Object.fromEntries(harness.routeParams(route.file).map((p) => [p, spec.params?.[p] ?? '5']));
  const url = harness.routeUrlPath(route.file).replace(/\[(\w+)\]/g, (_, p: string) => params[p]) + (spec.query ?? '');
  return { method: route.method as harness.HttpMethod, url, params, body: spec.body };
}

function expectReachedDataAsOwnShop() {
  const data = harness.dataCalls();
  expect(data.length, 'the call reached the data').toBeGreaterThan(0);
  const queries = data.filter((c) => c.module.startsWith('db/queries/'));
  expect(queries.length, 'a db/queries call was made').toBeGreaterThan(0);
  expect(queries[0].args[0], `${queries[0].name} was given the user's shop id`).toBe(harness.SHOP_ID);
  for (const c of queries) if (typeof c.args[0] === 'number') expect(c.args[0], `${c.name}'s shop id`).toBe(harness.SHOP_ID);
}

describe('discovery', () => {
  it('finds the route handlers and server actions on disk', () => {
    // counted when this test was written: 27 route files with 46 handlers, 6 action files with 18 actions
    expect(routeFiles.length).toBeGreaterThanOrEqual(27);
    expect(routes.length).toBeGreaterThanOrEqual(46);
    expect(actionFiles.length).toBeGreaterThanOrEqual(6);
    expect(actions.length).toBeGreaterThanOrEqual(18);
  });

  it('every exported route handler has a spec, and every spec a handler', () => {
    const found = routes.map((r) => r.key).sort();
    expect(found.filter((k) => !(k in ROUTE_SPECS)), 'handlers without a spec in tests/unit/support/handler-specs.ts').toEqual([]);
    expect(Object.keys(ROUTE_SPECS).filter((k) => !found.includes(k)), 'specs of handlers that no longer exist').toEqual([]);
  });

  it('every exported server action has a spec, and every spec an action', () => {
    const found = actions.map((a) => a.key).sort();
    expect(found.filter((k) => !(k in ACTION_SPECS)), 'actions without a spec in tests/unit/support/handler-specs.ts').toEqual([]);
    expect(Object.keys(ACTION_SPECS).filter((k) => !found.includes(k)), 'specs of actions that no longer exist').toEqual([]);
  });

  it('a route file outside app/api is listed with the reason it has no role guard', () => {
    expect(harness.discoverOtherRoutes().filter((f) => !(f in ROUTES_OUTSIDE_API))).toEqual([]);
  });

  it("no server action is defined inline ('use server' inside a component), where no test would find it", () => {
    expect(harness.inlineActionFiles()).toEqual([]);
  });

  it('exports only HTTP methods from route files', () => {
    for (const r of routes) expect(harness.HTTP_METHODS, r.key).toContain(r.method);
  });
});

describe('route handlers, called as every role', () => {
  for (const route of routes) {
    const spec = ROUTE_SPECS[route.key];
    if (!spec) continue; // reported by the discovery test above
    if (spec.action === PUBLIC) {
      describe(`${route.key} (public: ${spec.publicBecause})`, () => {
        it('says why it is public', () => expect(spec.publicBecause?.length).toBeGreaterThan(20));
        for (const role of [...ROLES, null]) {
          it(`${role ?? 'signed out'}: answered the same, without the session deciding`, async () => {
            harness.reset(spec.answers);
            harness.signInAs(role);
            const answer = await harness.callRoute(route.handler, callOf(route, spec));
            expect(answer.status, JSON.stringify(answer.body)).toBe(spec.status ?? 200);
            expect(harness.dataCalls().length).toBeGreaterThan(0);
            // nothing of the signed-in user's shop rides along into a public answer
            for (const c of harness.dataCalls()) expect(c.args).not.toContain(harness.SHOP_ID);
          });
        }
      });
      continue;
    }
    describe(route.key, () => {
      for (const role of ROLES) {
        const may = allowed(spec, role);
        it(`${role}: ${may ? `allowed (${spec.status ?? 200}), with its own shop` : `403 forbidden:${subject(spec)}, no data reached`}`, async () => {
          harness.reset(spec.answers);
          harness.signInAs(role);
          const answer = await harness.callRoute(route.handler, callOf(route, spec));
          if (may) {
            expect(answer.status, JSON.stringify(answer.body)).toBe(spec.status ?? 200);
            expectReachedDataAsOwnShop();
          } else {
            expect(answer.status).toBe(403);
            expect(answer.body).toEqual({ error: { code: `forbidden:${subject(spec)}`, message: 'Your role does not allow this.' } });
            expect(harness.dataCalls()).toEqual([]);
          }
        });
      }

      it('signed out: 401 unauthorized, no data reached', async () => {
        harness.reset(spec.answers);
        harness.signInAs(null);
        const answer = await harness.callRoute(route.handler, callOf(route, spec));
        expect(answer.status).toBe(401);
        expect((answer.body as { error: { code: string } }).error.code).toBe('unauthorized');
        expect(harness.dataCalls()).toEqual([]);
      });

      it(spec.action === OWN_PASSWORD ? 'open to an admin who must replace a one-time password' : 'an admin who must replace a one-time password first: 403 forbidden:password-change', async () => {
        harness.reset(spec.answers);
        harness.signInAs('admin', { mustChangePassword: true });
        const answer = await harness.callRoute(route.handler, callOf(route, spec));
        if (spec.action === OWN_PASSWORD) {
          expect(answer.status).toBe(spec.status ?? 200);
          expectReachedDataAsOwnShop();
        } else {
          expect(answer.status).toBe(403);
          expect(answer.body).toEqual({ error: { code: 'forbidden:password-change', message: PASSWORD_CHANGE_FIRST } });
          expect(harness.dataCalls()).toEqual([]);
        }
      });
    });
  }
});

function expectActionSucceeded(outcome: harness.ActionOutcome) {
  if (outcome.kind === 'state') expect(outcome.state.status, JSON.stringify(outcome.state)).toBe('ok');
  else expect(outcome.url).toMatch(/^\//);
}

describe('server actions, called as every role', () => {
  for (const { key, action } of actions) {
    const spec: ActionSpec | undefined = ACTION_SPECS[key];
    if (!spec) continue;
    describe(key, () => {
      for (const role of ROLES) {
        const may = allowed(spec, role);
        it(`${role}: ${may ? 'allowed, with its own shop' : 'refused with the role message, no data reached'}`, async () => {
          harness.reset(spec.answers);
          harness.signInAs(role);
          const outcome = await harness.callAction(action, spec.form);
          if (may) {
            expectActionSucceeded(outcome);
            expectReachedDataAsOwnShop();
          } else {
            expect(outcome).toEqual({ kind: 'state', state: { status: 'error', message: 'Your role does not allow this.', at: expect.any(Number) } });
            expect(harness.dataCalls()).toEqual([]);
          }
        });
      }

      it('signed out: refused, no data reached', async () => {
        harness.reset(spec.answers);
        harness.signInAs(null);
        const outcome = await harness.callAction(action, spec.form);
        expect(outcome).toEqual({ kind: 'state', state: { status: 'error', message: 'Sign in to continue.', at: expect.any(Number) } });
        expect(harness.dataCalls()).toEqual([]);
      });

      it(spec.action === OWN_PASSWORD ? 'open to a user who must replace a one-time password' : 'refused while a one-time password is not replaced', async () => {
        harness.reset(spec.answers);
        harness.signInAs('admin', { mustChangePassword: true });
        const outcome = await harness.callAction(action, spec.form);
        if (spec.action === OWN_PASSWORD) {
          expectActionSucceeded(outcome);
          expectReachedDataAsOwnShop();
        } else {
          expect(outcome).toEqual({ kind: 'state', state: { status: 'error', message: PASSWORD_CHANGE_FIRST, at: expect.any(Number) } });
          expect(harness.dataCalls()).toEqual([]);
        }
      });
    });
  }
});
