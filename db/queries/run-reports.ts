import 'server-only';
// Read queries of the reports (issue 15): the estimated-vs-actual runs report (/runs: one page of
// the table, every matching run for the charts and the figures), the CSV exports (runs and
// estimates, read in batches by id so an export of any size is streamed and never held whole)
// and the dashboard's panels. Read only; every query takes the shop id and filters by it.
// The estimate a run is measured against is its stored estimate's machine time before any time
// factor, times the sheets cut (lib/runs/run-estimate.ts), the figure the calibration uses.
import { and, asc, desc, eq, gte, inArray, isNotNull, lte, ne, notInArray, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import { db } from '@/db/client';
import { estimates, jobs, machines, programs, runs, users } from '@/db/schema';
import type { EstimateExportRow, RunExportRow } from '@/lib/reports/csv';
import type { WeekProgram } from '@/lib/reports/dashboard-figures';
import type { ReportRun } from '@/lib/reports/run-stats';
import { runEstimateSeconds } from '@/lib/runs/run-estimate';
import type { JobStatus } from '@/lib/validation/enums';
import type { RunListQuery } from '@/lib/validation/runs';

/** The report's filters: the runs list's, without the page. */
export type RunReportFilters = Omit<RunListQuery, 'page' | 'perPage'>;

/** A run as the report's table, charts and export read it. */
export interface RunReportRow extends ReportRun, RunExportRow {
  machineId: number;
  operatorId: number;
  programId: number;
}

const operator = alias(users, 'report_operator');

function whereOf(shopId: number, f: RunReportFilters): SQL[] {
  const where: SQL[] = [eq(runs.shopId, shopId)];
  if (f.machineId !== undefined) where.push(eq(runs.machineId, f.machineId));
  if (f.operatorId !== undefined) where.push(eq(runs.operatorId, f.operatorId));
  if (f.jobId !== undefined) where.push(eq(runs.jobId, f.jobId));
  if (f.programId !== undefined) where.push(eq(runs.programId, f.programId));
  if (f.version !== undefined) where.push(eq(runs.programVersion, f.version));
  if (f.status !== undefined) where.push(eq(runs.status, f.status));
  if (f.from !== undefined) where.push(sql`${runs.startedAt} >= ${`${f.from} 00:00:00`}`);
  if (f.to !== undefined) where.push(sql`${runs.startedAt} < ${`${f.to} 00:00:00`} + interval 1 day`);
  return where;
}

function select() {
  return db
    .select({
      id: runs.id,
      jobId: runs.jobId,
      jobTitle: jobs.title,
      programId: runs.programId,
      programName: programs.name,
      programVersion: runs.programVersion,
      machineId: runs.machineId,
      machineName: machines.name,
      machineVersion: runs.machineVersion,
      operatorId: runs.operatorId,
      operatorName: operator.name,
      status: runs.status,
      startedAt: runs.startedAt,
      finishedAt: runs.finishedAt,
      sheetsCut: runs.sheetsCut,
      estimateSecondsPerSheet: estimates.totalSeconds,
      actualSeconds: runs.actualSeconds,
      interrupted: runs.interrupted,
      voidedAt: runs.voidedAt,
      manual: runs.manual,
      notes: runs.notes,
      voidReason: runs.voidReason,
    })
    .from(runs)
    .innerJoin(jobs, and(eq(jobs.id, runs.jobId), eq(jobs.shopId, runs.shopId)))
    .innerJoin(programs, and(eq(programs.id, runs.programId), eq(programs.shopId, runs.shopId)))
    .innerJoin(machines, and(eq(machines.id, runs.machineId), eq(machines.shopId, runs.shopId)))
    .innerJoin(operator, eq(operator.id, runs.operatorId))
    .leftJoin(estimates, and(eq(estimates.id, runs.estimateId), eq(estimates.shopId, runs.shopId)));
}

type Selected = Awaited<ReturnType<ReturnType<typeof select>['where']>>[number];

function toRow(s: Selected): RunReportRow {
  const { estimateSecondsPerSheet, voidedAt, ...rest } = s;
  const open = s.status === 'running' || s.status === 'paused';
  return {
    ...rest,
    // an open run has no actual time yet (the timer's running time is not a result)
    actualSeconds: open ? null : s.actualSeconds,
    finishedAt: open ? null : s.finishedAt,
    estimatedSeconds: runEstimateSeconds(estimateSecondsPerSheet ?? null, s.sheetsCut),
    voided: s.status === 'voided' || voidedAt !== null,
  };
}

export interface RunReportPage {
  rows: RunReportRow[];
  total: number;
  page: number;
  perPage: number;
  pageCount: number;
}

/** One page of the runs table, newest first. */
export async function runReportPage(shopId: number, query: RunListQuery): Promise<RunReportPage> {
  const cond = and(...whereOf(shopId, query));
  const [{ n }] = await db.select({ n: sql<number>`count(*)` }).from(runs).where(cond);
  const rows = await select()
    .where(cond)
    .orderBy(desc(runs.startedAt), desc(runs.id))
    .limit(query.perPage)
    .offset((query.page - 1) * query.perPage);
  const total = Number(n);
  return { rows: rows.map(toRow), total, page: query.page, perPage: query.perPage, pageCount: Math.max(1, Math.ceil(total / query.perPage)) };
}

/** The charts and figures read at most this many runs, the newest; the page says when more matched. */
export const CHART_RUN_LIMIT = 2000;

/** Every matching run (newest CHART_RUN_LIMIT) for the charts and the figures. */
export async function runReportAll(shopId: number, filters: RunReportFilters): Promise<{ rows: RunReportRow[]; truncated: boolean }> {
  const rows = await select()
    .where(and(...whereOf(shopId, filters)))
    .orderBy(desc(runs.startedAt), desc(runs.id))
    .limit(CHART_RUN_LIMIT + 1);
  return { rows: rows.slice(0, CHART_RUN_LIMIT).map(toRow), truncated: rows.length > CHART_RUN_LIMIT };
}

/** The runs filter's choices: the shop's machines and the people who have runs. */
export async function runReportChoices(shopId: number): Promise<{ machines: { id: number; name: string }[]; operators: { id: number; name: string }[] }> {
  const [machineRows, operatorRows] = await Promise.all([
    db.select({ id: machines.id, name: machines.name }).from(machines).where(eq(machines.shopId, shopId)).orderBy(asc(machines.name)),
    db
      .selectDistinct({ id: users.id, name: users.name })
      .from(users)
      .innerJoin(runs, and(eq(runs.operatorId, users.id), eq(runs.shopId, shopId)))
      .where(eq(users.shopId, shopId))
      .orderBy(asc(users.name)),
  ]);
  return { machines: machineRows, operators: operatorRows };
}

/** An export is read in batches of this many rows. */
export const EXPORT_BATCH = 500;

/** The next batch of the runs export: matching runs with an id above afterId, in id order. */
export async function runExportBatch(shopId: number, filters: RunReportFilters, afterId: number, limit: number = EXPORT_BATCH): Promise<RunReportRow[]> {
  const rows = await select()
    .where(and(...whereOf(shopId, filters), sql`${runs.id} > ${afterId}`))
    .orderBy(asc(runs.id))
    .limit(limit);
  return rows.map(toRow);
}

/** The estimates export's filters. */
export interface EstimateExportFilters {
  machineId?: number;
  jobId?: number;
}

/** The next batch of the estimates export: the shop's estimates with an id above afterId, in id order. */
export async function estimateExportBatch(shopId: number, filters: EstimateExportFilters, afterId: number, limit: number = EXPORT_BATCH): Promise<EstimateExportRow[]> {
  const where: SQL[] = [eq(estimates.shopId, shopId), sql`${estimates.id} > ${afterId}`];
  if (filters.machineId !== undefined) where.push(eq(estimates.machineId, filters.machineId));
  if (filters.jobId !== undefined) where.push(eq(programs.jobId, filters.jobId));
  return db
    .select({
      id: estimates.id,
      jobId: programs.jobId,
      jobTitle: jobs.title,
      programName: programs.name,
      programVersion: estimates.programVersion,
      machineName: machines.name,
      machineVersion: estimates.machineVersion,
      status: estimates.status,
      engineVersion: estimates.engineVersion,
      totalSeconds: estimates.totalSeconds,
      calibratedSeconds: estimates.calibratedSeconds,
      partCount: estimates.partCount,
      errorCount: estimates.errorCount,
      warningCount: estimates.warningCount,
      infoCount: estimates.infoCount,
      createdAt: estimates.createdAt,
      finishedAt: estimates.finishedAt,
    })
    .from(estimates)
    .innerJoin(programs, and(eq(programs.id, estimates.programId), eq(programs.shopId, estimates.shopId)))
    .innerJoin(jobs, and(eq(jobs.id, programs.jobId), eq(jobs.shopId, estimates.shopId)))
    .innerJoin(machines, and(eq(machines.id, estimates.machineId), eq(machines.shopId, estimates.shopId)))
    .where(and(...where))
    .orderBy(asc(estimates.id))
    .limit(limit);
}

// ---- dashboard ----

/** The newest finished estimate of each (program, version, machine) asked for. */
async function latestDoneEstimates(shopId: number, programIds: number[]) {
  if (programIds.length === 0) return new Map<string, { totalSeconds: number | null; calibratedSeconds: number | null; partCount: number | null; errorCount: number | null; id: number }>();
  const rows = await db
    .select({
      id: estimates.id,
      programId: estimates.programId,
      programVersion: estimates.programVersion,
      machineId: estimates.machineId,
      totalSeconds: estimates.totalSeconds,
      calibratedSeconds: estimates.calibratedSeconds,
      partCount: estimates.partCount,
      errorCount: estimates.errorCount,
    })
    .from(estimates)
    .where(and(eq(estimates.shopId, shopId), inArray(estimates.programId, programIds), eq(estimates.status, 'done')))
    .orderBy(asc(estimates.id));
  const out = new Map<string, (typeof rows)[number]>();
  // later ids overwrite earlier ones: the newest wins
  for (const r of rows) {
    out.set(`${r.programId}:${r.programVersion}:${r.machineId}`, r);
    out.set(`${r.programId}:${r.programVersion}:any`, r);
  }
  return out;
}

/** The programs of the jobs scheduled (or running) with a due date in [monday, sunday], with their estimates. */
export async function weekPrograms(shopId: number, monday: string, sunday: string): Promise<{ programs: WeekProgram[]; jobsWithoutMachine: number; jobsWithoutPrograms: number }> {
  const rows = await db
    .select({ jobId: jobs.id, quantity: jobs.quantity, machineId: jobs.machineId, machineName: machines.name, programId: programs.id, latestVersion: programs.latestVersion })
    .from(jobs)
    .leftJoin(machines, and(eq(machines.id, jobs.machineId), eq(machines.shopId, shopId)))
    .leftJoin(programs, and(eq(programs.jobId, jobs.id), eq(programs.shopId, shopId)))
    .where(and(eq(jobs.shopId, shopId), inArray(jobs.status, ['scheduled', 'running']), isNotNull(jobs.dueDate), gte(jobs.dueDate, monday), lte(jobs.dueDate, sunday)));
  const est = await latestDoneEstimates(
    shopId,
    rows.flatMap((r) => (r.programId === null ? [] : [r.programId])),
  );
  const noMachine = new Set<number>();
  const noPrograms = new Set<number>();
  const out: WeekProgram[] = [];
  for (const r of rows) {
    if (r.machineId === null || r.machineName === null) {
      noMachine.add(r.jobId);
      continue;
    }
    if (r.programId === null || r.latestVersion === null) {
      noPrograms.add(r.jobId);
      continue;
    }
    const e = est.get(`${r.programId}:${r.latestVersion}:${r.machineId}`);
    out.push({
      jobId: r.jobId,
      machineId: r.machineId,
      machineName: r.machineName,
      quantity: r.quantity,
      secondsPerSheet: e ? (e.calibratedSeconds ?? e.totalSeconds) : null,
      partsPerSheet: e?.partCount ?? null,
    });
  }
  return { programs: out, jobsWithoutMachine: noMachine.size, jobsWithoutPrograms: noPrograms.size };
}

/** Job statuses that wait for someone's work (not running, done or cancelled). */
export const WAITING_STATUSES = ['draft', 'programmed', 'quoted', 'accepted', 'scheduled'] as const satisfies readonly JobStatus[];

/** How many jobs wait in each of WAITING_STATUSES (every status listed, 0 included). */
export async function jobsWaitingByStatus(shopId: number): Promise<{ status: (typeof WAITING_STATUSES)[number]; count: number }[]> {
  const rows = await db
    .select({ status: jobs.status, n: sql<number>`count(*)` })
    .from(jobs)
    .where(and(eq(jobs.shopId, shopId), inArray(jobs.status, [...WAITING_STATUSES])))
    .groupBy(jobs.status);
  const by = new Map(rows.map((r) => [r.status, Number(r.n)]));
  return WAITING_STATUSES.map((status) => ({ status, count: by.get(status) ?? 0 }));
}

export interface DueProgram {
  jobId: number;
  jobTitle: string;
  dueDate: string;
  jobStatus: JobStatus;
  programId: number;
  programName: string;
  version: number;
  estimateId: number;
  errorCount: number;
}

/**
 * Programs of jobs due in [from, to] (not done or cancelled) whose latest version's newest
 * finished estimate (on the job's machine, else on any) still has error findings: unresolved
 * until a version without errors is uploaded.
 */
export async function dueProgramsWithErrors(shopId: number, from: string, to: string): Promise<DueProgram[]> {
  const rows = await db
    .select({ jobId: jobs.id, jobTitle: jobs.title, dueDate: jobs.dueDate, jobStatus: jobs.status, machineId: jobs.machineId, programId: programs.id, programName: programs.name, version: programs.latestVersion })
    .from(jobs)
    .innerJoin(programs, and(eq(programs.jobId, jobs.id), eq(programs.shopId, shopId)))
    .where(and(eq(jobs.shopId, shopId), notInArray(jobs.status, ['done', 'cancelled']), isNotNull(jobs.dueDate), gte(jobs.dueDate, from), lte(jobs.dueDate, to)))
    .orderBy(asc(jobs.dueDate), asc(jobs.id), asc(programs.name));
  const est = await latestDoneEstimates(
    shopId,
    rows.map((r) => r.programId),
  );
  const out: DueProgram[] = [];
  for (const r of rows) {
    const e = (r.machineId !== null ? est.get(`${r.programId}:${r.version}:${r.machineId}`) : undefined) ?? est.get(`${r.programId}:${r.version}:any`);
    if (!e || !e.errorCount || e.errorCount <= 0) continue;
    out.push({ jobId: r.jobId, jobTitle: r.jobTitle, dueDate: r.dueDate!, jobStatus: r.jobStatus, programId: r.programId, programName: r.programName, version: r.version, estimateId: e.id, errorCount: e.errorCount });
  }
  return out;
}

/** Runs that ended after `since` (any standing; the figures leave out what does not count). */
export async function runsEndedSince(shopId: number, since: Date): Promise<RunReportRow[]> {
  const rows = await select()
    .where(and(eq(runs.shopId, shopId), isNotNull(runs.finishedAt), gte(runs.finishedAt, since), ne(runs.status, 'running'), ne(runs.status, 'paused')))
    .orderBy(desc(runs.finishedAt))
    .limit(CHART_RUN_LIMIT);
  return rows.map(toRow);
}

