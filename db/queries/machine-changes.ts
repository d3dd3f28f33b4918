// Changes of an existing machine: its profile fields and settings, its tools, archiving
// and removal. Every function takes the shop id; another shop's machine is a 404.
//
// Versions: every change of a profile field (tools included) makes machines.version + 1
// and a machine_versions row with the new profile, in the same transaction as the change,
// with the machine row locked (SELECT … FOR UPDATE) so two saves never take one number.
// The snapshot of the version being left is written first if it is missing, so the old
// profile stays readable. A save that alters no profile field makes no version
// (lib/machines/profile-diff.ts decides). A machine that estimates or jobs refer to is
// archived (archived_at), never deleted.
import { and, asc, eq, sql } from 'drizzle-orm';
import { db } from '@/db/client';
import { machines, machineVersions, tools, type Machine, type Tool } from '@/db/schema';
import { AppError } from '@/lib/errors';
import { profileChanges, type ProfileChange } from '@/lib/machines/profile-diff';
import { machineProfileSchema, type MachineProfile } from '@/lib/validation/machine-profile';
import { profileFieldErrors, type MachinePatch, type ToolInput, type ToolPatch } from '@/lib/validation/machines';
import { getMachine, isDuplicateKey, machineReferences, machineRowToProfile, nameTaken, profileToMachineColumns, type MachineWithTools, type Tx } from './machines';

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
  const { hourlyRateMinor, defaultHoldDown, defaultVacuumKpa, archived, ...profilePatch } = patch;
  const result = await db
    .transaction(async (tx) => {
      const locked = await lockMachine(tx, shopId, machineId);
      const editing = Object.keys(profilePatch).length > 0 || hourlyRateMinor !== undefined || defaultHoldDown !== undefined || defaultVacuumKpa !== undefined;
      if (archived === false && locked.machine.archivedAt) {
        await tx.update(machines).set({ archivedAt: null }).where(eq(machines.id, machineId));
        locked.machine = { ...locked.machine, archivedAt: null };
      }
      if (editing) refuseArchived(locked.machine);
      const merged = checkedProfile({ ...locked.profile, ...profilePatch }, 'machine');
      const settings = {
        ...(hourlyRateMinor !== undefined ? { hourlyRateMinor } : {}),
        ...(defaultHoldDown !== undefined ? { defaultHoldDown } : {}),
        ...(defaultVacuumKpa !== undefined ? { defaultVacuumKpa } : {}),
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
