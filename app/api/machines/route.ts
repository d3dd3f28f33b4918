// GET /api/machines: the shop's machines with their tool counts (archived ones with
// ?archived=include or only). POST /api/machines: a new machine from a profile in the CLI's
// PROFILE.json form (tools optional) plus hourlyRateMinor and defaultHoldDown; version 1.
import { createMachine, listMachines } from '@/db/queries/machines';
import { requireAction } from '@/lib/auth/require-role';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { parseMachineCreate } from '@/lib/validation/machines';
import { z } from '@/lib/validation/zod';

const listQuery = z.object({
  archived: z.enum(['exclude', 'include', 'only'], { error: 'Ask for archived machines with exclude, include or only.' }).default('exclude'),
});

export const GET = handle(async (request) => {
  const user = await requireAction('machines:read');
  const { archived } = parseOrThrow(listQuery, { archived: new URL(request.url).searchParams.get('archived') ?? undefined }, 'query');
  return json({ machines: await listMachines(user.shopId, archived) });
});

export const POST = handle(async (request) => {
  const user = await requireAction('machines:write');
  const { profile, settings } = parseMachineCreate(await readJson(request));
  return json({ machine: await createMachine(user.shopId, profile, settings) }, 201);
});
