// The role rules, in one table: which role may open which page and call which
// action. Navigation, page guards, route handlers and server actions all read it,
// and tests/unit/auth/roles.test.ts checks it row by row. Pure data, safe to import
// from client components.
//
// | role       | pages                               | actions                                            |
// |------------|-------------------------------------|----------------------------------------------------|
// | admin      | dashboard, jobs, preview, runs,     | everything (shop settings, machines, tools and     |
// |            | machines, materials, customers,     | materials, calibration and correcting any run      |
// |            | users, settings                     | only here)                                         |
// | programmer | jobs, preview, runs, machines,      | jobs rw, programs rw (upload), estimates rw,       |
// |            | materials, customers                | machines read, materials read, customers rw,       |
// |            |                                     | hold-down comparison, runs read;                   |
// |            |                                     | job status: mark programmed, cancel                |
// | estimator  | dashboard, jobs, preview, runs,     | jobs read, programs read, estimates rw (request),  |
// |            | machines, materials, customers      | machines read, materials read, customers rw,       |
// |            |                                     | quotes rw, hold-down comparison, runs read;        |
// |            |                                     | job status: mark quoted, mark accepted, schedule,  |
// |            |                                     | cancel                                             |
// | operator   | jobs, preview, runs, machines,      | jobs read, programs read, estimates read,          |
// |            | materials                           | machines read, materials read, runs rw (own);      |
// |            |                                     | job status: start run, finish run                  |
//
// What an action reads along with its rows (READS_ALONG below): jobs:read gives every role
// the job's customer name, material and machine, because an operator must know whose job
// is on the table (issue 18 finding 11, decided: yes, the name only); the customer's
// record itself (contact, notes) needs customers:read, which operators do not have.
//
// The job status steps (draft → programmed → quoted → accepted → scheduled → running →
// done, and cancelled) are in lib/jobs/status-moves.ts; each step names one action here.
import type { Role } from '@/lib/validation/enums';

export type { Role };

export const ACTIONS = {
  'jobs:read': ['admin', 'programmer', 'estimator', 'operator'],
  // programmers and admins create jobs and upload (PRODUCT.md: the job is the programmer's)
  'jobs:write': ['admin', 'programmer'],
  // job status steps (lib/jobs/status-moves.ts): each step belongs to the person whose work
  // it records in PRODUCT.md's main job: the programmer's upload, the estimator's quote and
  // the office's answer from the customer, the operator's run
  'jobs:mark-programmed': ['admin', 'programmer'],
  'jobs:mark-quoted': ['admin', 'estimator'],
  'jobs:mark-accepted': ['admin', 'estimator'],
  'jobs:schedule': ['admin', 'estimator'],
  'jobs:start-run': ['admin', 'operator'],
  'jobs:finish-run': ['admin', 'operator'],
  'jobs:cancel': ['admin', 'programmer', 'estimator'],
  'programs:read': ['admin', 'programmer', 'estimator', 'operator'],
  'programs:write': ['admin', 'programmer'],
  'estimates:read': ['admin', 'programmer', 'estimator', 'operator'],
  // estimators request estimates for another machine or after a profile change
  'estimates:write': ['admin', 'programmer', 'estimator'],
  'machines:read': ['admin', 'programmer', 'estimator', 'operator'],
  'machines:write': ['admin'],
  // machine profiles, tools and sheet materials are the admin's set-up (PRODUCT.md, "The main job", step 1)
  'materials:read': ['admin', 'programmer', 'estimator', 'operator'],
  'materials:write': ['admin'],
  'customers:read': ['admin', 'programmer', 'estimator'],
  'customers:write': ['admin', 'programmer', 'estimator'],
  'users:read': ['admin'],
  'users:write': ['admin'],
  // shop-wide settings (the length unit forms show; quote, labour and calibration settings)
  'shop:write': ['admin'],
  // quotes: the estimator's work (PRODUCT.md, main job step Quote), the admin's too
  'quotes:read': ['admin', 'estimator'],
  'quotes:write': ['admin', 'estimator'],
  // the hold-down comparison prices labour at the shop's rates: the people who choose the
  // method (the programmer, in the CAM program) and the people who price it
  'holddown:read': ['admin', 'programmer', 'estimator'],
  // runs at the machine: every role reads them (estimated vs actual); operators log them
  'runs:read': ['admin', 'programmer', 'estimator', 'operator'],
  'runs:write': ['admin', 'operator'],
  // correcting or voiding any run, on any day (operators correct their own, on the day)
  'runs:correct-any': ['admin'],
  // a calibration makes a new machine version: the admin's set-up (PRODUCT.md, Learn)
  'calibration:apply': ['admin'],
  // the shop's dashboard: the landing page of the office
  'dashboard:read': ['admin', 'estimator'],
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof ACTIONS;

/** Fields of other resources an action shows with its own rows, by decision (see the note above). */
export const READS_ALONG: Partial<Record<Action, readonly string[]>> = {
  'jobs:read': ['customer name', 'material name', 'machine name'],
};

export interface PageRule {
  href: string;
  label: string;
  /** the action a role needs to see the page */
  needs: Action;
}

/** In navigation order. */
export const PAGES = {
  jobs: { href: '/jobs', label: 'Jobs', needs: 'jobs:read' },
  dashboard: { href: '/dashboard', label: 'Dashboard', needs: 'dashboard:read' },
  preview: { href: '/preview', label: 'Preview', needs: 'programs:read' },
  runs: { href: '/runs', label: 'Runs', needs: 'runs:read' },
  machines: { href: '/machines', label: 'Machines', needs: 'machines:read' },
  materials: { href: '/materials', label: 'Materials', needs: 'materials:read' },
  customers: { href: '/customers', label: 'Customers', needs: 'customers:read' },
  users: { href: '/admin/users', label: 'Users', needs: 'users:read' },
  settings: { href: '/admin/settings', label: 'Settings', needs: 'shop:write' },
} as const satisfies Record<string, PageRule>;

export type PageKey = keyof typeof PAGES;

export function rolesFor(action: Action): readonly Role[] {
  return ACTIONS[action];
}

export function canDo(role: Role, action: Action): boolean {
  return (ACTIONS[action] as readonly Role[]).includes(role);
}

export function canSee(role: Role, page: PageKey): boolean {
  return canDo(role, PAGES[page].needs);
}

export function pagesFor(role: Role): { key: PageKey; href: string; label: string }[] {
  return (Object.keys(PAGES) as PageKey[]).filter((key) => canSee(role, key)).map((key) => ({ key, href: PAGES[key].href, label: PAGES[key].label }));
}

/** Where a role lands after signing in: the dashboard for the office (admin, estimator), the jobs page for everyone else. */
export function homeFor(role: Role): string {
  return canSee(role, 'dashboard') ? PAGES.dashboard.href : PAGES.jobs.href;
}
