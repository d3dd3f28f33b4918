// GET /api/machines/:machineId/tools: the machine's tool library. POST adds a tool
// (number, diameterMm, flutes, kind, description?): a profile change, so a new version.
import { addTool } from '@/db/queries/machine-changes';
import { getMachine } from '@/db/queries/machines';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle, json, readJson } from '@/lib/http/route';
import { parseId } from '@/lib/validation/ids';
import { parseProfileOrThrow, toolInputSchema } from '@/lib/validation/machines';

type Context = { params: Promise<{ machineId: string }> };

export const GET = handle(async (_request, { params }: Context) => {
  const user = await requireAction('machines:read');
  const machineId = parseId((await params).machineId, 'machine');
  const machine = await getMachine(user.shopId, machineId);
  if (!machine) throw new AppError('not-found:machine', 'No such machine.');
  return json({ tools: machine.tools, version: machine.version });
});

export const POST = handle(async (request, { params }: Context) => {
  const user = await requireAction('machines:write');
  const machineId = parseId((await params).machineId, 'machine');
  const input = parseProfileOrThrow(toolInputSchema, await readJson(request), 'tool');
  const saved = await addTool(user.shopId, machineId, input);
  return json({ tool: saved.tool, version: saved.version, versioned: saved.versioned }, 201);
});
