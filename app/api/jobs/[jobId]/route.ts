// GET /api/jobs/:jobId: one job of the shop (404 for a missing job or another shop's).
// PUT /api/jobs/:jobId: edit the job's fields (the whole form, as on create).
// PATCH /api/jobs/:jobId { status }: take one status step (lib/jobs/status-moves.ts): 403 for a
// role that does not own the step, 409 for a step the job's status does not allow.
import { getJob, moveJobStatus, updateJob } from '@/db/queries/jobs';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { parseId } from '@/lib/validation/ids';
import { jobStatusSchema, jobUpdateSchema } from '@/lib/validation/jobs';

type Context = { params: Promise<{ jobId: string }> };

export const GET = handle(async (_request, { params }: Context) => {
  const user = await requireAction('jobs:read');
  const jobId = parseId((await params).jobId, 'job');
  const job = await getJob(user.shopId, jobId);
  if (!job) throw new AppError('not-found:job', 'No such job.');
  return json({ job });
});

export const PUT = handle(async (request, { params }: Context) => {
  const user = await requireAction('jobs:write');
  const jobId = parseId((await params).jobId, 'job');
  const input = parseOrThrow(jobUpdateSchema, await readJson(request), 'job');
  return json({ job: await updateJob(user.shopId, user.id, jobId, input) });
});

export const PATCH = handle(async (request, { params }: Context) => {
  // every reader of jobs may ask; the step's own action is checked in moveJobStatus
  const user = await requireAction('jobs:read');
  const jobId = parseId((await params).jobId, 'job');
  const input = parseOrThrow(jobStatusSchema, await readJson(request), 'job');
  return json({ job: await moveJobStatus(user.shopId, user, jobId, input.status) });
});
