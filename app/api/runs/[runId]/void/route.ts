// POST /api/runs/:runId/void { reason }: an admin voids a run (runs:correct-any): it is kept,
// shown as voided and left out of the statistics; the audit trail records who and why. An
// open run is closed by it. 409 when already voided; another shop's run 404.
import { voidRun } from '@/db/queries/runs';
import { requireAction } from '@/lib/auth/require-role';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { parseId } from '@/lib/validation/ids';
import { runVoidSchema } from '@/lib/validation/runs';

type Context = { params: Promise<{ runId: string }> };

export const POST = handle(async (request, { params }: Context) => {
  const user = await requireAction('runs:correct-any');
  const runId = parseId((await params).runId, 'run');
  const input = parseOrThrow(runVoidSchema, await readJson(request), 'run');
  return json({ run: await voidRun(user.shopId, user, runId, input.reason) });
});
