// Machines of a shop with their tool libraries, and the converter between a machine
// profile (lib/validation/machine-profile.ts: fixtures, CLI, machine_versions snapshots)
// and the flat columns of `machines` + `tools`. Every query takes the shop id.
// Free of 'server-only' on purpose, as db/client.ts is: the seed, run by tsx, builds its
// machine rows and snapshots with the converter here (the marker package throws outside
// Next's server bundles). mysql2 keeps this file out of client bundles all the same.
import { and, asc, count, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { machines, tools, type Machine, type Tool } from '@/db/schema';
import type { MachineProfile } from '@/lib/validation/machine-profile';

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

export type MachineSummary = Pick<Machine, 'id' | 'name' | 'version' | 'travelXMm' | 'travelYMm' | 'travelZMm' | 'defaultHoldDown'> & {
  toolCount: number;
};

export async function listMachines(shopId: number): Promise<MachineSummary[]> {
  const rows = await db
    .select({
      id: machines.id,
      name: machines.name,
      version: machines.version,
      travelXMm: machines.travelXMm,
      travelYMm: machines.travelYMm,
      travelZMm: machines.travelZMm,
      defaultHoldDown: machines.defaultHoldDown,
      toolCount: count(tools.id),
    })
    .from(machines)
    .leftJoin(tools, and(eq(tools.machineId, machines.id), eq(tools.shopId, shopId)))
    .where(eq(machines.shopId, shopId))
    .groupBy(machines.id)
    .orderBy(asc(machines.name));
  return rows.map((r) => ({ ...r, toolCount: Number(r.toolCount) }));
}

export async function getMachine(shopId: number, machineId: number): Promise<(Machine & { tools: Tool[] }) | null> {
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
