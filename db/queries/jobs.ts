import 'server-only';
// Jobs of a shop: the list with its filters, sort and page (done in SQL, so a shop with a
// thousand jobs sends one page of them), one job with its customer's, material's and
// machine's names, create, edit and status steps, each written together with its
// job_events row in one transaction, and the history. Every function takes the shop id;
// the joins repeat the shop filter so that a row of another shop can never leak in
// through a foreign key.
import { and, asc, count, desc, eq, isNotNull, isNull, like, or, sql, type SQL } from 'drizzle-orm';
import { db } from '@/db/client';
import { customers, jobEvents, jobs, machines, materials, programs, users, type Job } from '@/db/schema';
import { AppError } from '@/lib/errors';
import { checkStatusMove, isEditable } from '@/lib/jobs/status-moves';
import type { JobStatus, Role } from '@/lib/validation/enums';
import { sortDirection, type JobCreateInput, type JobListQuery, type JobUpdateInput } from '@/lib/validation/jobs';

export type JobRow = Job & { customerName: string; materialName: string | null; machineName: string | null };

const listColumns = {
  job: jobs,
  customerName: customers.name,
  materialName: materials.name,
  machineName: machines.name,
};

function baseQuery(shopId: number) {
  return db
    .select(listColumns)
    .from(jobs)
    .innerJoin(customers, and(eq(customers.id, jobs.customerId), eq(customers.shopId, shopId)))
    .leftJoin(materials, and(eq(materials.id, jobs.materialId), eq(materials.shopId, shopId)))
    .leftJoin(machines, and(eq(machines.id, jobs.machineId), eq(machines.shopId, shopId)));
}

const flatten = (r: { job: Job; customerName: string; materialName: string | null; machineName: string | null }): JobRow => ({
  ...r.job,
  customerName: r.customerName,
  materialName: r.materialName,
  machineName: r.machineName,
});

/** A LIKE pattern that finds the text anywhere, with the user's own % and _ taken literally. */
function containsPattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

function listConditions(shopId: number, query: JobListQuery): SQL {
  const conditions: SQL[] = [eq(jobs.shopId, shopId)];
  if (query.status) conditions.push(eq(jobs.status, query.status));
  if (query.customerId) conditions.push(eq(jobs.customerId, query.customerId));
  if (query.machineId) conditions.push(eq(jobs.machineId, query.machineId));
  if (query.q) {
    const pattern = containsPattern(query.q);
    conditions.push(or(like(jobs.title, pattern), like(customers.name, pattern), like(jobs.notes, pattern)) as SQL);
  }
  return and(...conditions) as SQL;
}

const SORT_COLUMNS = {
  updated: jobs.updatedAt,
  created: jobs.createdAt,
  title: jobs.title,
  customer: customers.name,
  machine: machines.name,
  due: jobs.dueDate,
  status: jobs.status,
  quantity: jobs.quantity,
} as const;

export interface JobPage {
  jobs: JobRow[];
  total: number;
  page: number;
  perPage: number;
  pageCount: number;
}

export async function listJobs(shopId: number, query: JobListQuery): Promise<JobPage> {
  const where = listConditions(shopId, query);
  const column = SORT_COLUMNS[query.sort];
  const direction = sortDirection(query);
  const order = direction === 'asc' ? asc : desc;
  // jobs without a due date or machine go last whichever way the list runs; the id keeps
  // equal rows in a fixed order, so paging never shows a job twice
  const nullsLast = query.sort === 'due' || query.sort === 'machine' ? [sql`${column} is null`] : [];
  const [rows, [{ total }]] = await Promise.all([
    baseQuery(shopId)
      .where(where)
      .orderBy(...nullsLast, order(column), order(jobs.id))
      .limit(query.perPage)
      .offset((query.page - 1) * query.perPage),
    db
      .select({ total: count() })
      .from(jobs)
      .innerJoin(customers, and(eq(customers.id, jobs.customerId), eq(customers.shopId, shopId)))
      .where(where),
  ]);
  const totalJobs = Number(total);
  return {
    jobs: rows.map(flatten),
    total: totalJobs,
    page: query.page,
    perPage: query.perPage,
    pageCount: Math.max(1, Math.ceil(totalJobs / query.perPage)),
  };
}

export async function getJob(shopId: number, jobId: number): Promise<JobRow | null> {
  const rows = await baseQuery(shopId).where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId))).limit(1);
  return rows[0] ? flatten(rows[0]) : null;
}

export interface JobFormOptions {
  customers: { id: number; name: string }[];
  /** machines a job can be planned on: the unarchived ones, the first one first (the default) */
  machines: { id: number; name: string; defaultHoldDown: Job['holdDown']; defaultVacuumKpa: number | null; lastVacuumKpa: number | null; archived: boolean }[];
  materials: { id: number; name: string; thicknessMm: number; sheetWidthMm: number; sheetLengthMm: number }[];
}

/**
 * What the create and edit forms offer. A vacuum job's level is prefilled from the machine's
 * own vacuum level; where the machine has none, from the level last used on its vacuum jobs
 * (what the shop's pump and table reached there).
 */
export async function jobFormOptions(shopId: number, keepMachineId?: number | null): Promise<JobFormOptions> {
  const [customerRows, machineRows, materialRows, vacuumRows] = await Promise.all([
    db.select({ id: customers.id, name: customers.name }).from(customers).where(eq(customers.shopId, shopId)).orderBy(asc(customers.name)),
    db
      .select({ id: machines.id, name: machines.name, defaultHoldDown: machines.defaultHoldDown, defaultVacuumKpa: machines.defaultVacuumKpa, archivedAt: machines.archivedAt })
      .from(machines)
      .where(eq(machines.shopId, shopId))
      .orderBy(asc(machines.id)),
    db
      .select({ id: materials.id, name: materials.name, thicknessMm: materials.thicknessMm, sheetWidthMm: materials.sheetWidthMm, sheetLengthMm: materials.sheetLengthMm })
      .from(materials)
      .where(eq(materials.shopId, shopId))
      .orderBy(asc(materials.name)),
    db
      .select({ machineId: jobs.machineId, vacuumKpa: jobs.vacuumKpa })
      .from(jobs)
      .where(and(eq(jobs.shopId, shopId), eq(jobs.holdDown, 'vacuum'), isNotNull(jobs.vacuumKpa), isNotNull(jobs.machineId)))
      .orderBy(desc(jobs.updatedAt), desc(jobs.id))
      .limit(200),
  ]);
  const lastVacuum = new Map<number, number>();
  for (const r of vacuumRows) if (r.machineId !== null && r.vacuumKpa !== null && !lastVacuum.has(r.machineId)) lastVacuum.set(r.machineId, r.vacuumKpa);
  return {
    customers: customerRows,
    // an archived machine is offered only to the job already planned on it
    machines: machineRows
      .filter((m) => m.archivedAt === null || m.id === keepMachineId)
      .map((m) => ({ id: m.id, name: m.name, defaultHoldDown: m.defaultHoldDown, defaultVacuumKpa: m.defaultVacuumKpa, lastVacuumKpa: lastVacuum.get(m.id) ?? null, archived: m.archivedAt !== null })),
    materials: materialRows,
  };
}

/** The choices of the list's filters: every customer and every machine, archived ones too (their jobs stay listed). */
export async function listFilterChoices(shopId: number): Promise<{ customers: { id: number; name: string }[]; machines: { id: number; name: string }[] }> {
  const [customerRows, machineRows] = await Promise.all([
    db.select({ id: customers.id, name: customers.name }).from(customers).where(eq(customers.shopId, shopId)).orderBy(asc(customers.name)),
    db.select({ id: machines.id, name: machines.name }).from(machines).where(eq(machines.shopId, shopId)).orderBy(asc(machines.name)),
  ]);
  return { customers: customerRows, machines: machineRows };
}

/** The shop's first machine that is not archived: where a new job goes unless the form says otherwise. */
export async function defaultMachineId(shopId: number): Promise<number | null> {
  const rows = await db
    .select({ id: machines.id })
    .from(machines)
    .where(and(eq(machines.shopId, shopId), isNull(machines.archivedAt)))
    .orderBy(asc(machines.id))
    .limit(1);
  return rows[0]?.id ?? null;
}

/** Checks that the customer, material and machine named are the shop's own; an archived machine only if the job already had it. */
async function checkReferences(shopId: number, input: JobCreateInput, keepMachineId: number | null): Promise<void> {
  const fields: Record<string, string[]> = {};
  const [customer, material, machine] = await Promise.all([
    db.select({ id: customers.id }).from(customers).where(and(eq(customers.shopId, shopId), eq(customers.id, input.customerId))).limit(1),
    input.materialId === undefined
      ? Promise.resolve([{ id: 0 }])
      : db.select({ id: materials.id }).from(materials).where(and(eq(materials.shopId, shopId), eq(materials.id, input.materialId))).limit(1),
    input.machineId === undefined
      ? Promise.resolve([{ id: 0, archivedAt: null }])
      : db.select({ id: machines.id, archivedAt: machines.archivedAt }).from(machines).where(and(eq(machines.shopId, shopId), eq(machines.id, input.machineId))).limit(1),
  ]);
  if (customer.length === 0) fields.customerId = ['Choose a customer of your shop.'];
  if (material.length === 0) fields.materialId = ['Choose a material of your shop.'];
  if (machine.length === 0) fields.machineId = ['Choose a machine of your shop.'];
  else if (machine[0].archivedAt !== null && input.machineId !== keepMachineId) fields.machineId = ['This machine is archived: choose one in use.'];
  if (Object.keys(fields).length > 0) throw new AppError('invalid:job', 'Some job fields are not right.', fields);
}

function columnsFromInput(input: JobCreateInput) {
  return {
    title: input.title,
    customerId: input.customerId,
    materialId: input.materialId ?? null,
    sheetWidthMm: input.sheetWidthMm,
    sheetLengthMm: input.sheetLengthMm,
    sheetThicknessMm: input.sheetThicknessMm,
    zZero: input.zZero,
    holdDown: input.holdDown,
    vacuumKpa: input.holdDown === 'vacuum' ? (input.vacuumKpa ?? null) : null,
    quantity: input.quantity,
    dueDate: input.dueDate ?? null,
    notes: input.notes ?? null,
  };
}

export async function createJob(shopId: number, userId: number, input: JobCreateInput): Promise<JobRow> {
  await checkReferences(shopId, input, null);
  const machineId = input.machineId ?? (await defaultMachineId(shopId));
  const id = await db.transaction(async (tx) => {
    const [{ id: jobId }] = await tx
      .insert(jobs)
      .values({ shopId, ...columnsFromInput(input), machineId })
      .$returningId();
    await tx.insert(jobEvents).values({ shopId, jobId, userId, kind: 'created', detail: '' });
    return jobId;
  });
  const created = await getJob(shopId, id);
  if (!created) throw new AppError('internal', 'The job was not saved.');
  return created;
}

// The names of the fields as the history lists them after "Changed:".
const FIELD_WORDS: Record<string, string> = {
  title: 'title',
  customerId: 'customer',
  machineId: 'machine',
  materialId: 'material',
  sheetWidthMm: 'sheet size',
  sheetLengthMm: 'sheet size',
  sheetThicknessMm: 'sheet thickness',
  zZero: 'Z zero',
  holdDown: 'hold-down',
  vacuumKpa: 'vacuum level',
  quantity: 'quantity',
  dueDate: 'due date',
  notes: 'notes',
};

export async function updateJob(shopId: number, userId: number, jobId: number, input: JobUpdateInput): Promise<JobRow> {
  const existing = await getJob(shopId, jobId);
  if (!existing) throw new AppError('not-found:job', 'No such job.');
  if (!isEditable(existing.status)) {
    throw new AppError('conflict:job-status', `This job is ${existing.status}: its record is kept as it was and cannot be edited.`);
  }
  await checkReferences(shopId, input, existing.machineId);
  const next = { ...columnsFromInput(input), machineId: input.machineId ?? existing.machineId };
  const changed = (Object.keys(next) as (keyof typeof next)[]).filter((key) => existing[key] !== next[key]);
  if (changed.length === 0) return existing;
  // in the form's order, as the history reads them
  const order = Object.keys(FIELD_WORDS);
  changed.sort((a, b) => order.indexOf(a) - order.indexOf(b));
  const words = [...new Set(changed.map((key) => FIELD_WORDS[key] ?? key))];
  await db.transaction(async (tx) => {
    await tx.update(jobs).set(next).where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId)));
    await tx.insert(jobEvents).values({ shopId, jobId, userId, kind: 'edited', detail: words.join(', ').slice(0, 500) });
  });
  const updated = await getJob(shopId, jobId);
  if (!updated) throw new AppError('not-found:job', 'No such job.');
  return updated;
}

export async function programCount(shopId: number, jobId: number): Promise<number> {
  const [{ n }] = await db.select({ n: count() }).from(programs).where(and(eq(programs.shopId, shopId), eq(programs.jobId, jobId)));
  return Number(n);
}

/**
 * One status step, checked against lib/jobs/status-moves.ts and written with its history row.
 * The UPDATE repeats the status the check saw, so two people pressing at once cannot both
 * take a step from the same status.
 */
export async function moveJobStatus(shopId: number, user: { id: number; role: Role }, jobId: number, to: JobStatus): Promise<JobRow> {
  const existing = await getJob(shopId, jobId);
  if (!existing) throw new AppError('not-found:job', 'No such job.');
  const check = checkStatusMove(user.role, existing.status, to, { programCount: await programCount(shopId, jobId) });
  if (!check.ok) throw new AppError(check.reason === 'forbidden' ? 'forbidden:job' : 'conflict:job-status', check.message);
  await db.transaction(async (tx) => {
    const [result] = await tx
      .update(jobs)
      .set({ status: to })
      .where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId), eq(jobs.status, existing.status)));
    if (result.affectedRows !== 1) throw new AppError('conflict:job-status', 'Someone changed this job meanwhile. Reload the page and try again.');
    await tx.insert(jobEvents).values({ shopId, jobId, userId: user.id, kind: 'status', detail: `${existing.status}>${to}` });
  });
  return { ...existing, status: to };
}

export interface JobEventRow {
  id: number;
  kind: string;
  detail: string;
  createdAt: Date;
  userName: string | null;
}

/** The job's history, newest first. */
export async function listJobEvents(shopId: number, jobId: number, limit = 200): Promise<JobEventRow[]> {
  return db
    .select({ id: jobEvents.id, kind: jobEvents.kind, detail: jobEvents.detail, createdAt: jobEvents.createdAt, userName: users.name })
    .from(jobEvents)
    .leftJoin(users, and(eq(users.id, jobEvents.userId), eq(users.shopId, shopId)))
    .where(and(eq(jobEvents.shopId, shopId), eq(jobEvents.jobId, jobId)))
    .orderBy(desc(jobEvents.id))
    .limit(limit);
}
