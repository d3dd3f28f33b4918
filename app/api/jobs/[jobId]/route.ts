// GET /api/jobs/:jobId: one job of the shop (404 for a missing job or another shop's).
// PATCH /api/jobs/:jobId: change its status.
import { getJob, updateJobStatus } from '@/db/queries/jobs';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { parseId } from '@/lib/validation/ids';
import { jobStatusSchema } from '@/lib/validation/jobs';

type Context = { params: Promise<{ jobId: string }> };

export const GET = handle(async (_request, { params }: Context) => {
  const user = await requireAction('jobs:read');
  const jobId = parseId((await params).jobId, 'job');
  const job = await getJob(user.shopId, jobId);
  if (!job) throw new AppError('not-found:job', 'No such job.');
  return json({ job });
});

export const PATCH = handle(async (request, { params }: Context) => {
  const user = await requireAction('jobs:write');
  const jobId = parseId((await params).jobId, 'job');
  const input = parseOrThrow(jobStatusSchema, await readJson(request), 'job');
  return json({ job: await updateJobStatus(user.shopId, jobId, input) });
});
