// PATCH /api/machines/:machineId/tools/:toolId changes a tool (a new machine version unless
// only its description changed); DELETE takes it out of the library (a new version; older
// versions keep it in their snapshots). Another shop's machine or tool is 404.
import { removeTool, updateTool } from '@/db/queries/machine-changes';
import { requireAction } from '@/lib/auth/require-role';
import { handle, json, readJson } from '@/lib/http/route';
import { parseId } from '@/lib/validation/ids';
import { parseProfileOrThrow, toolPatchSchema } from '@/lib/validation/machines';

type Context = { params: Promise<{ machineId: string; toolId: string }> };

export const PATCH = handle(async (request, { params }: Context) => {
  const user = await requireAction('machines:write');
  const { machineId, toolId } = await params;
  const ids = { machine: parseId(machineId, 'machine'), tool: parseId(toolId, 'tool') };
  const patch = parseProfileOrThrow(toolPatchSchema, await readJson(request), 'tool');
  const saved = await updateTool(user.shopId, ids.machine, ids.tool, patch);
  return json({ tool: saved.tool, version: saved.version, versioned: saved.versioned });
});

export const DELETE = handle(async (_request, { params }: Context) => {
  const user = await requireAction('machines:write');
  const { machineId, toolId } = await params;
  const saved = await removeTool(user.shopId, parseId(machineId, 'machine'), parseId(toolId, 'tool'));
  return json({ version: saved.version, versioned: saved.versioned });
});
