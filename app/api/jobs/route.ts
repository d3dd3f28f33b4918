// GET /api/jobs: the shop's jobs with customer and material names.
// POST /api/jobs: create a job (422 with field issues on bad input).
import { createJob, listJobs } from '@/db/queries/jobs';
import { requireAction } from '@/lib/auth/require-role';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { jobCreateSchema } from '@/lib/validation/jobs';

export const GET = handle(async () => {
  const user = await requireAction('jobs:read');
  return json({ jobs: await listJobs(user.shopId) });
});

export const POST = handle(async (request) => {
  const user = await requireAction('jobs:write');
  const input = parseOrThrow(jobCreateSchema, await readJson(request), 'job');
  return json({ job: await createJob(user.shopId, input) }, 201);
});
