// GET /api/runs/:runId: one run with its timer events and its corrections (who changed what,
// from what to what, and why). PATCH: a correction { actualSeconds?, sheetsCut?, interrupted?,
// notes?, reason }: the run's own operator on the day it ended, an admin any run
// (runs:correct-any); each changed field leaves an audit row. Another shop's run 404.
import { correctRun, getRun } from '@/db/queries/runs';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { parseId } from '@/lib/validation/ids';
import { runCorrectionSchema } from '@/lib/validation/runs';

type Context = { params: Promise<{ runId: string }> };

export const GET = handle(async (_request, { params }: Context) => {
  const user = await requireAction('runs:read');
  const runId = parseId((await params).runId, 'run');
  const run = await getRun(user.shopId, runId);
  if (!run) throw new AppError('not-found:run', 'No such run.');
  return json({ run });
});

export const PATCH = handle(async (request, { params }: Context) => {
  const user = await requireAction('runs:write');
  const runId = parseId((await params).runId, 'run');
  const input = parseOrThrow(runCorrectionSchema, await readJson(request), 'run');
  return json({ run: await correctRun(user.shopId, user, runId, input) });
});
