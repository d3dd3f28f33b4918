import 'server-only';
// What the program page reads: the program with its versions, the version shown (the latest
// or ?version=N), that version's stored estimate (the newest done one made with the job's
// current settings, else the newest) with the frozen inputs it was made from (the machine
// version's profile snapshot and the job settings), so the browser worker can run the same
// engine on the same inputs. Every read takes the shop id.
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { estimates, machines, machineVersions, type EstimateSettingsDoc } from '@/db/schema';
import { jobEstimateSettings } from '@/lib/estimate-server';
import type { MachineProfile } from '@/lib/validation/machine-profile';
import type { JobRow } from './jobs';
import { getMachine, machineRowToProfile } from './machines';
import { getProgram, type EstimateSummary, type ProgramDetail, type VersionSummary } from './programs';

export interface StoredEstimateInputs {
  estimate: EstimateSummary;
  machineName: string;
  settings: EstimateSettingsDoc;
  profile: MachineProfile;
}

export interface ProgramPageData {
  program: ProgramDetail;
  version: VersionSummary;
  stored: StoredEstimateInputs | null;
  /** what the viewer runs on: the stored estimate's frozen inputs, else the job's settings and its machine's current profile; null without either */
  inputs: { settings: EstimateSettingsDoc; profile: MachineProfile } | null;
}

async function currentInputs(shopId: number, job: JobRow): Promise<ProgramPageData['inputs']> {
  if (job.machineId === null) return null;
  const machine = await getMachine(shopId, job.machineId);
  return machine ? { settings: jobEstimateSettings(job), profile: machineRowToProfile(machine, machine.tools) } : null;
}

/** The estimate a page shows first: a done one before one still running or failed, newest first. */
function pick(list: EstimateSummary[]): EstimateSummary | null {
  return list.find((e) => e.status === 'done') ?? list[0] ?? null;
}

/** null: no such program in this shop, not of this job, or no such version. */
export async function getProgramPage(shopId: number, job: JobRow, programId: number, version: number | null): Promise<ProgramPageData | null> {
  const program = await getProgram(shopId, programId);
  if (!program || program.jobId !== job.id) return null;
  const wanted = version ?? program.latestVersion;
  const found = program.versions.find((v) => v.version === wanted);
  if (!found) return null;
  const { estimates: list, ...summary } = found;
  const chosen = pick(list);
  if (!chosen) return { program, version: summary, stored: null, inputs: await currentInputs(shopId, job) };
  const [row] = await db
    .select({ settings: estimates.settings, profile: machineVersions.profile, machineName: machines.name })
    .from(estimates)
    .innerJoin(machines, and(eq(machines.id, estimates.machineId), eq(machines.shopId, shopId)))
    .innerJoin(machineVersions, and(eq(machineVersions.machineId, estimates.machineId), eq(machineVersions.version, estimates.machineVersion)))
    .where(and(eq(estimates.shopId, shopId), eq(estimates.id, chosen.id)))
    .limit(1);
  if (!row) return { program, version: summary, stored: null, inputs: await currentInputs(shopId, job) };
  return {
    program,
    version: summary,
    stored: { estimate: chosen, machineName: row.machineName, settings: row.settings, profile: row.profile },
    inputs: { settings: row.settings, profile: row.profile },
  };
}
