// POST /api/quotes/:quoteId/revoke: withdraws a sent quote's customer link; the page then
// says so and takes no answer.
import { revokeQuoteLink } from '@/db/queries/quotes';
import { requireAction } from '@/lib/auth/require-role';
import { handle, json } from '@/lib/http/route';
import { parseId } from '@/lib/validation/ids';

type Context = { params: Promise<{ quoteId: string }> };

export const POST = handle(async (_request, { params }: Context) => {
  const user = await requireAction('quotes:write');
  return json({ quote: await revokeQuoteLink(user.shopId, user.id, parseId((await params).quoteId, 'quote')) });
});
