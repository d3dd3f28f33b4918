import 'server-only';
// Stored estimates of a shop: one estimate with its figures, the request of a new one for a
// program version and machine (through lib/estimate-server, which finds the stored row for
// the same inputs), and the stored report JSON. Every function takes the shop id.
import { and, desc, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { estimates, jobs, machines, programs, programVersions, type EstimateRow } from '@/db/schema';
import { jobEstimateSettings, requestEstimate, wakeEstimateQueue, type EstimateRequested } from '@/lib/estimate-server';
import { AppError } from '@/lib/errors';
import { openProgramObject, type ProgramObjectStream } from '@/lib/programs/program-storage';
import type { EstimateStatus } from '@/lib/validation/enums';
import type { EstimateRequestInput } from '@/lib/validation/estimates';

/** An estimate as the API answers it, without its report. */
export interface EstimateView {
  id: number;
  status: EstimateStatus;
  programId: number;
  programVersion: number;
  machineId: number;
  machineVersion: number;
  engineVersion: string;
  /** 0–1 while pending or running */
  progress: number;
  computeMs: number | null;
  totalSeconds: number | null;
  calibratedSeconds: number | null;
  errorCount: number | null;
  warningCount: number | null;
  infoCount: number | null;
  partCount: number | null;
  /** times the computation was started */
  attempts: number;
  createdAt: string;
  finishedAt: string | null;
  /** why it failed (kept on a retry until the new attempt ends) */
  error?: string;
}

export function estimateView(row: EstimateRow): EstimateView {
  return {
    id: row.id,
    status: row.status,
    programId: row.programId,
    programVersion: row.programVersion,
    machineId: row.machineId,
    machineVersion: row.machineVersion,
    engineVersion: row.engineVersion,
    progress: row.progress,
    computeMs: row.computeMs,
    totalSeconds: row.totalSeconds,
    calibratedSeconds: row.calibratedSeconds,
    errorCount: row.errorCount,
    warningCount: row.warningCount,
    infoCount: row.infoCount,
    partCount: row.partCount,
    attempts: row.attempts,
    createdAt: row.createdAt.toISOString(),
    finishedAt: row.finishedAt ? row.finishedAt.toISOString() : null,
    ...(row.error !== null && row.status !== 'done' ? { error: row.error } : {}),
  };
}

export async function getEstimate(shopId: number, estimateId: number): Promise<EstimateRow | null> {
  const [row] = await db
    .select()
    .from(estimates)
    .where(and(eq(estimates.shopId, shopId), eq(estimates.id, estimateId)))
    .limit(1);
  return row ?? null;
}

/** The stored report JSON as a stream (never read whole into memory); null when missing. */
export async function openEstimateReport(row: Pick<EstimateRow, 'reportKey'>): Promise<ProgramObjectStream | null> {
  return row.reportKey ? openProgramObject(row.reportKey) : null;
}

export interface RequestedEstimate extends EstimateRequested {
  estimate: EstimateView;
}

/**
 * Requests an estimate of one version of a program (the latest when none is named) on a
 * machine of the shop, with the program's job settings. The same inputs answer the stored
 * estimate; a failed one is queued again (a retry).
 */
export async function requestProgramEstimate(
  shopId: number,
  programId: number,
  userId: number,
  input: EstimateRequestInput,
): Promise<RequestedEstimate> {
  const requested = await db.transaction(async (tx) => {
    const [found] = await tx
      .select({ program: programs, job: jobs })
      .from(programs)
      .innerJoin(jobs, and(eq(jobs.id, programs.jobId), eq(jobs.shopId, shopId)))
      .where(and(eq(programs.shopId, shopId), eq(programs.id, programId)))
      .limit(1);
    if (!found) throw new AppError('not-found:program', 'No such program.');
    const version = input.version ?? found.program.latestVersion;
    const [programVersion] = await tx
      .select()
      .from(programVersions)
      .where(and(eq(programVersions.shopId, shopId), eq(programVersions.programId, programId), eq(programVersions.version, version)))
      .limit(1);
    if (!programVersion) throw new AppError('not-found:program-version', `This program has no version ${version}.`);
    const [machine] = await tx
      .select({ id: machines.id, archivedAt: machines.archivedAt })
      .from(machines)
      .where(and(eq(machines.shopId, shopId), eq(machines.id, input.machineId)))
      .limit(1);
    if (!machine) throw new AppError('not-found:machine', 'No such machine.');
    if (machine.archivedAt !== null) {
      throw new AppError('invalid:estimate', 'This machine is archived; choose a machine in use.', {
        machineId: ['This machine is archived; choose a machine in use.'],
      });
    }
    return requestEstimate(tx, {
      shopId,
      programId,
      programVersionId: programVersion.id,
      programVersion: programVersion.version,
      sha256: programVersion.sha256,
      machineId: machine.id,
      requestedBy: userId,
      settings: jobEstimateSettings(found.job),
    });
  });
  if (requested.created || requested.requeued) wakeEstimateQueue();
  const row = await getEstimate(shopId, requested.id);
  if (!row) throw new Error(`estimate ${requested.id} vanished right after its request`);
  return { ...requested, estimate: estimateView(row) };
}

/** The estimates of a program, newest first (every version, every machine). */
export async function listProgramEstimates(shopId: number, programId: number): Promise<EstimateView[]> {
  const rows = await db
    .select()
    .from(estimates)
    .where(and(eq(estimates.shopId, shopId), eq(estimates.programId, programId)))
    .orderBy(desc(estimates.id));
  return rows.map(estimateView);
}
