import 'server-only';
// Machines of a shop with their tool libraries. Every function takes the shop id.
import { and, asc, count, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { machines, tools, type Machine, type Tool } from '@/db/schema';

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
