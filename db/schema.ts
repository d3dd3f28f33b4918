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
} from 'drizzle-orm/mysql-core';

export const ROLES = ['admin', 'programmer', 'estimator', 'operator'] as const;
export const TOOL_KINDS = ['upcut', 'downcut', 'compression', 'straight', 'v', 'ball'] as const;
export const HOLD_DOWNS = ['vacuum', 'tape-glue', 'clamps', 'tabs', 'skin'] as const;
export const Z_ZEROS = ['top', 'table'] as const;
export const JOB_STATUSES = ['draft', 'programmed', 'quoted', 'accepted', 'running', 'done', 'cancelled'] as const;

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
    createdAt: created(),
    updatedAt: updated(),
  },
  (t) => [uniqueIndex('users_email_unique').on(t.email), index('users_shop_idx').on(t.shopId)],
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
    /** the profile as the estimator reads it (lib/kinematics profile JSON) */
    profile: jsonDoc<Record<string, unknown>>('profile').notNull(),
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
    createdAt: created(),
    updatedAt: updated(),
  },
  (t) => [index('jobs_shop_idx').on(t.shopId)],
);

export type Shop = typeof shops.$inferSelect;
export type User = typeof users.$inferSelect;
export type Machine = typeof machines.$inferSelect;
export type Tool = typeof tools.$inferSelect;
export type Material = typeof materials.$inferSelect;
export type Customer = typeof customers.$inferSelect;
export type Job = typeof jobs.$inferSelect;
export type Role = (typeof ROLES)[number];
