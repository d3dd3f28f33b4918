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
} from 'drizzle-orm/mysql-core';
import { ESTIMATE_STATUSES, HOLD_DOWNS, JOB_STATUSES, ROLES, TOOL_KINDS, Z_ZEROS } from '@/lib/validation/enums';
import type { MachineProfile } from '@/lib/validation/machine-profile';

// The enumerations have one source, lib/validation/enums.ts (client bundles read it without
// Drizzle); they are re-exported here for the queries.
export { ESTIMATE_STATUSES, HOLD_DOWNS, JOB_STATUSES, ROLES, TOOL_KINDS, Z_ZEROS };

/** The job settings an estimate was made with, frozen beside it. */
export interface EstimateSettingsDoc {
  sheet: { widthMm: number; lengthMm: number; thicknessMm: number } | null;
  zero: (typeof Z_ZEROS)[number];
  hold: (typeof HOLD_DOWNS)[number] | null;
  vacuumKpa: number | null;
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
export type Role = (typeof ROLES)[number];
