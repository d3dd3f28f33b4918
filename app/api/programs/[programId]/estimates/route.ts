// POST /api/programs/:programId/estimates { machineId, version? }: requests the estimate of a
// program version (the latest when none is named) on a machine, with the job's settings.
// 202 { estimate: { id, status: 'pending' } } when queued (new, or a failed one retried);
// 200 { estimate } with the stored one when the same inputs were estimated before.
// GET lists the program's estimates. Another shop's program or machine answers 404.
import { listProgramEstimates, requestProgramEstimate } from '@/db/queries/estimates';
import { getProgram } from '@/db/queries/programs';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle, json, readJson } from '@/lib/http/route';
import { estimateRequestSchema } from '@/lib/validation/estimates';
import { parseOrThrow } from '@/lib/validation/form';
import { parseId } from '@/lib/validation/ids';

type Context = { params: Promise<{ programId: string }> };

export const POST = handle(async (request, { params }: Context) => {
  const user = await requireAction('estimates:write');
  const programId = parseId((await params).programId, 'program');
  const input = parseOrThrow(estimateRequestSchema, await readJson(request), 'estimate');
  const requested = await requestProgramEstimate(user.shopId, programId, user.id, input);
  if (requested.created || requested.requeued) return json({ estimate: { id: requested.id, status: 'pending' } }, 202);
  return json({ estimate: requested.estimate });
});

export const GET = handle(async (_request, { params }: Context) => {
  const user = await requireAction('estimates:read');
  const programId = parseId((await params).programId, 'program');
  if (!(await getProgram(user.shopId, programId))) throw new AppError('not-found:program', 'No such program.');
  return json({ estimates: await listProgramEstimates(user.shopId, programId) });
});
