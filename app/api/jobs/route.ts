// GET /api/jobs: one page of the shop's jobs, filtered and sorted in SQL. Query params as
// the /jobs page's URL: status, customerId, machineId, q (text in title, customer, notes),
// sort (updated|created|title|customer|machine|due|status|quantity), dir (asc|desc), page,
// perPage (25|50|100); a bad one answers 422 naming it.
// POST /api/jobs: create a job (422 with field issues on bad input).
import { createJob, listJobs } from '@/db/queries/jobs';
import { requireAction } from '@/lib/auth/require-role';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { jobCreateSchema, jobListQuerySchema, searchParamsToObject } from '@/lib/validation/jobs';

export const GET = handle(async (request) => {
  const user = await requireAction('jobs:read');
  const query = parseOrThrow(jobListQuerySchema, searchParamsToObject(new URL(request.url).searchParams), 'jobs query');
  return json(await listJobs(user.shopId, query));
});

export const POST = handle(async (request) => {
  const user = await requireAction('jobs:write');
  const input = parseOrThrow(jobCreateSchema, await readJson(request), 'job');
  return json({ job: await createJob(user.shopId, user.id, input) }, 201);
});
