import 'server-only';
// Programs of a job and their versions. Every function takes the shop id and filters by it.
// recordUploadedPrograms writes everything one upload request changes in ONE transaction:
// per file the program (new, or its latest_version bumped when the job already has a program
// of that name), the program_versions row, a 'program-uploaded' history entry and the
// estimate request for the job's machine; and the job's first program moves it from draft to
// programmed. Either all of it is stored or none (the caller then deletes the objects).
//
// Estimates of a version: an estimate is identified by its inputs, not by the row that asked
// for it (lib/estimate-server's input key), so identical text uploaded again as version 2
// reuses version 1's estimate row. A version's estimates are therefore the shop's estimates
// of the same bytes (SHA-256) made for this program, or made for another program with this
// job's current settings.
import { and, asc, desc, eq, inArray, isNull, sql } from 'drizzle-orm';
import { db } from '@/db/client';
import { estimates, jobEvents, jobs, machines, programs, programVersions, type EstimateSettingsDoc, type Job, type Program } from '@/db/schema';
import { canonicalJson, jobEstimateSettings, jobPartOfSettings, requestEstimate, type DbTx } from '@/lib/estimate-server';
import type { EstimateStatus } from '@/lib/validation/enums';

export interface UploadedFile {
  name: string;
  objectKey: string;
  sha256: string;
  bytes: number;
  lines: number;
}

export interface UploadedProgram {
  id: number;
  jobId: number;
  name: string;
  version: number;
  sha256: string;
  bytes: number;
  lines: number;
  /** null only when the shop has no machine to estimate on */
  estimate: { id: number; status: EstimateStatus } | null;
}

export interface RecordResult {
  programs: UploadedProgram[];
  /** a new estimate row was queued (wake the queue after the commit) */
  queued: boolean;
}

type UploadJob = Pick<Job, 'id' | 'status' | 'machineId' | 'sheetWidthMm' | 'sheetLengthMm' | 'sheetThicknessMm' | 'zZero' | 'holdDown' | 'vacuumKpa'>;

/** The machine a job's estimates are for: its own, else the shop's first machine not archived. */
async function estimateMachineId(tx: DbTx, shopId: number, job: UploadJob): Promise<number | null> {
  if (job.machineId !== null) return job.machineId;
  const [first] = await tx
    .select({ id: machines.id })
    .from(machines)
    .where(and(eq(machines.shopId, shopId), isNull(machines.archivedAt)))
    .orderBy(asc(machines.id))
    .limit(1);
  return first?.id ?? null;
}

export async function recordUploadedPrograms(shopId: number, job: UploadJob, userId: number, files: readonly UploadedFile[]): Promise<RecordResult> {
  return db.transaction(async (tx) => {
    // the job row is locked first, so two uploads to one job take their versions in turn
    const [locked] = await tx
      .select({ status: jobs.status })
      .from(jobs)
      .where(and(eq(jobs.shopId, shopId), eq(jobs.id, job.id)))
      .for('update');
    if (!locked) throw new Error(`job ${job.id} of shop ${shopId} vanished during the upload`);
    const machineId = await estimateMachineId(tx, shopId, job);
    const settings = jobEstimateSettings(job);
    const out: UploadedProgram[] = [];
    let queued = false;
    for (const file of files) {
      // a new name inserts version 1; a name the job has (MariaDB compares names without case,
      // as the shop's file systems mostly do) bumps its latest version
      await tx
        .insert(programs)
        .values({ shopId, jobId: job.id, name: file.name, latestVersion: 1 })
        .onDuplicateKeyUpdate({ set: { latestVersion: sql`${programs.latestVersion} + 1` } });
      const [program] = await tx
        .select({ id: programs.id, name: programs.name, latestVersion: programs.latestVersion })
        .from(programs)
        .where(and(eq(programs.shopId, shopId), eq(programs.jobId, job.id), eq(programs.name, file.name)))
        .limit(1);
      const version = program.latestVersion;
      const [{ id: versionId }] = await tx
        .insert(programVersions)
        .values({ shopId, programId: program.id, version, objectKey: file.objectKey, sha256: file.sha256, bytes: file.bytes, lines: file.lines, uploadedBy: userId })
        .$returningId();
      await tx.insert(jobEvents).values({ shopId, jobId: job.id, userId, kind: 'program-uploaded', detail: `${program.name}, version ${version}`.slice(0, 500) });
      let estimate: UploadedProgram['estimate'] = null;
      if (machineId !== null) {
        const requested = await requestEstimate(tx, {
          shopId,
          programId: program.id,
          programVersionId: versionId,
          programVersion: version,
          sha256: file.sha256,
          machineId,
          requestedBy: userId,
          settings,
        });
        queued ||= requested.created || requested.requeued;
        estimate = { id: requested.id, status: requested.status };
      }
      out.push({ id: program.id, jobId: job.id, name: program.name, version, sha256: file.sha256, bytes: file.bytes, lines: file.lines, estimate });
    }
    if (locked.status === 'draft') {
      await tx.update(jobs).set({ status: 'programmed' }).where(and(eq(jobs.shopId, shopId), eq(jobs.id, job.id)));
      await tx.insert(jobEvents).values({ shopId, jobId: job.id, userId, kind: 'status', detail: 'draft>programmed' });
    }
    return { programs: out, queued };
  });
}

/** What lists show of an estimate; the full report is GET /api/estimates/[estimateId]. */
export interface EstimateSummary {
  id: number;
  status: EstimateStatus;
  progress: number;
  machineId: number;
  machineVersion: number;
  engineVersion: string;
  totalSeconds: number | null;
  calibratedSeconds: number | null;
  errorCount: number | null;
  warningCount: number | null;
  infoCount: number | null;
  partCount: number | null;
  computeMs: number | null;
  error: string | null;
  createdAt: Date;
  finishedAt: Date | null;
}

export interface VersionSummary {
  version: number;
  sha256: string;
  bytes: number;
  lines: number;
  uploadedBy: number | null;
  createdAt: Date;
}

export interface ProgramListItem {
  id: number;
  jobId: number;
  name: string;
  latestVersion: number;
  createdAt: Date;
  updatedAt: Date;
  latest: VersionSummary & { estimate: EstimateSummary | null };
}

export interface ProgramDetail {
  id: number;
  jobId: number;
  name: string;
  latestVersion: number;
  createdAt: Date;
  updatedAt: Date;
  versions: (VersionSummary & { estimates: EstimateSummary[] })[];
}

const summaryColumns = {
  id: estimates.id,
  status: estimates.status,
  progress: estimates.progress,
  machineId: estimates.machineId,
  machineVersion: estimates.machineVersion,
  engineVersion: estimates.engineVersion,
  totalSeconds: estimates.totalSeconds,
  calibratedSeconds: estimates.calibratedSeconds,
  errorCount: estimates.errorCount,
  warningCount: estimates.warningCount,
  infoCount: estimates.infoCount,
  partCount: estimates.partCount,
  computeMs: estimates.computeMs,
  error: estimates.error,
  createdAt: estimates.createdAt,
  finishedAt: estimates.finishedAt,
};

const versionColumns = {
  programId: programVersions.programId,
  version: programVersions.version,
  sha256: programVersions.sha256,
  bytes: programVersions.bytes,
  lines: programVersions.lines,
  uploadedBy: programVersions.uploadedBy,
  createdAt: programVersions.createdAt,
};

type EstimateHit = EstimateSummary & { sha256: string; programId: number; settings: EstimateSettingsDoc };

/** The shop's estimates of any of these bytes, newest first. */
async function estimatesOfBytes(shopId: number, shas: string[]): Promise<EstimateHit[]> {
  if (shas.length === 0) return [];
  return db
    .select({ ...summaryColumns, sha256: programVersions.sha256, programId: estimates.programId, settings: estimates.settings })
    .from(estimates)
    .innerJoin(programVersions, and(eq(programVersions.id, estimates.programVersionId), eq(programVersions.shopId, shopId)))
    .where(and(eq(estimates.shopId, shopId), inArray(programVersions.sha256, [...new Set(shas)])))
    .orderBy(desc(estimates.id));
}

function strip(hit: EstimateHit): EstimateSummary {
  const { sha256: _sha, programId: _program, settings: _settings, ...summary } = hit;
  return summary;
}

/** The estimates that belong to a version of `programId` with these bytes (see the head comment). */
function estimatesFor(hits: EstimateHit[], programId: number, sha256: string, jobSettings: string): EstimateHit[] {
  return hits.filter((h) => h.sha256 === sha256 && (h.programId === programId || canonicalJson(jobPartOfSettings(h.settings)) === jobSettings));
}

/** The one a list shows: the newest made with the job's current settings, else the newest. */
function latestOf(hits: EstimateHit[], jobSettings: string): EstimateSummary | null {
  const current = hits.find((h) => canonicalJson(jobPartOfSettings(h.settings)) === jobSettings) ?? hits[0];
  return current ? strip(current) : null;
}

async function jobSettingsJson(shopId: number, jobId: number): Promise<string | null> {
  const [job] = await db.select().from(jobs).where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId))).limit(1);
  return job ? canonicalJson(jobEstimateSettings(job)) : null;
}

/** The job's programs with their latest version and its latest estimate; null for no such job. */
export async function listJobPrograms(shopId: number, jobId: number): Promise<ProgramListItem[] | null> {
  const settings = await jobSettingsJson(shopId, jobId);
  if (settings === null) return null;
  const rows = await db
    .select({ program: programs, version: versionColumns })
    .from(programs)
    .innerJoin(
      programVersions,
      and(eq(programVersions.programId, programs.id), eq(programVersions.version, programs.latestVersion), eq(programVersions.shopId, shopId)),
    )
    .where(and(eq(programs.shopId, shopId), eq(programs.jobId, jobId)))
    .orderBy(asc(programs.name), asc(programs.id));
  const hits = await estimatesOfBytes(shopId, rows.map((r) => r.version.sha256));
  return rows.map(({ program, version }) => {
    const { programId: _p, ...latest } = version;
    return {
      ...programFields(program),
      latest: { ...latest, estimate: latestOf(estimatesFor(hits, program.id, version.sha256, settings), settings) },
    };
  });
}

/** The program row's own fields as the API answers them (the shop id stays out). */
function programFields(program: Program) {
  const { id, jobId, name, latestVersion, createdAt, updatedAt } = program;
  return { id, jobId, name, latestVersion, createdAt, updatedAt };
}

/** One program with every version, newest first, each with its estimates; null for no such program. */
export async function getProgram(shopId: number, programId: number): Promise<ProgramDetail | null> {
  const [program] = await db.select().from(programs).where(and(eq(programs.shopId, shopId), eq(programs.id, programId))).limit(1);
  if (!program) return null;
  const settings = (await jobSettingsJson(shopId, program.jobId)) ?? '';
  const versions = await db
    .select(versionColumns)
    .from(programVersions)
    .where(and(eq(programVersions.shopId, shopId), eq(programVersions.programId, programId)))
    .orderBy(desc(programVersions.version));
  const hits = await estimatesOfBytes(shopId, versions.map((v) => v.sha256));
  return {
    ...programFields(program),
    versions: versions.map(({ programId: _p, ...v }) => ({ ...v, estimates: estimatesFor(hits, programId, v.sha256, settings).map(strip) })),
  };
}

export interface StoredVersion {
  programId: number;
  name: string;
  version: number;
  objectKey: string;
  sha256: string;
  bytes: number;
}

/** Where one version's bytes are stored; null for no such program or version. */
export async function getProgramVersionFile(shopId: number, programId: number, version: number): Promise<StoredVersion | null> {
  const [row] = await db
    .select({
      programId: programs.id,
      name: programs.name,
      version: programVersions.version,
      objectKey: programVersions.objectKey,
      sha256: programVersions.sha256,
      bytes: programVersions.bytes,
    })
    .from(programVersions)
    .innerJoin(programs, and(eq(programs.id, programVersions.programId), eq(programs.shopId, shopId)))
    .where(and(eq(programVersions.shopId, shopId), eq(programVersions.programId, programId), eq(programVersions.version, version)))
    .limit(1);
  return row ?? null;
}
