// POST /api/runs/:runId/resume: resumes the run's timer at the server's clock → 200 { run } with
// its status and running time. 409 when the timer cannot resume from where it is; the run's own
// operator or an admin drives it (403 for anyone else); another shop's run 404.
import { resumeRun } from '@/db/queries/runs';
import { requireAction } from '@/lib/auth/require-role';
import { handle, json } from '@/lib/http/route';
import { parseId } from '@/lib/validation/ids';

type Context = { params: Promise<{ runId: string }> };

export const POST = handle(async (_request, { params }: Context) => {
  const user = await requireAction('runs:write');
  const runId = parseId((await params).runId, 'run');
  return json({ run: await resumeRun(user.shopId, user, runId) });
});
