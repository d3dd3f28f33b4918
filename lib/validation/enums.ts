// The enumerations the forms offer, kept here so that client bundles do not pull in
// Drizzle. db/schema.ts builds its ENUM columns from these lists.
export const ROLES = ['admin', 'programmer', 'estimator', 'operator'] as const;
export const HOLD_DOWNS = ['vacuum', 'tape-glue', 'clamps', 'tabs', 'skin'] as const;
export const Z_ZEROS = ['top', 'table'] as const;
export const JOB_STATUSES = ['draft', 'programmed', 'quoted', 'accepted', 'scheduled', 'running', 'done', 'cancelled'] as const;
/** An estimate's life: queued, being computed by a worker thread, stored, or failed with its reason. */
export const ESTIMATE_STATUSES = ['pending', 'running', 'done', 'failed'] as const;
/** Router bit kinds of a machine's tool library (PRODUCT.md: up-cut, down-cut, compression, straight, V, ball). */
export const TOOL_KINDS = ['upcut', 'downcut', 'compression', 'straight', 'v', 'ball'] as const;
/** A quote's life: drafted, sent to the customer, then answered or run out of time. */
export const QUOTE_STATUSES = ['draft', 'sent', 'accepted', 'declined', 'expired'] as const;
/** A message handed to the SMTP server: being sent, accepted by the server, or refused with its reason. */
export const MAIL_STATUSES = ['sending', 'sent', 'failed'] as const;
/** A run at the machine: timer running, paused, finished, or voided by an admin. */
export const RUN_STATUSES = ['running', 'paused', 'finished', 'voided'] as const;
export const RUN_EVENT_KINDS = ['start', 'pause', 'resume', 'finish'] as const;

export type Role = (typeof ROLES)[number];
export type HoldDown = (typeof HOLD_DOWNS)[number];
export type ZZero = (typeof Z_ZEROS)[number];
export type JobStatus = (typeof JOB_STATUSES)[number];
export type EstimateStatus = (typeof ESTIMATE_STATUSES)[number];
export type ToolKind = (typeof TOOL_KINDS)[number];
export type QuoteStatus = (typeof QUOTE_STATUSES)[number];
export type MailStatus = (typeof MAIL_STATUSES)[number];
export type RunStatus = (typeof RUN_STATUSES)[number];
export type RunEventKind = (typeof RUN_EVENT_KINDS)[number];

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  programmer: 'Programmer',
  estimator: 'Estimator',
  operator: 'Operator',
};

/** A role as it reads inside a sentence ("Priya is now a programmer"). */
export const ROLE_IN_SENTENCE: Record<Role, string> = {
  admin: 'an admin',
  programmer: 'a programmer',
  estimator: 'an estimator',
  operator: 'an operator',
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
  scheduled: 'Scheduled',
  running: 'Running',
  done: 'Done',
  cancelled: 'Cancelled',
};

export const TOOL_KIND_LABELS: Record<ToolKind, string> = {
  upcut: 'Up-cut spiral',
  downcut: 'Down-cut spiral',
  compression: 'Compression spiral',
  straight: 'Straight',
  v: 'V-bit',
  ball: 'Ball nose',
};
