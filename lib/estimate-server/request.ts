// Requesting an estimate: find the stored one for the same inputs or queue a new row. Runs
// inside the caller's transaction (an upload writes its program rows and the request
// together); after the commit the caller calls wakeEstimateQueue(). The machine's current
// version is the one estimated, and its profile snapshot (machine_versions) is written here
// when the version has none yet, so the worker and the input key read one frozen profile.
import { and, asc, eq, isNull, sql } from 'drizzle-orm';
import { machineRowToProfile } from '@/db/queries/machines';
import { estimates, machines, machineVersions, tools, type EstimateSettingsDoc, type Job, type Machine } from '@/db/schema';
import { AppError } from '@/lib/errors';
import { ENGINE_VERSION } from '@/lib/kinematics/version';
import type { EstimateStatus } from '@/lib/validation/enums';
import type { MachineProfile } from '@/lib/validation/machine-profile';
import type { DbHandle } from './db-handle';
import { inputKey } from './input-key';

export interface EstimateRequest {
  shopId: number;
  programId: number;
  programVersionId: number;
  programVersion: number;
  /** SHA-256 (hex) of the program version's bytes */
  sha256: string;
  machineId: number;
  /** the user asking; null for the system */
  requestedBy: number | null;
  settings: EstimateSettingsDoc;
}

export interface EstimateRequested {
  id: number;
  status: EstimateStatus;
  /** true when a new row was queued */
  created: boolean;
  /**
   * true when a stored row of the same inputs was put back in the queue: a failed one (a
   * retry), or a done one stored without the hold-down comparison's per-method analysis
   */
  requeued: boolean;
}

/** The settings of a job that decide an estimate; a vacuum level counts only for vacuum hold-down. */
export function jobEstimateSettings(
  job: Pick<Job, 'sheetWidthMm' | 'sheetLengthMm' | 'sheetThicknessMm' | 'zZero' | 'holdDown' | 'vacuumKpa'>,
): EstimateSettingsDoc {
  return {
    sheet: { widthMm: job.sheetWidthMm, lengthMm: job.sheetLengthMm, thicknessMm: job.sheetThicknessMm },
    zero: job.zZero,
    hold: job.holdDown,
    vacuumKpa: job.holdDown === 'vacuum' && job.vacuumKpa !== null ? job.vacuumKpa : null,
  };
}

/**
 * The job's part of stored settings: without the machine's vacuum level the request adds (the
 * hold-down comparison's), so stored settings compare equal to jobEstimateSettings(job).
 */
export function jobPartOfSettings(doc: EstimateSettingsDoc): EstimateSettingsDoc {
  const { machineVacuumKpa: _machine, ...job } = doc;
  void _machine;
  return job;
}

/** The profile snapshot of the machine's current version, written first when missing. */
export async function ensureMachineVersion(tx: DbHandle, machine: Machine): Promise<{ version: number; profile: MachineProfile }> {
  const find = () =>
    tx
      .select({ profile: machineVersions.profile })
      .from(machineVersions)
      .where(and(eq(machineVersions.machineId, machine.id), eq(machineVersions.version, machine.version)))
      .limit(1);
  let [row] = await find();
  if (!row) {
    const machineTools = await tx
      .select()
      .from(tools)
      .where(and(eq(tools.shopId, machine.shopId), eq(tools.machineId, machine.id)))
      .orderBy(asc(tools.number));
    const profile = machineRowToProfile(machine, machineTools);
    // another request may write the same snapshot at the same moment: the unique key keeps one
    await tx
      .insert(machineVersions)
      .values({ shopId: machine.shopId, machineId: machine.id, version: machine.version, profile })
      .onDuplicateKeyUpdate({ set: { machineId: sql`machine_id` } });
    [row] = await find();
  }
  return { version: machine.version, profile: row.profile };
}

function isDuplicateKey(err: unknown): boolean {
  for (let e: unknown = err; e; e = (e as { cause?: unknown }).cause) {
    if ((e as { code?: unknown }).code === 'ER_DUP_ENTRY') return true;
  }
  return false;
}

export async function requestEstimate(tx: DbHandle, request: EstimateRequest): Promise<EstimateRequested> {
  const [machine] = await tx
    .select()
    .from(machines)
    .where(and(eq(machines.shopId, request.shopId), eq(machines.id, request.machineId)))
    .limit(1);
  if (!machine) throw new AppError('not-found:machine', 'No such machine.');
  const snapshot = await ensureMachineVersion(tx, machine);
  // the machine's own vacuum level decides the hold-down comparison's second vacuum analysis,
  // so it is frozen with the settings and counts in the key (which is why estimates asked for
  // before the comparison existed are not found again: a new request makes one with it)
  const settings: EstimateSettingsDoc = { ...request.settings, machineVacuumKpa: machine.defaultVacuumKpa ?? null };
  const key = inputKey({
    sha256: request.sha256,
    machineId: machine.id,
    machineVersion: snapshot.version,
    profile: snapshot.profile,
    settings,
    engineVersion: ENGINE_VERSION,
  });

  const findExisting = async (locking = false) => {
    const query = tx
      .select({ id: estimates.id, status: estimates.status, holdMethodsKey: estimates.holdMethodsKey })
      .from(estimates)
      .where(and(eq(estimates.shopId, request.shopId), eq(estimates.inputKey, key)))
      .limit(1);
    // a locking read sees rows committed after this transaction's snapshot was taken
    return (await (locking ? query.for('update') : query))[0];
  };

  let existing = await findExisting();
  if (!existing) {
    try {
      const [inserted] = await tx
        .insert(estimates)
        .values({
          shopId: request.shopId,
          programId: request.programId,
          programVersionId: request.programVersionId,
          programVersion: request.programVersion,
          machineId: machine.id,
          machineVersion: snapshot.version,
          engineVersion: ENGINE_VERSION,
          inputKey: key,
          settings,
          status: 'pending',
          requestedBy: request.requestedBy,
        })
        .$returningId();
      return { id: inserted.id, status: 'pending', created: true, requeued: false };
    } catch (err) {
      // the same inputs requested at the same moment by another transaction: use its row
      if (!isDuplicateKey(err)) throw err;
      existing = await findExisting(true);
      if (!existing) throw err;
    }
  }
  if (existing.status === 'failed') {
    // a retry: back in the queue; the stored reason stays until a worker claims it again
    const [result] = await tx
      .update(estimates)
      .set({ status: 'pending', progress: 0, leaseOwner: null, leaseUntil: null })
      .where(and(eq(estimates.id, existing.id), eq(estimates.status, 'failed')));
    if (result.affectedRows === 1) return { id: existing.id, status: 'pending', created: false, requeued: true };
    existing = (await findExisting(true)) ?? existing;
  }
  if (existing.status === 'done' && existing.holdMethodsKey === null) {
    // stored without the per-method analysis (its analysis failed, or the row predates the
    // comparison): computed again with the same inputs, which gives the same figures and now
    // the comparison; a request is the only way back here, so a persistent fault costs one
    // computation per request, never a loop
    const [result] = await tx
      .update(estimates)
      .set({ status: 'pending', progress: 0, leaseOwner: null, leaseUntil: null })
      .where(and(eq(estimates.id, existing.id), eq(estimates.status, 'done'), isNull(estimates.holdMethodsKey)));
    if (result.affectedRows === 1) return { id: existing.id, status: 'pending', created: false, requeued: true };
    existing = (await findExisting(true)) ?? existing;
  }
  return { id: existing.id, status: existing.status, created: false, requeued: false };
}
