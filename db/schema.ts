// Kerfcast's tables. Every row belongs to a shop (the tenant) and every query in
// db/queries filters by the signed-in user's shop id. Lengths mm, feeds mm/min,
// accelerations mm/s², times s, money in integer minor units.
import {
  mysqlTable,
  int,
  varchar,
  boolean,
  double,
  timestamp,
  mysqlEnum,
  customType,
  uniqueIndex,
  index,
  text,
  char,
  bigint,
  date,
  primaryKey,
} from 'drizzle-orm/mysql-core';
import { sql } from 'drizzle-orm';
import {
  ESTIMATE_STATUSES,
  HOLD_DOWNS,
  JOB_STATUSES,
  MAIL_STATUSES,
  QUOTE_STATUSES,
  ROLES,
  RUN_EVENT_KINDS,
  RUN_STATUSES,
  TOOL_KINDS,
  Z_ZEROS,
} from '@/lib/validation/enums';
import type { MachineProfile } from '@/lib/validation/machine-profile';

// The enumerations have one source, lib/validation/enums.ts (client bundles read it without
// Drizzle); they are re-exported here for the queries.
export { ESTIMATE_STATUSES, HOLD_DOWNS, JOB_STATUSES, MAIL_STATUSES, QUOTE_STATUSES, ROLES, RUN_EVENT_KINDS, RUN_STATUSES, TOOL_KINDS, Z_ZEROS };

/** The job settings an estimate was made with, frozen beside it. */
export interface EstimateSettingsDoc {
  sheet: { widthMm: number; lengthMm: number; thicknessMm: number } | null;
  zero: (typeof Z_ZEROS)[number];
  hold: (typeof HOLD_DOWNS)[number] | null;
  vacuumKpa: number | null;
  /**
   * the level the machine's own vacuum table holds (machines.default_vacuum_kpa) when the
   * estimate was asked for: the hold-down comparison analyses vacuum at it too. Missing on
   * estimates made before the comparison existed.
   */
  machineVacuumKpa?: number | null;
}

// MariaDB stores JSON as LONGTEXT with a validity check; depending on server and driver
// version a read gives a string or an already parsed value. Accept both, so reads always
// give the object that was written.
const jsonDoc = <T>(name: string) =>
  customType<{ data: T; driverData: string }>({
    dataType: () => 'json',
    toDriver: (value) => JSON.stringify(value),
    fromDriver: (value) => (typeof value === 'string' ? (JSON.parse(value) as T) : (value as T)),
  })(name);

const created = () => timestamp('created_at').notNull().defaultNow();
const updated = () => timestamp('updated_at').notNull().defaultNow().onUpdateNow();

export const shops = mysqlTable('shops', {
  id: int('id').autoincrement().primaryKey(),
  name: varchar('name', { length: 120 }).notNull(),
  slug: varchar('slug', { length: 60 }).notNull().unique(),
  currency: varchar('currency', { length: 3 }).notNull().default('EUR'),
  /** how lengths are shown and typed in forms; stored values are always mm */
  lengthUnit: mysqlEnum('length_unit', ['mm', 'inch']).notNull().default('mm'),
  createdAt: created(),
});

export const users = mysqlTable(
  'users',
  {
    id: int('id').autoincrement().primaryKey(),
    shopId: int('shop_id').notNull().references(() => shops.id),
    email: varchar('email', { length: 190 }).notNull(),
    name: varchar('name', { length: 120 }).notNull(),
    passwordHash: varchar('password_hash', { length: 100 }).notNull(),
    role: mysqlEnum('role', ROLES).notNull(),
    disabled: boolean('disabled').notNull().default(false),
    /** set with a one-time password from an admin: nothing but choosing a new one is allowed until then */
    mustChangePassword: boolean('must_change_password').notNull().default(false),
    createdAt: created(),
    updatedAt: updated(),
  },
  // An e-mail is unique within a shop, not across Kerfcast: an admin must not learn that
  // an address has an account in another shop (sign-in tries every account of the address).
  (t) => [uniqueIndex('users_shop_email_unique').on(t.shopId, t.email), index('users_email_idx').on(t.email)],
);

export const machines = mysqlTable(
  'machines',
  {
    id: int('id').autoincrement().primaryKey(),
    shopId: int('shop_id').notNull().references(() => shops.id),
    name: varchar('name', { length: 120 }).notNull(),
    /** bumped on every change of a profile field; machine_versions keeps each snapshot */
    version: int('version').notNull().default(1),
    travelXMm: double('travel_x_mm').notNull(),
    travelYMm: double('travel_y_mm').notNull(),
    travelZMm: double('travel_z_mm').notNull(),
    homeXMm: double('home_x_mm').notNull().default(0),
    homeYMm: double('home_y_mm').notNull().default(0),
    homeZMm: double('home_z_mm').notNull().default(0),
    maxFeedXMmPerMin: double('max_feed_x_mm_per_min').notNull(),
    maxFeedYMmPerMin: double('max_feed_y_mm_per_min').notNull(),
    maxFeedZMmPerMin: double('max_feed_z_mm_per_min').notNull(),
    rapidXMmPerMin: double('rapid_x_mm_per_min').notNull(),
    rapidYMmPerMin: double('rapid_y_mm_per_min').notNull(),
    rapidZMmPerMin: double('rapid_z_mm_per_min').notNull(),
    accelXMmPerS2: double('accel_x_mm_per_s2').notNull(),
    accelYMmPerS2: double('accel_y_mm_per_s2').notNull(),
    accelZMmPerS2: double('accel_z_mm_per_s2').notNull(),
    cornerToleranceMm: double('corner_tolerance_mm').notNull(),
    lookaheadBlocks: int('lookahead_blocks').notNull(),
    maxBlocksPerS: double('max_blocks_per_s').notNull(),
    chordToleranceMm: double('chord_tolerance_mm').notNull(),
    toolChangeS: double('tool_change_s').notNull(),
    spindleSpinUpS: double('spindle_spin_up_s').notNull(),
    timeFactor: double('time_factor').notNull().default(1),
    hourlyRateMinor: int('hourly_rate_minor').notNull().default(0),
    defaultHoldDown: mysqlEnum('default_hold_down', HOLD_DOWNS).notNull().default('vacuum'),
    /** the level (kPa below atmosphere) this machine's vacuum table holds; prefills a vacuum job's level; null: not known */
    defaultVacuumKpa: double('default_vacuum_kpa'),
    /** set instead of deleting a machine that estimates or jobs refer to */
    archivedAt: timestamp('archived_at'),
    createdAt: created(),
    updatedAt: updated(),
  },
  // names are unique per shop: lists and pickers show them, and the seed upserts by them
  (t) => [uniqueIndex('machines_shop_name_unique').on(t.shopId, t.name)],
);

export const machineVersions = mysqlTable(
  'machine_versions',
  {
    id: int('id').autoincrement().primaryKey(),
    shopId: int('shop_id').notNull().references(() => shops.id),
    machineId: int('machine_id').notNull().references(() => machines.id),
    version: int('version').notNull(),
    /** the profile as the estimator reads it (lib/validation/machine-profile.ts), tools included */
    profile: jsonDoc<MachineProfile>('profile').notNull(),
    createdAt: created(),
  },
  (t) => [uniqueIndex('machine_versions_unique').on(t.machineId, t.version)],
);

export const tools = mysqlTable(
  'tools',
  {
    id: int('id').autoincrement().primaryKey(),
    shopId: int('shop_id').notNull().references(() => shops.id),
    machineId: int('machine_id').notNull().references(() => machines.id),
    number: int('number').notNull(),
    diameterMm: double('diameter_mm').notNull(),
    flutes: int('flutes').notNull(),
    kind: mysqlEnum('kind', TOOL_KINDS).notNull(),
    description: varchar('description', { length: 160 }).notNull().default(''),
  },
  (t) => [uniqueIndex('tools_machine_number_unique').on(t.machineId, t.number)],
);

export const materials = mysqlTable(
  'materials',
  {
    id: int('id').autoincrement().primaryKey(),
    shopId: int('shop_id').notNull().references(() => shops.id),
    name: varchar('name', { length: 120 }).notNull(),
    thicknessMm: double('thickness_mm').notNull(),
    sheetWidthMm: double('sheet_width_mm').notNull(),
    sheetLengthMm: double('sheet_length_mm').notNull(),
    costPerSheetMinor: int('cost_per_sheet_minor').notNull(),
  },
  // names are unique per shop: lists and pickers show them, and the seed upserts by them
  (t) => [uniqueIndex('materials_shop_name_unique').on(t.shopId, t.name)],
);

export const customers = mysqlTable(
  'customers',
  {
    id: int('id').autoincrement().primaryKey(),
    shopId: int('shop_id').notNull().references(() => shops.id),
    name: varchar('name', { length: 160 }).notNull(),
    email: varchar('email', { length: 190 }).notNull(),
    phone: varchar('phone', { length: 40 }).notNull().default(''),
    notes: text('notes'),
    createdAt: created(),
  },
  (t) => [index('customers_shop_idx').on(t.shopId)],
);

export const jobs = mysqlTable(
  'jobs',
  {
    id: int('id').autoincrement().primaryKey(),
    shopId: int('shop_id').notNull().references(() => shops.id),
    title: varchar('title', { length: 160 }).notNull(),
    customerId: int('customer_id').notNull().references(() => customers.id),
    materialId: int('material_id').references(() => materials.id),
    sheetWidthMm: double('sheet_width_mm').notNull(),
    sheetLengthMm: double('sheet_length_mm').notNull(),
    sheetThicknessMm: double('sheet_thickness_mm').notNull(),
    zZero: mysqlEnum('z_zero', Z_ZEROS).notNull().default('top'),
    holdDown: mysqlEnum('hold_down', HOLD_DOWNS).notNull(),
    /** only meaningful for vacuum hold-down */
    vacuumKpa: double('vacuum_kpa'),
    quantity: int('quantity').notNull(),
    status: mysqlEnum('status', JOB_STATUSES).notNull().default('draft'),
    /** the machine the job is planned on; estimates on upload are for this one */
    machineId: int('machine_id').references(() => machines.id),
    dueDate: date('due_date', { mode: 'string' }),
    notes: text('notes'),
    createdAt: created(),
    updatedAt: updated(),
  },
  (t) => [index('jobs_shop_idx').on(t.shopId), index('jobs_shop_updated_idx').on(t.shopId, t.updatedAt)],
);

/** One G-code program of a job, by the file name it was uploaded under; each upload of the same name is a new version. */
export const programs = mysqlTable(
  'programs',
  {
    id: int('id').autoincrement().primaryKey(),
    shopId: int('shop_id').notNull().references(() => shops.id),
    jobId: int('job_id').notNull().references(() => jobs.id),
    /** the uploaded file's name, for display only (object keys never contain it) */
    name: varchar('name', { length: 200 }).notNull(),
    latestVersion: int('latest_version').notNull().default(1),
    createdAt: created(),
    updatedAt: updated(),
  },
  (t) => [uniqueIndex('programs_job_name_unique').on(t.jobId, t.name), index('programs_shop_idx').on(t.shopId)],
);

/** The stored bytes of one version of a program: object key, SHA-256, size, line count. */
export const programVersions = mysqlTable(
  'program_versions',
  {
    id: int('id').autoincrement().primaryKey(),
    shopId: int('shop_id').notNull().references(() => shops.id),
    programId: int('program_id').notNull().references(() => programs.id),
    version: int('version').notNull(),
    objectKey: varchar('object_key', { length: 255 }).notNull(),
    sha256: char('sha256', { length: 64 }).notNull(),
    bytes: bigint('bytes', { mode: 'number' }).notNull(),
    lines: int('lines').notNull(),
    uploadedBy: int('uploaded_by').references(() => users.id),
    createdAt: created(),
  },
  (t) => [uniqueIndex('program_versions_unique').on(t.programId, t.version), index('program_versions_sha_idx').on(t.shopId, t.sha256)],
);

/**
 * One estimate: a program version run through the engine for one machine version and one
 * set of job settings. `inputKey` is the SHA-256 of everything that decides the result
 * (file hash, machine version's profile, sheet, Z zero, hold-down, vacuum, engine version),
 * so the same inputs find the same row. The queue is these rows: pending ones are claimed
 * with SELECT … FOR UPDATE SKIP LOCKED and held by a lease. The report (the CLI's --json)
 * is stored as an object (reportKey), the figures lists need are columns.
 */
export const estimates = mysqlTable(
  'estimates',
  {
    id: int('id').autoincrement().primaryKey(),
    shopId: int('shop_id').notNull().references(() => shops.id),
    programId: int('program_id').notNull().references(() => programs.id),
    programVersionId: int('program_version_id').notNull().references(() => programVersions.id),
    programVersion: int('program_version').notNull(),
    machineId: int('machine_id').notNull().references(() => machines.id),
    machineVersion: int('machine_version').notNull(),
    engineVersion: varchar('engine_version', { length: 20 }).notNull(),
    inputKey: char('input_key', { length: 64 }).notNull(),
    /** the job settings the estimate was made with (frozen copy) */
    settings: jsonDoc<EstimateSettingsDoc>('settings').notNull(),
    status: mysqlEnum('status', ESTIMATE_STATUSES).notNull().default('pending'),
    /** share of the work done, 0–1, while running */
    progress: double('progress').notNull().default(0),
    error: text('error'),
    computeMs: int('compute_ms'),
    totalSeconds: double('total_seconds'),
    calibratedSeconds: double('calibrated_seconds'),
    errorCount: int('error_count'),
    warningCount: int('warning_count'),
    infoCount: int('info_count'),
    partCount: int('part_count'),
    reportKey: varchar('report_key', { length: 255 }),
    /** the per-hold-down-method analysis (hold-down comparison), stored as an object beside the report */
    holdMethodsKey: varchar('hold_methods_key', { length: 255 }),
    attempts: int('attempts').notNull().default(0),
    leaseOwner: varchar('lease_owner', { length: 80 }),
    leaseUntil: timestamp('lease_until', { fsp: 3 }),
    requestedBy: int('requested_by').references(() => users.id),
    createdAt: created(),
    updatedAt: updated(),
    finishedAt: timestamp('finished_at'),
  },
  (t) => [
    uniqueIndex('estimates_input_unique').on(t.shopId, t.inputKey),
    index('estimates_queue_idx').on(t.status, t.id),
    index('estimates_program_idx').on(t.programId, t.programVersion),
  ],
);

/** What happened to a job, for its history: created, edited, status changed, program uploaded, estimate done. */
export const jobEvents = mysqlTable(
  'job_events',
  {
    id: int('id').autoincrement().primaryKey(),
    shopId: int('shop_id').notNull().references(() => shops.id),
    jobId: int('job_id').notNull().references(() => jobs.id),
    userId: int('user_id').references(() => users.id),
    kind: varchar('kind', { length: 40 }).notNull(),
    detail: varchar('detail', { length: 500 }).notNull().default(''),
    createdAt: timestamp('created_at', { fsp: 3 }).notNull().defaultNow(),
  },
  (t) => [index('job_events_job_idx').on(t.jobId, t.id)],
);

/**
 * One signed-in session (the token's id). The session token itself stays a signed JWT;
 * this row lets the server end it (sign-out, disable, role or password change) and
 * holds the idle and absolute limits, so they hold across server processes.
 */
export const userSessions = mysqlTable(
  'user_sessions',
  {
    /** random 128-bit id, hex, carried in the token */
    id: char('id', { length: 32 }).primaryKey(),
    // Sessions go with their user (a test or an admin tool that deletes a user).
    shopId: int('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    userId: int('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
    createdAt: timestamp('created_at').notNull().defaultNow(),
    lastSeenAt: timestamp('last_seen_at').notNull().defaultNow(),
    endedAt: timestamp('ended_at'),
  },
  (t) => [index('user_sessions_user_idx').on(t.userId), index('user_sessions_seen_idx').on(t.lastSeenAt)],
);

/**
 * Failed-sign-in counters, per e-mail and per client address, shared by every server
 * process. The key is a sha256 (hex) of the kind and the value, so neither e-mails
 * nor addresses are kept in clear and every key has the same size.
 */
export const signInLimits = mysqlTable(
  'sign_in_limits',
  {
    keyHash: char('key_hash', { length: 64 }).primaryKey(),
    kind: mysqlEnum('kind', ['email', 'ip']).notNull(),
    /** attempts counted in the current window, including those still being checked */
    attempts: int('attempts').notNull(),
    /** when the window ends and the count starts again */
    expiresAt: timestamp('expires_at', { fsp: 3 }).notNull(),
  },
  (t) => [index('sign_in_limits_expires_idx').on(t.expiresAt)],
);

/**
 * A shop's settings for prices, hold-down labour, consumables and calibration: one row per
 * shop, made with the defaults below when first read. Money in integer minor units of the
 * shop's currency, shares in basis points (1 % = 100 bp), times in seconds.
 * The labour and consumable defaults are common practice figures from memory, to be set
 * by each shop (docs/references.md says so beside each).
 */
export const shopSettings = mysqlTable('shop_settings', {
  shopId: int('shop_id').primaryKey().references(() => shops.id),
  /** printed on quotes: the shop's postal address, several lines */
  address: varchar('address', { length: 500 }).notNull().default(''),
  quoteTerms: varchar('quote_terms', { length: 2000 }).notNull().default(''),
  quoteValidityDays: int('quote_validity_days').notNull().default(30),
  /** per job: loading the program, zeroing, first-sheet checks */
  setupS: double('setup_s').notNull().default(900),
  /** per sheet: putting the sheet on the table and taking the cut parts off */
  loadUnloadSPerSheet: double('load_unload_s_per_sheet').notNull().default(240),
  wasteAllowanceBp: int('waste_allowance_bp').notNull().default(1000),
  marginBp: int('margin_bp').notNull().default(2500),
  taxBp: int('tax_bp').notNull().default(0),
  /** the total before tax is rounded to a multiple of this many minor units (1: no rounding) */
  roundToMinor: int('round_to_minor').notNull().default(100),
  roundingMode: mysqlEnum('rounding_mode', ['nearest', 'up']).notNull().default('nearest'),
  /** hand work after cutting, paid at this rate */
  labourRateMinorPerHour: int('labour_rate_minor_per_hour').notNull().default(4000),
  /** tape and glue: taping, gluing, peeling the tape off and cleaning glue off each part */
  tapeGlueSPerPart: double('tape_glue_s_per_part').notNull().default(40),
  /** tabs: cutting one tab free and sanding its stub flush */
  tabSPerTab: double('tab_s_per_tab').notNull().default(12),
  /** onion skin: breaking a part out of the skin and cleaning its bottom edge */
  skinSPerPart: double('skin_s_per_part').notNull().default(20),
  /** screws or clamps: fixing and freeing one sheet */
  clampsSPerSheet: double('clamps_s_per_sheet').notNull().default(120),
  /** double-sided or masking tape, by the area of the parts it holds */
  tapeCostMinorPerM2: int('tape_cost_minor_per_m2').notNull().default(300),
  glueCostMinorPerPart: int('glue_cost_minor_per_part').notNull().default(5),
  /** calibration: how many of a machine's latest uninterrupted runs the suggestion uses */
  calibrationRuns: int('calibration_runs').notNull().default(20),
  /** and how many it needs before it suggests anything */
  calibrationMinRuns: int('calibration_min_runs').notNull().default(5),
  updatedAt: updated(),
});

/** The next quote number per shop and year; read and bumped under a row lock (SELECT … FOR UPDATE). */
export const quoteCounters = mysqlTable(
  'quote_counters',
  {
    shopId: int('shop_id').notNull().references(() => shops.id),
    year: int('year').notNull(),
    next: int('next').notNull().default(1),
  },
  (t) => [primaryKey({ columns: [t.shopId, t.year] })],
);

/**
 * A quote for a job, made from one stored estimate. `inputs` and `figures` are frozen
 * copies (what was typed, and the estimate and profile figures used), `lines` the computed
 * build-up; a later profile change or calibration never moves a sent price. A revision is
 * a new quote whose revisionOf names the old one. The customer's link carries a random
 * token; only its SHA-256 is stored.
 */
export const quotes = mysqlTable(
  'quotes',
  {
    id: int('id').autoincrement().primaryKey(),
    shopId: int('shop_id').notNull().references(() => shops.id),
    jobId: int('job_id').notNull().references(() => jobs.id),
    estimateId: int('estimate_id').notNull().references(() => estimates.id),
    number: varchar('number', { length: 20 }).notNull(),
    revisionOf: int('revision_of'),
    status: mysqlEnum('status', QUOTE_STATUSES).notNull().default('draft'),
    currency: char('currency', { length: 3 }).notNull(),
    totalMinor: bigint('total_minor', { mode: 'number' }).notNull(),
    inputs: jsonDoc<Record<string, unknown>>('inputs').notNull(),
    figures: jsonDoc<Record<string, unknown>>('figures').notNull(),
    lines: jsonDoc<unknown[]>('lines').notNull(),
    validityDays: int('validity_days').notNull(),
    validUntil: date('valid_until', { mode: 'string' }),
    tokenHash: char('token_hash', { length: 64 }),
    tokenUsedAt: timestamp('token_used_at'),
    tokenRevokedAt: timestamp('token_revoked_at'),
    sentAt: timestamp('sent_at'),
    answeredAt: timestamp('answered_at'),
    answerName: varchar('answer_name', { length: 160 }),
    answerPo: varchar('answer_po', { length: 80 }),
    declineReason: varchar('decline_reason', { length: 1000 }),
    createdBy: int('created_by').references(() => users.id),
    createdAt: created(),
    updatedAt: updated(),
  },
  (t) => [
    uniqueIndex('quotes_shop_number_unique').on(t.shopId, t.number),
    uniqueIndex('quotes_token_unique').on(t.tokenHash),
    index('quotes_job_idx').on(t.jobId, t.id),
  ],
);

/** Every message Kerfcast hands to the SMTP server, with what became of it. */
export const mailLog = mysqlTable(
  'mail_log',
  {
    id: int('id').autoincrement().primaryKey(),
    shopId: int('shop_id').notNull().references(() => shops.id),
    quoteId: int('quote_id').references(() => quotes.id),
    toAddress: varchar('to_address', { length: 190 }).notNull(),
    subject: varchar('subject', { length: 300 }).notNull(),
    status: mysqlEnum('status', MAIL_STATUSES).notNull().default('sending'),
    /** the SMTP server's message id once it accepted the message */
    messageId: varchar('message_id', { length: 255 }),
    error: varchar('error', { length: 1000 }),
    sentBy: int('sent_by').references(() => users.id),
    createdAt: timestamp('created_at', { fsp: 3 }).notNull().defaultNow(),
    updatedAt: updated(),
  },
  (t) => [index('mail_log_shop_idx').on(t.shopId, t.id), index('mail_log_quote_idx').on(t.quoteId)],
);

/**
 * One run of a program version on a machine, timed on the server. The timer is the list
 * of run_events (start, pause, resume, finish); actualSeconds is the running time between
 * them, written at finish (or typed for a run entered afterwards). activeMachineId is the
 * machine while the run is running or paused and NULL otherwise: its unique index lets
 * only one open run per machine exist.
 */
export const runs = mysqlTable(
  'runs',
  {
    id: int('id').autoincrement().primaryKey(),
    shopId: int('shop_id').notNull().references(() => shops.id),
    jobId: int('job_id').notNull().references(() => jobs.id),
    programId: int('program_id').notNull().references(() => programs.id),
    programVersion: int('program_version').notNull(),
    machineId: int('machine_id').notNull().references(() => machines.id),
    machineVersion: int('machine_version').notNull(),
    /** the stored estimate the run is measured against (null when none was done) */
    estimateId: int('estimate_id').references(() => estimates.id),
    operatorId: int('operator_id').notNull().references(() => users.id),
    status: mysqlEnum('status', RUN_STATUSES).notNull().default('running'),
    activeMachineId: int('active_machine_id').generatedAlwaysAs(sql`(case when \`status\` in ('running','paused') then \`machine_id\` end)`, {
      mode: 'stored',
    }),
    startedAt: timestamp('started_at', { fsp: 3 }).notNull(),
    finishedAt: timestamp('finished_at', { fsp: 3 }),
    actualSeconds: double('actual_seconds'),
    sheetsCut: int('sheets_cut'),
    interrupted: boolean('interrupted').notNull().default(false),
    notes: varchar('notes', { length: 2000 }),
    /** entered afterwards by hand instead of timed */
    manual: boolean('manual').notNull().default(false),
    voidedAt: timestamp('voided_at'),
    voidedBy: int('voided_by').references(() => users.id),
    voidReason: varchar('void_reason', { length: 500 }),
    createdAt: created(),
    updatedAt: updated(),
  },
  (t) => [
    uniqueIndex('runs_active_machine_unique').on(t.activeMachineId),
    index('runs_shop_machine_idx').on(t.shopId, t.machineId, t.finishedAt),
    index('runs_program_idx').on(t.programId, t.programVersion),
  ],
);

/** The server's timestamps of a run's timer. */
export const runEvents = mysqlTable(
  'run_events',
  {
    id: int('id').autoincrement().primaryKey(),
    shopId: int('shop_id').notNull().references(() => shops.id),
    runId: int('run_id').notNull().references(() => runs.id),
    kind: mysqlEnum('kind', RUN_EVENT_KINDS).notNull(),
    at: timestamp('at', { fsp: 3 }).notNull(),
    userId: int('user_id').references(() => users.id),
  },
  (t) => [index('run_events_run_idx').on(t.runId, t.at)],
);

/** The audit trail of corrections to runs: who changed which field from what to what, and why. */
export const runChanges = mysqlTable(
  'run_changes',
  {
    id: int('id').autoincrement().primaryKey(),
    shopId: int('shop_id').notNull().references(() => shops.id),
    runId: int('run_id').notNull().references(() => runs.id),
    userId: int('user_id').notNull().references(() => users.id),
    field: varchar('field', { length: 40 }).notNull(),
    before: varchar('before', { length: 2000 }),
    after: varchar('after', { length: 2000 }),
    reason: varchar('reason', { length: 500 }).notNull().default(''),
    createdAt: timestamp('created_at', { fsp: 3 }).notNull().defaultNow(),
  },
  (t) => [index('run_changes_run_idx').on(t.runId, t.id)],
);

export type Shop = typeof shops.$inferSelect;
export type User = typeof users.$inferSelect;
export type Machine = typeof machines.$inferSelect;
export type MachineVersion = typeof machineVersions.$inferSelect;
export type Tool = typeof tools.$inferSelect;
export type Material = typeof materials.$inferSelect;
export type Customer = typeof customers.$inferSelect;
export type Job = typeof jobs.$inferSelect;
export type Program = typeof programs.$inferSelect;
export type ProgramVersion = typeof programVersions.$inferSelect;
export type EstimateRow = typeof estimates.$inferSelect;
export type JobEvent = typeof jobEvents.$inferSelect;
export type ShopSettings = typeof shopSettings.$inferSelect;
export type QuoteRow = typeof quotes.$inferSelect;
export type MailLogRow = typeof mailLog.$inferSelect;
export type RunRow = typeof runs.$inferSelect;
export type RunEvent = typeof runEvents.$inferSelect;
export type RunChange = typeof runChanges.$inferSelect;
export type Role = (typeof ROLES)[number];
