// Machines of a shop with their tool libraries and profile versions, and the converter
// between a machine profile (lib/validation/machine-profile.ts: fixtures, CLI,
// machine_versions snapshots) and the flat columns of `machines` + `tools`. Every query
// takes the shop id; another shop's machine is reported exactly like a missing one.
//
// Versions: every change of a profile field (tools included) makes machines.version + 1
// and a machine_versions row with the new profile, in the same transaction as the change,
// with the machine row locked (SELECT … FOR UPDATE) so two saves never take one number.
// The snapshot of the version being left is written first if it is missing, so the old
// profile stays readable. A save that alters no profile field makes no version
// (lib/machines/profile-diff.ts decides). A machine that estimates or jobs refer to is
// archived (archived_at), never deleted.
//
// Free of 'server-only' on purpose, as db/client.ts is: the seed, run by tsx, builds its
// machine rows and snapshots with the converter here (the marker package throws outside
// Next's server bundles). mysql2 keeps this file out of client bundles all the same.
import { and, asc, count, desc, eq, isNull, isNotNull, sql } from 'drizzle-orm';
import { db } from '@/db/client';
import { estimates, jobs, machines, machineVersions, tools, type Machine, type MachineVersion, type Tool } from '@/db/schema';
import { AppError } from '@/lib/errors';
import { profileChanges, type ProfileChange } from '@/lib/machines/profile-diff';
import { machineProfileSchema, type MachineProfile } from '@/lib/validation/machine-profile';
import { profileFieldErrors, type MachinePatch, type MachineSettings, type ToolInput, type ToolPatch } from '@/lib/validation/machines';

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

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

function isDuplicateKey(err: unknown): boolean {
  for (let e: unknown = err; e; e = (e as { cause?: unknown }).cause) {
    if ((e as { code?: unknown }).code === 'ER_DUP_ENTRY') return true;
  }
  return false;
}

function nameTaken(name: string): AppError {
  return new AppError('conflict:machine', `Your shop already has a machine named “${name}”.`, {
    name: [`Another machine is already named “${name}”. Choose a different name.`],
  });
}

function toolNumberTaken(n: number): AppError {
  return new AppError('conflict:tool', `This machine already has a tool ${n}.`, { number: [`Tool ${n} is already in this machine's library. Choose another number.`] });
}

/** The profile after a change, judged by the CLI's schema once more (a tool list with a repeated number, say). */
function checkedProfile(profile: MachineProfile, what: 'machine' | 'tool'): MachineProfile {
  const r = machineProfileSchema.safeParse(profile);
  if (r.success) return r.data;
  const fields = profileFieldErrors(r.error, what);
  throw new AppError(`invalid:${what}`, `Some of the ${what} details need fixing: each one is named at its field.`, fields);
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

interface Locked {
  machine: Machine;
  tools: Tool[];
  profile: MachineProfile;
}

/** Locks the machine row for the rest of the transaction and reads its profile; 404 for another shop's. */
async function lockMachine(tx: Tx, shopId: number, machineId: number): Promise<Locked> {
  const [machine] = await tx
    .select()
    .from(machines)
    .where(and(eq(machines.shopId, shopId), eq(machines.id, machineId)))
    .for('update');
  if (!machine) throw new AppError('not-found:machine', 'No such machine.');
  const machineTools = await tx
    .select()
    .from(tools)
    .where(and(eq(tools.shopId, shopId), eq(tools.machineId, machineId)))
    .orderBy(asc(tools.number));
  return { machine, tools: machineTools, profile: machineRowToProfile(machine, machineTools) };
}

function refuseArchived(machine: Machine): void {
  if (machine.archivedAt) {
    throw new AppError('conflict:machine-archived', `${machine.name} is archived, so its profile is kept as it was. Restore it to change it.`);
  }
}

/**
 * After a change inside the transaction: compares the profile with the one locked before,
 * and when it differs writes version + 1 with its snapshot (and the left version's
 * snapshot, if it had none). Returns the changes, empty when there is no new version.
 */
async function recordVersion(tx: Tx, before: Locked, shopId: number): Promise<{ version: number; changes: ProfileChange[] }> {
  const { machine } = before;
  const [row] = await tx.select().from(machines).where(eq(machines.id, machine.id));
  const nowTools = await tx.select().from(tools).where(eq(tools.machineId, machine.id));
  const after = machineRowToProfile(row, nowTools);
  const changes = profileChanges(before.profile, after);
  if (changes.length === 0) return { version: machine.version, changes };
  // keep the version being left readable (a machine from before versions were written)
  await tx
    .insert(machineVersions)
    .values({ shopId, machineId: machine.id, version: machine.version, profile: before.profile })
    .onDuplicateKeyUpdate({ set: { machineId: sql`machine_id` } });
  const version = machine.version + 1;
  await tx.update(machines).set({ version }).where(eq(machines.id, machine.id));
  await tx.insert(machineVersions).values({ shopId, machineId: machine.id, version, profile: after });
  return { version, changes };
}

export interface MachineSaved {
  machine: MachineWithTools;
  /** the version the machine is at after the save */
  version: number;
  /** true when the save made a new version */
  versioned: boolean;
  changes: ProfileChange[];
}

async function saved(shopId: number, machineId: number, version: number, changes: ProfileChange[]): Promise<MachineSaved> {
  const machine = await getMachine(shopId, machineId);
  if (!machine) throw new AppError('internal', 'The machine was not saved.');
  return { machine, version, versioned: changes.length > 0, changes };
}

/**
 * Changes profile fields, settings, or the archived mark. Profile keys replace the stored
 * ones whole; the merged profile is judged by the CLI's schema. An archived machine may
 * only be restored (archived: false), not edited.
 */
export async function updateMachine(shopId: number, machineId: number, patch: MachinePatch): Promise<MachineSaved> {
  const { hourlyRateMinor, defaultHoldDown, archived, ...profilePatch } = patch;
  const result = await db
    .transaction(async (tx) => {
      const locked = await lockMachine(tx, shopId, machineId);
      const editing = Object.keys(profilePatch).length > 0 || hourlyRateMinor !== undefined || defaultHoldDown !== undefined;
      if (archived === false && locked.machine.archivedAt) {
        await tx.update(machines).set({ archivedAt: null }).where(eq(machines.id, machineId));
        locked.machine = { ...locked.machine, archivedAt: null };
      }
      if (editing) refuseArchived(locked.machine);
      const merged = checkedProfile({ ...locked.profile, ...profilePatch }, 'machine');
      const settings = {
        ...(hourlyRateMinor !== undefined ? { hourlyRateMinor } : {}),
        ...(defaultHoldDown !== undefined ? { defaultHoldDown } : {}),
      };
      const { name, ...columns } = profileToMachineColumns(merged);
      await tx
        .update(machines)
        .set({ ...columns, ...(name !== locked.machine.name ? { name } : {}), ...settings })
        .where(eq(machines.id, machineId));
      const version = await recordVersion(tx, locked, shopId);
      if (archived === true && !locked.machine.archivedAt) await tx.update(machines).set({ archivedAt: new Date() }).where(eq(machines.id, machineId));
      return version;
    })
    .catch((err: unknown) => {
      if (isDuplicateKey(err)) throw nameTaken(String(profilePatch.name ?? ''));
      throw err;
    });
  return saved(shopId, machineId, result.version, result.changes);
}

/** Deletes a machine nothing refers to; archives one that estimates or jobs name. */
export async function removeMachine(shopId: number, machineId: number): Promise<'deleted' | 'archived'> {
  return db.transaction(async (tx) => {
    const { machine } = await lockMachine(tx, shopId, machineId);
    const refs = await machineReferences(shopId, machineId, tx);
    if (refs.estimates > 0 || refs.jobs > 0) {
      if (!machine.archivedAt) await tx.update(machines).set({ archivedAt: new Date() }).where(eq(machines.id, machineId));
      return 'archived';
    }
    await tx.delete(tools).where(and(eq(tools.shopId, shopId), eq(tools.machineId, machineId)));
    await tx.delete(machineVersions).where(and(eq(machineVersions.shopId, shopId), eq(machineVersions.machineId, machineId)));
    await tx.delete(machines).where(and(eq(machines.shopId, shopId), eq(machines.id, machineId)));
    return 'deleted';
  });
}

export interface ToolSaved extends MachineSaved {
  tool: Tool | null;
}

async function changeTools(
  shopId: number,
  machineId: number,
  change: (tx: Tx, locked: Locked) => Promise<number | null>,
  onDuplicate: () => AppError,
): Promise<ToolSaved> {
  const result = await db
    .transaction(async (tx) => {
      const locked = await lockMachine(tx, shopId, machineId);
      refuseArchived(locked.machine);
      const toolId = await change(tx, locked);
      const nowTools = await tx.select().from(tools).where(eq(tools.machineId, machineId));
      const [row] = await tx.select().from(machines).where(eq(machines.id, machineId));
      checkedProfile(machineRowToProfile(row, nowTools), 'tool');
      return { toolId, ...(await recordVersion(tx, locked, shopId)) };
    })
    .catch((err: unknown) => {
      if (isDuplicateKey(err)) throw onDuplicate();
      throw err;
    });
  const s = await saved(shopId, machineId, result.version, result.changes);
  return { ...s, tool: s.machine.tools.find((t) => t.id === result.toolId) ?? null };
}

function findTool(locked: Locked, toolId: number): Tool {
  const tool = locked.tools.find((t) => t.id === toolId);
  if (!tool) throw new AppError('not-found:tool', 'No such tool on this machine.');
  return tool;
}

/** Adds a tool to the library: a profile change, so a new machine version. */
export async function addTool(shopId: number, machineId: number, input: ToolInput): Promise<ToolSaved> {
  return changeTools(
    shopId,
    machineId,
    async (tx, locked) => {
      if (locked.tools.some((t) => t.number === input.number)) throw toolNumberTaken(input.number);
      const [{ id }] = await tx
        .insert(tools)
        .values({ shopId, machineId, number: input.number, diameterMm: input.diameterMm, flutes: input.flutes, kind: input.kind, description: input.description })
        .$returningId();
      return id;
    },
    () => toolNumberTaken(input.number),
  );
}

/** Changes a tool; a new machine version unless only the description changed. */
export async function updateTool(shopId: number, machineId: number, toolId: number, patch: ToolPatch): Promise<ToolSaved> {
  return changeTools(
    shopId,
    machineId,
    async (tx, locked) => {
      findTool(locked, toolId);
      if (patch.number !== undefined && locked.tools.some((t) => t.number === patch.number && t.id !== toolId)) throw toolNumberTaken(patch.number);
      const set = Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined));
      await tx.update(tools).set(set).where(and(eq(tools.shopId, shopId), eq(tools.id, toolId)));
      return toolId;
    },
    () => toolNumberTaken(patch.number ?? 0),
  );
}

/** Takes a tool out of the library: a new machine version. Older versions keep it in their snapshots. */
export async function removeTool(shopId: number, machineId: number, toolId: number): Promise<ToolSaved> {
  return changeTools(
    shopId,
    machineId,
    async (tx, locked) => {
      findTool(locked, toolId);
      await tx.delete(tools).where(and(eq(tools.shopId, shopId), eq(tools.id, toolId)));
      return null;
    },
    () => new AppError('conflict:tool', 'The tool could not be removed.'),
  );
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
