// GET /api/quotes/:quoteId: one quote with its frozen inputs, figures and lines. Another
// shop's quote answers 404.
import { getQuote } from '@/db/queries/quotes';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle, json } from '@/lib/http/route';
import { parseId } from '@/lib/validation/ids';

type Context = { params: Promise<{ quoteId: string }> };

export const GET = handle(async (_request, { params }: Context) => {
  const user = await requireAction('quotes:read');
  const quote = await getQuote(user.shopId, parseId((await params).quoteId, 'quote'));
  if (!quote) throw new AppError('not-found:quote', 'No such quote.');
  return json({ quote });
});
