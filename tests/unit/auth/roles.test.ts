// The role table of lib/auth/roles.ts against the product's rules, written out here
// independently as a matrix. The expectations come from the product brief, PRODUCT.md: its
// table of who uses Kerfcast for what, and the steps of "The main job, end to end" (1 Set-up
// by the admin: users, machine profiles, tools, materials; 2 Job by the programmer; the
// estimator's quote; the operator's run), restated in docs/references.md §9. A row marked
// "brief:" follows PRODUCT.md; "inferred:" is our reading where it says nothing.
// estimates:write for the estimator (asking for an estimate on another machine) is inferred,
// not stated there. Machine profiles, tools and materials are written by the admin alone, as
// the brief's step 1 (Set-up) says; the programmer only chooses a profile for a job.
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ACTIONS, canDo, canSee, homeFor, PAGES, pagesFor, type Action } from '@/lib/auth/roles';
import { ROLES, type Role } from '@/lib/validation/enums';

const Y = true;
const N = false;
// columns:                   admin programmer estimator operator
const MATRIX: Record<Action, [boolean, boolean, boolean, boolean]> = {
  'jobs:read':               [Y, Y, Y, Y],
  'jobs:write':              [Y, Y, N, N],
  'jobs:mark-programmed':    [Y, Y, N, N], // brief: Job (programmer), Upload
  'jobs:mark-quoted':        [Y, N, Y, N], // brief: Quote (estimator)
  'jobs:mark-accepted':      [Y, N, Y, N], // brief: estimator / office; the customer answers the quote
  'jobs:schedule':           [Y, N, Y, N], // inferred: office work
  'jobs:start-run':          [Y, N, N, Y], // brief: Run (operator), run timer start
  'jobs:finish-run':         [Y, N, N, Y], // brief: Run (operator), run timer finish
  'jobs:cancel':             [Y, Y, Y, N], // inferred: the job's programmer or the office
  'programs:read':           [Y, Y, Y, Y],
  'programs:write':          [Y, Y, N, N],
  'estimates:read':          [Y, Y, Y, Y],
  'estimates:write':         [Y, Y, Y, N],
  'machines:read':           [Y, Y, Y, Y],
  'machines:write':          [Y, N, N, N], // brief: step 1, Set-up (admin): machine profiles and the tool library
  'materials:read':          [Y, Y, Y, Y], // brief: the operator knows the sheet; materials prefill jobs
  'materials:write':         [Y, N, N, N], // brief: step 1, Set-up (admin) lists the materials
  'customers:read':          [Y, Y, Y, N],
  'customers:write':         [Y, Y, Y, N],
  'users:read':              [Y, N, N, N],
  'users:write':             [Y, N, N, N],
  'shop:write':              [Y, N, N, N], // brief: the shop owner / admin sets the shop up
  'quotes:read':             [Y, N, Y, N], // brief: Quote (estimator)
  'quotes:write':            [Y, N, Y, N], // brief: Quote (estimator) builds, sends and revises
  'holddown:read':           [Y, Y, Y, N], // inferred: the programmer chooses the method, the estimator prices it
  'runs:read':               [Y, Y, Y, Y], // brief: Learn (estimated vs actual); the operator sees the runs
  'runs:write':              [Y, N, N, Y], // brief: Run (operator) logs the real time
  'runs:correct-any':        [Y, N, N, N], // issue 15: admins correct or void any run
  'calibration:apply':       [Y, N, N, N], // brief: Learn (admin) applies a calibration
  'dashboard:read':          [Y, N, Y, N], // issue 15: the landing page for admin and estimator
};

describe('role table', () => {
  it('covers exactly the actions of the matrix', () => {
    expect(Object.keys(ACTIONS).sort()).toEqual(Object.keys(MATRIX).sort());
  });

  for (const [action, row] of Object.entries(MATRIX) as [Action, boolean[]][]) {
    ROLES.forEach((role, i) => {
      it(`${role} ${row[i] ? 'may' : 'may not'} ${action}`, () => {
        expect(canDo(role, action)).toBe(row[i]);
      });
    });
  }

  it('gives the admin every action', () => {
    for (const action of Object.keys(ACTIONS) as Action[]) expect(canDo('admin', action)).toBe(true);
  });
});

describe('navigation', () => {
  const expected: Record<Role, string[]> = {
    admin: ['Jobs', 'Dashboard', 'Preview', 'Runs', 'Machines', 'Materials', 'Customers', 'Users', 'Settings'],
    programmer: ['Jobs', 'Preview', 'Runs', 'Machines', 'Materials', 'Customers'],
    estimator: ['Jobs', 'Dashboard', 'Preview', 'Runs', 'Machines', 'Materials', 'Customers'],
    operator: ['Jobs', 'Preview', 'Runs', 'Machines', 'Materials'],
  };

  it.each(ROLES)('%s sees exactly its pages, in navigation order', (role) => {
    expect(pagesFor(role).map((p) => p.label)).toEqual(expected[role]);
  });

  it('only the admin sees the users page, at /admin/users', () => {
    expect(PAGES.users.href).toBe('/admin/users');
    expect(ROLES.filter((r) => canSee(r, 'users'))).toEqual(['admin']);
  });

  it('every page in the navigation exists under app/(shop) (a link to a missing page is a 404 for the user)', () => {
    for (const page of Object.values(PAGES)) {
      expect(existsSync(join(process.cwd(), 'app', '(shop)', ...page.href.split('/').filter(Boolean), 'page.tsx')), page.href).toBe(true);
    }
  });

  it('admins and estimators start on the dashboard, programmers and operators on the jobs page (issue 15)', () => {
    expect(Object.fromEntries(ROLES.map((role) => [role, homeFor(role)]))).toEqual({ admin: '/dashboard', programmer: '/jobs', estimator: '/dashboard', operator: '/jobs' });
  });
});

describe('what a read shows along with its rows (issue 18 finding 11)', () => {
  it('an operator reads jobs with the customer name, not the customer records', async () => {
    const { READS_ALONG } = await import('@/lib/auth/roles');
    expect(READS_ALONG['jobs:read']).toContain('customer name');
    expect(canDo('operator', 'jobs:read')).toBe(true);
    expect(canDo('operator', 'customers:read')).toBe(false);
  });
});
