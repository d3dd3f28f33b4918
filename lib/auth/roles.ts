// The role rules, in one table: which role may open which page and call which
// action. Navigation, page guards, route handlers and server actions all read it,
// and tests/unit/auth/roles.test.ts checks it row by row. Pure data, safe to import
// from client components.
//
// | role       | pages                               | actions                                            |
// |------------|-------------------------------------|----------------------------------------------------|
// | admin      | jobs, machines, materials,          | everything (shop settings only here)               |
// |            | customers, users                    |                                                    |
// | programmer | jobs, machines, materials,          | jobs rw, programs rw (upload), estimates rw,       |
// |            | customers                           | machines rw, materials rw, customers rw;           |
// |            |                                     | job status: mark programmed, cancel                |
// | estimator  | jobs, machines, materials,          | jobs read, programs read, estimates rw (request),  |
// |            | customers                           | machines read, materials read, customers rw;       |
// |            |                                     | job status: mark quoted, mark accepted, schedule,  |
// |            |                                     | cancel                                             |
// | operator   | jobs, machines, materials           | jobs read, programs read, estimates read,          |
// |            |                                     | machines read, materials read;                     |
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
  'machines:write': ['admin', 'programmer'],
  // sheet materials are set-up data like the machines: the same roles keep them
  'materials:read': ['admin', 'programmer', 'estimator', 'operator'],
  'materials:write': ['admin', 'programmer'],
  'customers:read': ['admin', 'programmer', 'estimator'],
  'customers:write': ['admin', 'programmer', 'estimator'],
  'users:read': ['admin'],
  'users:write': ['admin'],
  // shop-wide settings (the length unit forms show)
  'shop:write': ['admin'],
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
  machines: { href: '/machines', label: 'Machines', needs: 'machines:read' },
  materials: { href: '/materials', label: 'Materials', needs: 'materials:read' },
  customers: { href: '/customers', label: 'Customers', needs: 'customers:read' },
  users: { href: '/admin/users', label: 'Users', needs: 'users:read' },
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

/** Where a role lands after signing in: its first page. Every role can see jobs. */
export function homeFor(role: Role): string {
  return pagesFor(role)[0]?.href ?? '/jobs';
}
