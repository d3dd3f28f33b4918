// POST /api/runs/:runId/finish { sheetsCut, interrupted, notes? }: stops the run's timer at
// the server's clock and writes the running time (the sum of the spans between its events)
// → 200 { run } with status "finished" and actualSeconds. Bad input 422 with fields; 409 when
// the run is already finished or voided; another shop's run 404.
import { finishRun } from '@/db/queries/runs';
import { requireAction } from '@/lib/auth/require-role';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { parseId } from '@/lib/validation/ids';
import { runFinishSchema } from '@/lib/validation/runs';

type Context = { params: Promise<{ runId: string }> };

export const POST = handle(async (request, { params }: Context) => {
  const user = await requireAction('runs:write');
  const runId = parseId((await params).runId, 'run');
  const input = parseOrThrow(runFinishSchema, await readJson(request), 'run');
  return json({ run: await finishRun(user.shopId, user, runId, input) });
});
