// GET /api/runs: one page of the shop's runs, newest first, filtered by machineId, operatorId,
// jobId, programId (and version), status, from/to (UTC days); a bad parameter answers 422
// naming it. POST /api/runs { programId, version, machineId }: starts the run's timer on the
// server and records the stored estimate it runs against → 201 { run } with status
// "running"; 409 when the machine already has a run open; another shop's program or
// machine 404.
import { listRuns, startRun } from '@/db/queries/runs';
import { requireAction } from '@/lib/auth/require-role';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { searchParamsToObject } from '@/lib/validation/jobs';
import { runListQuerySchema, runStartSchema } from '@/lib/validation/runs';

export const GET = handle(async (request) => {
  const user = await requireAction('runs:read');
  const query = parseOrThrow(runListQuerySchema, searchParamsToObject(new URL(request.url).searchParams), 'runs query');
  return json(await listRuns(user.shopId, query));
});

export const POST = handle(async (request) => {
  const user = await requireAction('runs:write');
  const input = parseOrThrow(runStartSchema, await readJson(request), 'run');
  return json({ run: await startRun(user.shopId, user, input) }, 201);
});
