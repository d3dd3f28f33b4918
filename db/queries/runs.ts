import 'server-only';
// Runs of programs on machines (issue 15): the timer kept on the server as run_events, runs
// entered afterwards by hand, corrections with their audit trail (run_changes), voiding, the
// lists the program page shows, and a machine's calibration suggestion and its applying.
// Every function takes the shop id (inside the actor); another shop's run, program or
// machine is reported exactly like a missing one (404).
//
// Concurrency: a run row carries active_machine_id (the machine while running or paused,
// NULL otherwise) with a unique index, so of two starts on one machine at the same moment
// the second insert waits for the first to commit and then fails on the duplicate key: it
// is answered 409. Timer moves lock the run row (SELECT … FOR UPDATE), so a pause and a
// finish sent together are applied one after the other and the second is judged against
// the state the first left.
//
// Every write takes `now` (default: the server clock), so tests drive the timer with a
// clock of their own and check the running time against hand-computed sums.
import { and, asc, desc, eq, gt, inArray, isNotNull, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import { db } from '@/db/client';
import { updateMachine } from '@/db/queries/machine-changes';
import { getShopSettings } from '@/db/queries/shop-settings';
import { isDuplicateKey } from '@/db/queries/machines';
import { estimates, jobs, machines, programs, programVersions, runChanges, runEvents, runs, users, type RunRow } from '@/db/schema';
import { canDo } from '@/lib/auth/roles';
import { AppError } from '@/lib/errors';
import { calibrate, type Calibration } from '@/lib/runs/calibration';
import { mayCorrect } from '@/lib/runs/correct-rule';
import { runEstimateSeconds } from '@/lib/runs/run-estimate';
import { NEXT_EVENTS, runningSeconds, timerState, type TimerEvent } from '@/lib/runs/timer';
import type { Role, RunEventKind, RunStatus } from '@/lib/validation/enums';
import type { RunCorrectionInput, RunFinishInput, RunListQuery, RunManualInput, RunStartInput } from '@/lib/validation/runs';

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];
type Handle = Tx | typeof db;

/** Who is acting: the signed-in user's id and role (the shop id is every function's first argument). */
export interface RunUser {
  id: number;
  role: Role;
}

interface RunActor extends RunUser {
  shopId: number;
}

const actorOf = (shopId: number, user: RunUser): RunActor => ({ id: user.id, role: user.role, shopId });

export interface RunEventView {
  kind: RunEventKind;
  at: string;
  userName: string | null;
}

export interface RunChangeView {
  field: string;
  before: string | null;
  after: string | null;
  reason: string;
  userName: string;
  at: string;
}

/** A run as the API and the pages show it. */
export interface RunView {
  id: number;
  status: RunStatus;
  jobId: number;
  jobTitle: string;
  programId: number;
  programName: string;
  programVersion: number;
  machineId: number;
  machineName: string;
  machineVersion: number;
  operatorId: number;
  operatorName: string;
  /** the stored estimate the run is measured against; null when none was done */
  estimateId: number | null;
  /** that estimate's machine time for one program run (one sheet), before any time factor */
  estimateSeconds: number | null;
  /** the same with the machine version's time factor */
  estimateCalibratedSeconds: number | null;
  /** the estimate for the sheets cut (lib/runs/run-estimate.ts), before any time factor */
  estimatedRunSeconds: number | null;
  startedAt: string;
  finishedAt: string | null;
  /** written at finish (or typed); while the timer runs, the running time at `serverNow` */
  actualSeconds: number | null;
  runningSeconds: number;
  sheetsCut: number | null;
  interrupted: boolean;
  notes: string | null;
  manual: boolean;
  voidedAt: string | null;
  voidReason: string | null;
  /** how many audit rows (corrections, voiding) the run has: GET /api/runs/:runId lists them */
  changeCount: number;
  events: RunEventView[];
  /** the server's clock when the view was made: the browser's timer counts on from it */
  serverNow: string;
}

export interface RunDetail extends RunView {
  changes: RunChangeView[];
}

const notFound = () => new AppError('not-found:run', 'No such run.');
const iso = (d: Date | null) => (d ? d.toISOString() : null);

const operator = alias(users, 'operator');

function runSelect(h: Handle) {
  return h
    .select({
      run: runs,
      jobTitle: jobs.title,
      programName: programs.name,
      machineName: machines.name,
      operatorName: operator.name,
      estimateSeconds: estimates.totalSeconds,
      estimateCalibratedSeconds: estimates.calibratedSeconds,
      changeCount: sql<number>`(select count(*) from ${runChanges} where ${runChanges.runId} = ${runs.id})`,
    })
    .from(runs)
    .innerJoin(jobs, eq(jobs.id, runs.jobId))
    .innerJoin(programs, eq(programs.id, runs.programId))
    .innerJoin(machines, eq(machines.id, runs.machineId))
    .innerJoin(operator, eq(operator.id, runs.operatorId))
    .leftJoin(estimates, eq(estimates.id, runs.estimateId));
}

type Selected = Awaited<ReturnType<ReturnType<typeof runSelect>['where']>>[number];

async function eventsOf(h: Handle, shopId: number, runIds: number[]): Promise<Map<number, RunEventView[]>> {
  const out = new Map<number, RunEventView[]>();
  if (runIds.length === 0) return out;
  const rows = await h
    .select({ runId: runEvents.runId, kind: runEvents.kind, at: runEvents.at, userName: users.name })
    .from(runEvents)
    .leftJoin(users, eq(users.id, runEvents.userId))
    .where(and(eq(runEvents.shopId, shopId), inArray(runEvents.runId, runIds)))
    .orderBy(asc(runEvents.at), asc(runEvents.id));
  for (const r of rows) {
    const list = out.get(r.runId) ?? [];
    list.push({ kind: r.kind, at: r.at.toISOString(), userName: r.userName });
    out.set(r.runId, list);
  }
  return out;
}

function toView(s: Selected, events: RunEventView[], now: Date): RunView {
  const r = s.run;
  const open = r.status === 'running' || r.status === 'paused';
  let running = r.actualSeconds ?? 0;
  if (open && events.length > 0) running = runningSeconds(events, now);
  return {
    id: r.id,
    status: r.status,
    jobId: r.jobId,
    jobTitle: s.jobTitle,
    programId: r.programId,
    programName: s.programName,
    programVersion: r.programVersion,
    machineId: r.machineId,
    machineName: s.machineName,
    machineVersion: r.machineVersion,
    operatorId: r.operatorId,
    operatorName: s.operatorName,
    estimateId: r.estimateId,
    estimateSeconds: s.estimateSeconds ?? null,
    estimateCalibratedSeconds: s.estimateCalibratedSeconds ?? null,
    estimatedRunSeconds: runEstimateSeconds(s.estimateSeconds ?? null, r.sheetsCut),
    startedAt: r.startedAt.toISOString(),
    finishedAt: iso(r.finishedAt),
    actualSeconds: open ? null : r.actualSeconds,
    runningSeconds: running,
    sheetsCut: r.sheetsCut,
    interrupted: r.interrupted,
    notes: r.notes,
    manual: r.manual,
    voidedAt: iso(r.voidedAt),
    voidReason: r.voidReason,
    changeCount: Number(s.changeCount),
    events,
    serverNow: now.toISOString(),
  };
}

async function viewOf(h: Handle, shopId: number, runId: number, now: Date): Promise<RunView> {
  const [row] = await runSelect(h).where(and(eq(runs.shopId, shopId), eq(runs.id, runId))).limit(1);
  if (!row) throw notFound();
  return toView(row, (await eventsOf(h, shopId, [runId])).get(runId) ?? [], now);
}

/** One run with its events and its corrections; null for a missing or another shop's run. */
export async function getRun(shopId: number, runId: number, now: Date = new Date()): Promise<RunDetail | null> {
  const view = await viewOf(db, shopId, runId, now).catch((e: unknown) => {
    if (e instanceof AppError && e.code === 'not-found:run') return null;
    throw e;
  });
  if (!view) return null;
  const changes = await db
    .select({ field: runChanges.field, before: runChanges.before, after: runChanges.after, reason: runChanges.reason, userName: users.name, at: runChanges.createdAt })
    .from(runChanges)
    .innerJoin(users, eq(users.id, runChanges.userId))
    .where(and(eq(runChanges.shopId, shopId), eq(runChanges.runId, runId)))
    .orderBy(asc(runChanges.id));
  return { ...view, changes: changes.map((c) => ({ ...c, at: c.at.toISOString() })) };
}

export interface RunPage {
  runs: RunView[];
  total: number;
  page: number;
  perPage: number;
}

/** The shop's runs, newest first, filtered by machine, operator, job, program (and version), status. */
export async function listRuns(shopId: number, query: RunListQuery, now: Date = new Date()): Promise<RunPage> {
  const where: SQL[] = [eq(runs.shopId, shopId)];
  if (query.machineId !== undefined) where.push(eq(runs.machineId, query.machineId));
  if (query.operatorId !== undefined) where.push(eq(runs.operatorId, query.operatorId));
  if (query.jobId !== undefined) where.push(eq(runs.jobId, query.jobId));
  if (query.programId !== undefined) where.push(eq(runs.programId, query.programId));
  if (query.version !== undefined) where.push(eq(runs.programVersion, query.version));
  if (query.status !== undefined) where.push(eq(runs.status, query.status));
  if (query.from !== undefined) where.push(sql`${runs.startedAt} >= ${`${query.from} 00:00:00`}`);
  if (query.to !== undefined) where.push(sql`${runs.startedAt} < ${`${query.to} 00:00:00`} + interval 1 day`);
  const cond = and(...where);
  const [{ n }] = await db.select({ n: sql<number>`count(*)` }).from(runs).where(cond);
  const rows = await runSelect(db)
    .where(cond)
    .orderBy(desc(runs.startedAt), desc(runs.id))
    .limit(query.perPage)
    .offset((query.page - 1) * query.perPage);
  const events = await eventsOf(
    db,
    shopId,
    rows.map((r) => r.run.id),
  );
  return { runs: rows.map((r) => toView(r, events.get(r.run.id) ?? [], now)), total: Number(n), page: query.page, perPage: query.perPage };
}

/** The run open (running or paused) on a machine, if any. */
export async function openRunOnMachine(shopId: number, machineId: number, now: Date = new Date()): Promise<RunView | null> {
  const [row] = await db
    .select({ id: runs.id })
    .from(runs)
    .where(and(eq(runs.shopId, shopId), eq(runs.activeMachineId, machineId)))
    .limit(1);
  return row ? viewOf(db, shopId, row.id, now) : null;
}

// --- starting ------------------------------------------------------------------------------

interface RunTarget {
  jobId: number;
  programId: number;
  programVersion: number;
  machineId: number;
  machineVersion: number;
  machineName: string;
  estimateId: number | null;
}

/**
 * The program version and machine a run is for, and the estimate it is measured against:
 * the stored, finished estimate of this program version on this machine, of the machine's
 * current profile version when there is one, else of the newest version estimated.
 */
async function runTarget(tx: Tx, shopId: number, input: Pick<RunStartInput, 'programId' | 'version' | 'machineId'>): Promise<RunTarget> {
  const [program] = await tx
    .select({ id: programs.id, jobId: programs.jobId })
    .from(programs)
    .innerJoin(jobs, and(eq(jobs.id, programs.jobId), eq(jobs.shopId, shopId)))
    .where(and(eq(programs.shopId, shopId), eq(programs.id, input.programId)))
    .limit(1);
  if (!program) throw new AppError('not-found:program', 'No such program.');
  const [version] = await tx
    .select({ version: programVersions.version })
    .from(programVersions)
    .where(and(eq(programVersions.shopId, shopId), eq(programVersions.programId, program.id), eq(programVersions.version, input.version)))
    .limit(1);
  if (!version) throw new AppError('not-found:program-version', `This program has no version ${input.version}.`);
  const [machine] = await tx
    .select({ id: machines.id, name: machines.name, version: machines.version, archivedAt: machines.archivedAt })
    .from(machines)
    .where(and(eq(machines.shopId, shopId), eq(machines.id, input.machineId)))
    .limit(1);
  if (!machine) throw new AppError('not-found:machine', 'No such machine.');
  if (machine.archivedAt !== null) {
    throw new AppError('invalid:run', 'This machine is archived; choose a machine in use.', { machineId: ['This machine is archived; choose a machine in use.'] });
  }
  const [estimate] = await tx
    .select({ id: estimates.id })
    .from(estimates)
    .where(
      and(
        eq(estimates.shopId, shopId),
        eq(estimates.programId, program.id),
        eq(estimates.programVersion, input.version),
        eq(estimates.machineId, machine.id),
        eq(estimates.status, 'done'),
        isNotNull(estimates.totalSeconds),
      ),
    )
    .orderBy(sql`${estimates.machineVersion} = ${machine.version} desc`, desc(estimates.machineVersion), desc(estimates.id))
    .limit(1);
  return {
    jobId: program.jobId,
    programId: program.id,
    programVersion: input.version,
    machineId: machine.id,
    machineVersion: machine.version,
    machineName: machine.name,
    estimateId: estimate?.id ?? null,
  };
}

async function machineBusy(shopId: number, machineId: number, machineName: string): Promise<AppError> {
  const open = await openRunOnMachine(shopId, machineId).catch(() => null);
  const who = open ? ` ${open.operatorName} started ${open.programName} on it at ${open.startedAt.slice(11, 16)} UTC and it is ${open.status}.` : '';
  return new AppError('conflict:machine-busy', `${machineName} already has a run open.${who} Finish or pause-and-finish that run first.`);
}

/** Starts the timer of a run: the start event at `now`. 409 when the machine already has an open run. */
export async function startRun(shopId: number, user: RunUser, input: RunStartInput, now: Date = new Date()): Promise<RunView> {
  const actor = actorOf(shopId, user);
  let target: RunTarget | null = null;
  try {
    const id = await db.transaction(async (tx) => {
      target = await runTarget(tx, actor.shopId, input);
      const [{ id: runId }] = await tx
        .insert(runs)
        .values({
          shopId: actor.shopId,
          jobId: target.jobId,
          programId: target.programId,
          programVersion: target.programVersion,
          machineId: target.machineId,
          machineVersion: target.machineVersion,
          estimateId: target.estimateId,
          operatorId: actor.id,
          status: 'running',
          startedAt: now,
        })
        .$returningId();
      await tx.insert(runEvents).values({ shopId: actor.shopId, runId, kind: 'start', at: now, userId: actor.id });
      return runId;
    });
    return viewOf(db, actor.shopId, id, now);
  } catch (err) {
    if (isDuplicateKey(err)) {
      const t = target as RunTarget | null;
      throw await machineBusy(actor.shopId, input.machineId, t?.machineName ?? 'This machine');
    }
    throw err;
  }
}

// --- the timer's moves ---------------------------------------------------------------------

async function lockRun(tx: Tx, shopId: number, runId: number): Promise<RunRow> {
  const [row] = await tx
    .select()
    .from(runs)
    .where(and(eq(runs.shopId, shopId), eq(runs.id, runId)))
    .for('update');
  if (!row) throw notFound();
  return row;
}

async function lockedEvents(tx: Tx, runId: number): Promise<TimerEvent[]> {
  return tx.select({ kind: runEvents.kind, at: runEvents.at }).from(runEvents).where(eq(runEvents.runId, runId)).orderBy(asc(runEvents.at), asc(runEvents.id));
}

async function operatorName(h: Handle, userId: number): Promise<string> {
  const [u] = await h.select({ name: users.name }).from(users).where(eq(users.id, userId)).limit(1);
  return u?.name ?? 'another operator';
}

/** The run's own operator drives its timer; an admin may too (a forgotten finish at the end of a shift). */
async function mayDrive(tx: Tx, actor: RunActor, run: RunRow): Promise<void> {
  if (run.operatorId === actor.id || canDo(actor.role, 'runs:correct-any')) return;
  const name = await operatorName(tx, run.operatorId);
  throw new AppError('forbidden:run', `This run is ${name}’s: ${name} or an admin can pause, resume or finish it.`);
}

const STATE_WORDS: Record<RunStatus, string> = { running: 'running', paused: 'paused', finished: 'already finished', voided: 'voided' };

async function moveTimer(actor: RunActor, runId: number, kind: Exclude<RunEventKind, 'start'>, now: Date, finish?: RunFinishInput): Promise<RunView> {
  await db.transaction(async (tx) => {
    const run = await lockRun(tx, actor.shopId, runId);
    await mayDrive(tx, actor, run);
    if (run.status === 'finished' || run.status === 'voided') {
      throw new AppError('conflict:run-state', `This run is ${STATE_WORDS[run.status]}, so it cannot be ${kind === 'finish' ? 'finished' : `${kind}d`} again.`);
    }
    const events = await lockedEvents(tx, runId);
    const state = timerState(events);
    if (!NEXT_EVENTS[state].includes(kind)) {
      throw new AppError('conflict:run-state', `The timer is ${state}: it can ${NEXT_EVENTS[state].join(' or ')} now, not ${kind}.`);
    }
    // a second server process whose clock is a little behind must not write time backwards
    const lastAt = new Date(events.at(-1)!.at).getTime();
    const at = new Date(Math.max(now.getTime(), lastAt));
    await tx.insert(runEvents).values({ shopId: actor.shopId, runId, kind, at, userId: actor.id });
    if (kind === 'finish') {
      const actualSeconds = runningSeconds([...events, { kind, at }], at);
      await tx
        .update(runs)
        .set({ status: 'finished', finishedAt: at, actualSeconds, sheetsCut: finish!.sheetsCut, interrupted: finish!.interrupted, notes: finish!.notes ?? null })
        .where(eq(runs.id, runId));
    } else {
      await tx
        .update(runs)
        .set({ status: kind === 'pause' ? 'paused' : 'running' })
        .where(eq(runs.id, runId));
    }
  });
  return viewOf(db, actor.shopId, runId, now);
}

export async function pauseRun(shopId: number, user: RunUser, runId: number, now: Date = new Date()): Promise<RunView> {
  return moveTimer(actorOf(shopId, user), runId, 'pause', now);
}
export async function resumeRun(shopId: number, user: RunUser, runId: number, now: Date = new Date()): Promise<RunView> {
  return moveTimer(actorOf(shopId, user), runId, 'resume', now);
}
export async function finishRun(shopId: number, user: RunUser, runId: number, input: RunFinishInput, now: Date = new Date()): Promise<RunView> {
  return moveTimer(actorOf(shopId, user), runId, 'finish', now, input);
}

// --- entered afterwards --------------------------------------------------------------------

/** A run entered by hand after the fact: its start and end (or duration) become its two events. */
export async function recordManualRun(shopId: number, user: RunUser, input: RunManualInput, now: Date = new Date()): Promise<RunView> {
  const actor = actorOf(shopId, user);
  const startedAt = input.startedAt;
  const finishedAt = input.finishedAt ?? new Date(startedAt.getTime() + Math.round(input.durationSeconds! * 1000));
  if (finishedAt.getTime() > now.getTime() + 60_000) {
    throw new AppError('invalid:run', 'Some of the run details need fixing: each one is named at its field.', { finishedAt: ['A run entered afterwards cannot end in the future.'] });
  }
  const id = await db.transaction(async (tx) => {
    const target = await runTarget(tx, actor.shopId, input);
    const [{ id: runId }] = await tx
      .insert(runs)
      .values({
        shopId: actor.shopId,
        jobId: target.jobId,
        programId: target.programId,
        programVersion: target.programVersion,
        machineId: target.machineId,
        machineVersion: target.machineVersion,
        estimateId: target.estimateId,
        operatorId: actor.id,
        status: 'finished',
        startedAt,
        finishedAt,
        actualSeconds: (finishedAt.getTime() - startedAt.getTime()) / 1000,
        sheetsCut: input.sheetsCut,
        interrupted: input.interrupted,
        notes: input.notes ?? null,
        manual: true,
      })
      .$returningId();
    await tx.insert(runEvents).values([
      { shopId: actor.shopId, runId, kind: 'start', at: startedAt, userId: actor.id },
      { shopId: actor.shopId, runId, kind: 'finish', at: finishedAt, userId: actor.id },
    ]);
    return runId;
  });
  return viewOf(db, actor.shopId, id, now);
}

// --- corrections and voiding -------------------------------------------------------------

const asText = (v: unknown): string | null => (v === null || v === undefined ? null : typeof v === 'boolean' ? (v ? 'yes' : 'no') : String(v));

/** Changes a finished run's figures; each changed field leaves a run_changes row (who, before, after, why). */
export async function correctRun(shopId: number, user: RunUser, runId: number, input: RunCorrectionInput, now: Date = new Date()): Promise<RunDetail> {
  const actor = actorOf(shopId, user);
  await db.transaction(async (tx) => {
    const run = await lockRun(tx, actor.shopId, runId);
    if (!mayCorrect(actor, run, now)) {
      const own = run.operatorId === actor.id;
      throw new AppError('forbidden:run', own ? 'Runs can be corrected by their operator on the day they ended; an admin can correct this one.' : 'Only the run’s own operator (on the day) or an admin can correct it.');
    }
    if (run.status === 'running' || run.status === 'paused') throw new AppError('conflict:run-state', 'The timer is still on: finish the run before correcting it.');
    if (run.status === 'voided') throw new AppError('conflict:run-state', 'This run is voided; a voided run is kept as it was.');
    const next = {
      actualSeconds: input.actualSeconds,
      sheetsCut: input.sheetsCut,
      interrupted: input.interrupted,
      notes: input.notes === undefined ? undefined : input.notes === '' ? null : input.notes,
    };
    const set: Partial<RunRow> = {};
    const audit: (typeof runChanges.$inferInsert)[] = [];
    for (const [field, value] of Object.entries(next) as [keyof typeof next, unknown][]) {
      if (value === undefined || value === run[field]) continue;
      (set as Record<string, unknown>)[field] = value;
      audit.push({ shopId: actor.shopId, runId, userId: actor.id, field, before: asText(run[field]), after: asText(value), reason: input.reason, createdAt: now });
    }
    if (audit.length === 0) {
      throw new AppError('invalid:run', 'Nothing changed: every value is the one the run already has.', { _form: ['Nothing changed: every value is the one the run already has.'] });
    }
    if (set.sheetsCut !== undefined || set.interrupted !== undefined) {
      const sheets = set.sheetsCut ?? run.sheetsCut ?? 0;
      const interrupted = set.interrupted ?? run.interrupted;
      if (!interrupted && sheets < 1) throw new AppError('invalid:run', 'A run that was not interrupted cut at least 1 sheet.', { sheetsCut: ['A run that was not interrupted cut at least 1 sheet.'] });
    }
    await tx.update(runs).set(set).where(eq(runs.id, runId));
    await tx.insert(runChanges).values(audit);
  });
  return (await getRun(actor.shopId, runId, now))!;
}

/** Voids a run (admin): kept and shown as voided, left out of the statistics. An open run is closed with it. */
export async function voidRun(shopId: number, user: RunUser, runId: number, reason: string, now: Date = new Date()): Promise<RunDetail> {
  const actor = actorOf(shopId, user);
  await db.transaction(async (tx) => {
    const run = await lockRun(tx, actor.shopId, runId);
    if (run.status === 'voided') throw new AppError('conflict:run-state', 'This run is already voided.');
    await tx.update(runs).set({ status: 'voided', voidedAt: now, voidedBy: actor.id, voidReason: reason }).where(eq(runs.id, runId));
    await tx.insert(runChanges).values({ shopId: actor.shopId, runId, userId: actor.id, field: 'status', before: run.status, after: 'voided', reason, createdAt: now });
  });
  return (await getRun(actor.shopId, runId, now))!;
}

// --- calibration -----------------------------------------------------------------------------

export interface MachineCalibration extends Calibration {
  machineId: number;
  machineName: string;
  machineVersion: number;
  currentFactor: number;
  /** the shop's N (shop_settings.calibration_runs) */
  lastRuns: number;
}

/**
 * The suggested time factor of a machine from its last N uninterrupted, finished, not voided
 * runs that have an estimate (lib/runs/calibration.ts decides and words it). The ratio is
 * actual ÷ the uncalibrated estimate for the sheets cut. Null for another shop's machine.
 */
export async function machineCalibration(shopId: number, machineId: number): Promise<MachineCalibration | null> {
  const [machine] = await db
    .select({ id: machines.id, name: machines.name, version: machines.version, timeFactor: machines.timeFactor })
    .from(machines)
    .where(and(eq(machines.shopId, shopId), eq(machines.id, machineId)))
    .limit(1);
  if (!machine) return null;
  const settings = await getShopSettings(shopId);
  const rows = await db
    .select({
      id: runs.id,
      actualSeconds: runs.actualSeconds,
      sheetsCut: runs.sheetsCut,
      interrupted: runs.interrupted,
      status: runs.status,
      finishedAt: runs.finishedAt,
      estimateSeconds: estimates.totalSeconds,
    })
    .from(runs)
    .innerJoin(estimates, eq(estimates.id, runs.estimateId))
    .where(
      and(
        eq(runs.shopId, shopId),
        eq(runs.machineId, machineId),
        eq(runs.status, 'finished'),
        eq(runs.interrupted, false),
        isNotNull(runs.finishedAt),
        gt(runs.actualSeconds, 0),
        gt(estimates.totalSeconds, 0),
      ),
    )
    .orderBy(desc(runs.finishedAt), desc(runs.id))
    .limit(Math.max(1, settings.calibrationRuns));
  const result = calibrate(
    rows.map((r) => ({
      id: r.id,
      actualSeconds: r.actualSeconds,
      estimatedSeconds: runEstimateSeconds(r.estimateSeconds, r.sheetsCut),
      interrupted: r.interrupted,
      voided: r.status !== 'finished',
      finishedAt: r.finishedAt,
    })),
    { lastRuns: settings.calibrationRuns, minimumRuns: settings.calibrationMinRuns, currentFactor: machine.timeFactor },
  );
  return { ...result, machineId: machine.id, machineName: machine.name, machineVersion: machine.version, currentFactor: machine.timeFactor, lastRuns: settings.calibrationRuns };
}

export interface CalibrationApplied {
  machineId: number;
  /** the new machine version made with the factor */
  version: number;
  previousVersion: number;
  timeFactor: number;
  previousFactor: number;
}

/**
 * Applies the suggestion (admin): a new machine version with that time factor, through the
 * machine's own versioned update (row lock, snapshot). The factor the admin saw must still be
 * the suggestion: runs finished in between could have moved it (409, with the new figure).
 * Estimates made later use the new version; stored estimates and quotes keep theirs.
 */
export async function applyCalibration(shopId: number, machineId: number, seenFactor: number): Promise<CalibrationApplied> {
  const now = await machineCalibration(shopId, machineId);
  if (!now) throw new AppError('not-found:machine', 'No such machine.');
  if (now.suggestedFactor === null) throw new AppError('conflict:calibration', now.message);
  if (Math.abs(now.suggestedFactor - seenFactor) >= 0.0005) {
    throw new AppError('conflict:calibration', `The suggestion is now ${now.suggestedFactor.toFixed(3)}, not ${seenFactor.toFixed(3)}: runs finished since the page was opened. Look at the new figures and apply again.`);
  }
  if (Math.abs(now.currentFactor - now.suggestedFactor) < 0.0005) {
    throw new AppError('conflict:calibration', `${now.machineName} already uses the time factor ${now.suggestedFactor.toFixed(3)}.`);
  }
  const saved = await updateMachine(shopId, machineId, { timeFactor: now.suggestedFactor });
  return { machineId, version: saved.version, previousVersion: now.machineVersion, timeFactor: saved.machine.timeFactor, previousFactor: now.currentFactor };
}
