// POST /api/q/:token { answer: 'accept', name, purchaseOrder? } | { answer: 'decline', reason? }:
// the customer's one answer to a quote, no sign-in: the token is the key (only its SHA-256 is
// stored). A used, withdrawn, expired or unknown token is 409 or 404 and changes nothing.
import { answerQuote, type CustomerAnswer } from '@/db/queries/quotes';
import { AppError } from '@/lib/errors';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { quoteAcceptSchema, quoteDeclineSchema } from '@/lib/validation/quotes';

type Context = { params: Promise<{ token: string }> };

const REFUSALS: Record<string, string> = {
  accepted: 'This quote has already been answered.',
  declined: 'This quote has already been answered.',
  expired: 'This quote has expired.',
  revoked: 'The shop has withdrawn this link.',
};

export const POST = handle(async (request, { params }: Context) => {
  const token = (await params).token;
  const body = (await readJson(request)) as { answer?: unknown } | null;
  const kind = body && typeof body === 'object' ? body.answer : undefined;
  if (kind !== 'accept' && kind !== 'decline') throw new AppError('invalid:answer', 'Choose accept or decline.', { answer: ['Choose accept or decline.'] });
  const rest = { ...body, answer: undefined };
  const answer: CustomerAnswer =
    kind === 'accept'
      ? { kind: 'accept', ...parseOrThrow(quoteAcceptSchema, rest, 'answer') }
      : { kind: 'decline', ...parseOrThrow(quoteDeclineSchema, rest, 'answer') };
  const result = await answerQuote(token, answer);
  if (!result.ok) {
    if (result.why === 'unknown') throw new AppError('not-found:quote', 'This link is not valid (it may have been answered or withdrawn).');
    throw new AppError('conflict:quote-answered', REFUSALS[result.why] ?? 'This quote takes no answer.');
  }
  return json({ ok: true, status: kind === 'accept' ? 'accepted' : 'declined' });
});
