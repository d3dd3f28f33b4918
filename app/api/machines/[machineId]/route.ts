// GET /api/machines/:machineId: one machine with its tools and its versions (each with the
// profile snapshot). PATCH changes profile fields, settings or the archived mark; a change
// of a profile field makes a new version. DELETE removes a machine nothing refers to and
// archives one that estimates or jobs name. Another shop's machine is 404.
import { removeMachine, updateMachine } from '@/db/queries/machine-changes';
import { getMachine, listMachineVersions } from '@/db/queries/machines';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle, json, readJson } from '@/lib/http/route';
import { parseId } from '@/lib/validation/ids';
import { machinePatchSchema, parseProfileOrThrow } from '@/lib/validation/machines';

type Context = { params: Promise<{ machineId: string }> };

export const GET = handle(async (_request, { params }: Context) => {
  const user = await requireAction('machines:read');
  const machineId = parseId((await params).machineId, 'machine');
  const machine = await getMachine(user.shopId, machineId);
  if (!machine) throw new AppError('not-found:machine', 'No such machine.');
  return json({ machine, versions: await listMachineVersions(user.shopId, machineId) });
});

export const PATCH = handle(async (request, { params }: Context) => {
  const user = await requireAction('machines:write');
  const machineId = parseId((await params).machineId, 'machine');
  const patch = parseProfileOrThrow(machinePatchSchema, await readJson(request), 'machine');
  return json(await updateMachine(user.shopId, machineId, patch));
});

export const DELETE = handle(async (_request, { params }: Context) => {
  const user = await requireAction('machines:write');
  const machineId = parseId((await params).machineId, 'machine');
  return json({ result: await removeMachine(user.shopId, machineId) });
});
