// GET /api/jobs/:jobId/events: the job's history, newest first (404 for another shop's job).
import { getJob, listJobEvents } from '@/db/queries/jobs';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle, json } from '@/lib/http/route';
import { parseId } from '@/lib/validation/ids';

type Context = { params: Promise<{ jobId: string }> };

export const GET = handle(async (_request, { params }: Context) => {
  const user = await requireAction('jobs:read');
  const jobId = parseId((await params).jobId, 'job');
  if (!(await getJob(user.shopId, jobId))) throw new AppError('not-found:job', 'No such job.');
  return json({ events: await listJobEvents(user.shopId, jobId) });
});
