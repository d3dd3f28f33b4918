// GET /api/jobs/:jobId/quotes: the job's quotes, newest first, and the bases a new quote can
// be built from (its finished estimates with the machine, material and shop figures the
// builder prices live). POST: a new draft quote (201 { quote }), numbered per shop; bad
// input is 422 with fields; another shop's job 404.
import { createQuote, listJobQuotes, quoteBases } from '@/db/queries/quotes';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { parseId } from '@/lib/validation/ids';
import { quoteInputSchema } from '@/lib/validation/quotes';

type Context = { params: Promise<{ jobId: string }> };

export const GET = handle(async (_request, { params }: Context) => {
  const user = await requireAction('quotes:read');
  const jobId = parseId((await params).jobId, 'job');
  const bases = await quoteBases(user.shopId, jobId);
  if (!bases) throw new AppError('not-found:job', 'No such job.');
  return json({ quotes: await listJobQuotes(user.shopId, jobId), bases });
});

export const POST = handle(async (request, { params }: Context) => {
  const user = await requireAction('quotes:write');
  const jobId = parseId((await params).jobId, 'job');
  const input = parseOrThrow(quoteInputSchema, await readJson(request), 'quote');
  return json({ quote: await createQuote(user.shopId, user.id, jobId, input) }, 201);
});
