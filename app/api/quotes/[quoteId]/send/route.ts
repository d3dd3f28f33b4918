// POST /api/quotes/:quoteId/send: mails the quote's PDF and the customer's link; 200
// { quote } with status sent once the SMTP server accepted it. A refused message is 409
// conflict:mail-failed with the server's reason (logged in mail_log); the quote stays a draft.
import { getQuote } from '@/db/queries/quotes';
import { requireAction } from '@/lib/auth/require-role';
import { handle, json } from '@/lib/http/route';
import { sendQuoteToCustomer } from '@/lib/mail/quote-mail';
import { parseId } from '@/lib/validation/ids';

type Context = { params: Promise<{ quoteId: string }> };

export const POST = handle(async (_request, { params }: Context) => {
  const user = await requireAction('quotes:write');
  const quoteId = parseId((await params).quoteId, 'quote');
  await sendQuoteToCustomer(user.shopId, user.id, quoteId);
  return json({ quote: await getQuote(user.shopId, quoteId) });
});
