// Machines of a shop with their tool libraries and profile versions, and the converter
// between a machine profile (lib/validation/machine-profile.ts: fixtures, CLI,
// machine_versions snapshots) and the flat columns of `machines` + `tools`. Every query
// takes the shop id; another shop's machine is reported exactly like a missing one.
// Changes of an existing machine (profile, tools, archive) are in machine-changes.ts,
// where the version rule lives.
//
// Free of 'server-only' on purpose, as db/client.ts is: the seed, run by tsx, builds its
// machine rows and snapshots with the converter here (the marker package throws outside
// Next's server bundles). mysql2 keeps this file out of client bundles all the same.
import { and, asc, count, desc, eq, isNull, isNotNull } from 'drizzle-orm';
import { db } from '@/db/client';
import { estimates, jobs, machines, machineVersions, tools, type Machine, type MachineVersion, type Tool } from '@/db/schema';
import { AppError } from '@/lib/errors';
import type { MachineProfile } from '@/lib/validation/machine-profile';
import type { MachineSettings } from '@/lib/validation/machines';

export type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

export type MachineSummary = Pick<
  Machine,
  'id' | 'name' | 'version' | 'travelXMm' | 'travelYMm' | 'travelZMm' | 'defaultHoldDown' | 'hourlyRateMinor' | 'archivedAt'
> & { toolCount: number };

export type ArchivedFilter = 'exclude' | 'include' | 'only';

/** The shop's machines by name; archived ones only when asked (pickers never offer them). */
export async function listMachines(shopId: number, archived: ArchivedFilter = 'exclude'): Promise<MachineSummary[]> {
  const where =
    archived === 'include'
      ? eq(machines.shopId, shopId)
      : and(eq(machines.shopId, shopId), archived === 'only' ? isNotNull(machines.archivedAt) : isNull(machines.archivedAt));
  const rows = await db
    .select({
      id: machines.id,
      name: machines.name,
      version: machines.version,
      travelXMm: machines.travelXMm,
      travelYMm: machines.travelYMm,
      travelZMm: machines.travelZMm,
      defaultHoldDown: machines.defaultHoldDown,
      hourlyRateMinor: machines.hourlyRateMinor,
      archivedAt: machines.archivedAt,
      toolCount: count(tools.id),
    })
    .from(machines)
    .leftJoin(tools, and(eq(tools.machineId, machines.id), eq(tools.shopId, shopId)))
    .where(where)
    .groupBy(machines.id)
    .orderBy(asc(machines.name));
  return rows.map((r) => ({ ...r, toolCount: Number(r.toolCount) }));
}

export type MachineWithTools = Machine & { tools: Tool[] };

export async function getMachine(shopId: number, machineId: number): Promise<MachineWithTools | null> {
  const rows = await db
    .select()
    .from(machines)
    .where(and(eq(machines.shopId, shopId), eq(machines.id, machineId)))
    .limit(1);
  const machine = rows[0];
  if (!machine) return null;
  const machineTools = await db
    .select()
    .from(tools)
    .where(and(eq(tools.shopId, shopId), eq(tools.machineId, machineId)))
    .orderBy(asc(tools.number));
  return { ...machine, tools: machineTools };
}

/** The machine's stored versions, newest first, each with its profile snapshot. */
export async function listMachineVersions(shopId: number, machineId: number): Promise<MachineVersion[]> {
  return db
    .select()
    .from(machineVersions)
    .where(and(eq(machineVersions.shopId, shopId), eq(machineVersions.machineId, machineId)))
    .orderBy(desc(machineVersions.version));
}

/** How many estimates and jobs name the machine: any at all means it is archived, not deleted. */
export async function machineReferences(shopId: number, machineId: number, tx: Tx | typeof db = db): Promise<{ estimates: number; jobs: number }> {
  const [e] = await tx
    .select({ n: count() })
    .from(estimates)
    .where(and(eq(estimates.shopId, shopId), eq(estimates.machineId, machineId)));
  const [j] = await tx
    .select({ n: count() })
    .from(jobs)
    .where(and(eq(jobs.shopId, shopId), eq(jobs.machineId, machineId)));
  return { estimates: Number(e.n), jobs: Number(j.n) };
}

export function isDuplicateKey(err: unknown): boolean {
  for (let e: unknown = err; e; e = (e as { cause?: unknown }).cause) {
    if ((e as { code?: unknown }).code === 'ER_DUP_ENTRY') return true;
  }
  return false;
}

export function nameTaken(name: string): AppError {
  return new AppError('conflict:machine', `Your shop already has a machine named “${name}”.`, {
    name: [`Another machine is already named “${name}”. Choose a different name.`],
  });
}

export async function createMachine(shopId: number, profile: MachineProfile, settings: MachineSettings): Promise<MachineWithTools> {
  const id = await db
    .transaction(async (tx) => {
      const [{ id: machineId }] = await tx
        .insert(machines)
        .values({ ...profileToMachineColumns(profile), shopId, version: 1, ...settings })
        .$returningId();
      for (const t of profile.tools) {
        await tx.insert(tools).values({ shopId, machineId, number: t.number, diameterMm: t.diameterMm, flutes: t.flutes, kind: t.kind });
      }
      const [row] = await tx.select().from(machines).where(eq(machines.id, machineId));
      const machineTools = await tx.select().from(tools).where(eq(tools.machineId, machineId));
      await tx.insert(machineVersions).values({ shopId, machineId, version: 1, profile: machineRowToProfile(row, machineTools) });
      return machineId;
    })
    .catch((err: unknown) => {
      if (isDuplicateKey(err)) throw nameTaken(profile.name);
      throw err;
    });
  const created = await getMachine(shopId, id);
  if (!created) throw new AppError('internal', 'The machine was not saved.');
  return created;
}

export function profileToMachineColumns(p: MachineProfile) {
  return {
    name: p.name,
    travelXMm: p.travelMm.x,
    travelYMm: p.travelMm.y,
    travelZMm: p.travelMm.z,
    homeXMm: p.homeMm.x,
    homeYMm: p.homeMm.y,
    homeZMm: p.homeMm.z,
    maxFeedXMmPerMin: p.maxFeedMmPerMin.x,
    maxFeedYMmPerMin: p.maxFeedMmPerMin.y,
    maxFeedZMmPerMin: p.maxFeedMmPerMin.z,
    rapidXMmPerMin: p.rapidMmPerMin.x,
    rapidYMmPerMin: p.rapidMmPerMin.y,
    rapidZMmPerMin: p.rapidMmPerMin.z,
    accelXMmPerS2: p.accelMmPerS2.x,
    accelYMmPerS2: p.accelMmPerS2.y,
    accelZMmPerS2: p.accelMmPerS2.z,
    cornerToleranceMm: p.cornerToleranceMm,
    lookaheadBlocks: p.lookaheadBlocks,
    maxBlocksPerS: p.maxBlocksPerS,
    chordToleranceMm: p.chordToleranceMm,
    toolChangeS: p.toolChangeSeconds,
    spindleSpinUpS: p.spindleSpinUpSeconds,
    timeFactor: p.timeFactor,
  } satisfies Partial<typeof machines.$inferInsert>;
}

/** The profile as the estimator reads it, rebuilt from a machine row and its tools. */
export function machineRowToProfile(m: Machine, machineTools: Tool[]): MachineProfile {
  return {
    name: m.name,
    travelMm: { x: m.travelXMm, y: m.travelYMm, z: m.travelZMm },
    homeMm: { x: m.homeXMm, y: m.homeYMm, z: m.homeZMm },
    maxFeedMmPerMin: { x: m.maxFeedXMmPerMin, y: m.maxFeedYMmPerMin, z: m.maxFeedZMmPerMin },
    rapidMmPerMin: { x: m.rapidXMmPerMin, y: m.rapidYMmPerMin, z: m.rapidZMmPerMin },
    accelMmPerS2: { x: m.accelXMmPerS2, y: m.accelYMmPerS2, z: m.accelZMmPerS2 },
    cornerToleranceMm: m.cornerToleranceMm,
    lookaheadBlocks: m.lookaheadBlocks,
    maxBlocksPerS: m.maxBlocksPerS,
    chordToleranceMm: m.chordToleranceMm,
    toolChangeSeconds: m.toolChangeS,
    spindleSpinUpSeconds: m.spindleSpinUpS,
    timeFactor: m.timeFactor,
    tools: [...machineTools]
      .sort((a, b) => a.number - b.number)
      .map((t) => ({ number: t.number, diameterMm: t.diameterMm, flutes: t.flutes, kind: t.kind })),
  };
}
