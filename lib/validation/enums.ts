// The enumerations the forms offer, kept here so that client bundles do not pull in
// Drizzle. tests/unit/validation/enums.test.ts proves they equal db/schema.ts's.
export const ROLES = ['admin', 'programmer', 'estimator', 'operator'] as const;
export const HOLD_DOWNS = ['vacuum', 'tape-glue', 'clamps', 'tabs', 'skin'] as const;
export const Z_ZEROS = ['top', 'table'] as const;
export const JOB_STATUSES = ['draft', 'programmed', 'quoted', 'accepted', 'running', 'done', 'cancelled'] as const;

export type Role = (typeof ROLES)[number];
export type HoldDown = (typeof HOLD_DOWNS)[number];
export type ZZero = (typeof Z_ZEROS)[number];
export type JobStatus = (typeof JOB_STATUSES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  programmer: 'Programmer',
  estimator: 'Estimator',
  operator: 'Operator',
};

export const HOLD_DOWN_LABELS: Record<HoldDown, string> = {
  vacuum: 'Vacuum',
  'tape-glue': 'Tape and glue',
  clamps: 'Screws or clamps',
  tabs: 'Tabs',
  skin: 'Onion skin',
};

export const JOB_STATUS_LABELS: Record<JobStatus, string> = {
  draft: 'Draft',
  programmed: 'Programmed',
  quoted: 'Quoted',
  accepted: 'Accepted',
  running: 'Running',
  done: 'Done',
  cancelled: 'Cancelled',
};
