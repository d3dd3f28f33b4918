// The customer's page for one quote, no sign-in: the link's token (128 random bits, only its
// SHA-256 stored) finds the quote. It shows that quote and the shop's name and address, and
// takes one answer; an unknown, withdrawn, expired or answered link says so and offers nothing.
import type { Metadata } from 'next';
import { CustomerAnswer } from '@/components/quotes/customer-answer';
import { quoteByToken } from '@/db/queries/quotes';
import { formatMoney } from '@/lib/quotes/price';

export const dynamic = 'force-dynamic';
export const metadata: Metadata = { title: 'Your quote', robots: { index: false, follow: false }, referrer: 'no-referrer' };

const CLOSED: Record<string, { title: string; text: string }> = {
  accepted: { title: 'This quote has been accepted.', text: 'Thank you: the shop has your answer. Nothing more is needed here.' },
  declined: { title: 'This quote has been declined.', text: 'The shop has your answer. Ask the shop for a new quote if you change your mind.' },
  expired: { title: 'This quote has expired.', text: 'Its validity has run out. Ask the shop for a new quote.' },
  revoked: { title: 'This link has been withdrawn.', text: 'The shop has withdrawn this quote, usually because a revised one follows. Ask the shop if you have not received it.' },
};

export default async function CustomerQuotePage({ params }: { params: Promise<{ token: string }> }) {
  const found = await quoteByToken((await params).token);
  if (!found.found) {
    return (
      <main id="main" className="mx-auto max-w-2xl px-4 py-10">
        <h1>This link is not valid</h1>
        <p className="mt-3" data-testid="quote-link-state">No quote answers to this link. Check that the whole link was copied from the e-mail, or ask the shop for a new one.</p>
      </main>
    );
  }
  const q = found.quote;
  const closed = CLOSED[q.state];
  return (
    <main id="main" className="mx-auto max-w-3xl px-4 py-10">
      <header className="border-b-2 border-rule pb-4">
        <p className="text-lg font-bold">{q.shopName}</p>
        {q.shopAddress ? <p className="whitespace-pre-line text-sm text-ink-soft">{q.shopAddress}</p> : null}
      </header>
      <h1 className="mt-6">Quote {q.number}</h1>
      <dl className="mt-3 grid gap-x-6 gap-y-1 sm:grid-cols-[max-content_1fr]">
        <dt className="text-ink-soft">For</dt>
        <dd className="font-bold">{q.customerName}</dd>
        <dt className="text-ink-soft">Job</dt>
        <dd className="font-bold">{q.jobTitle}</dd>
        {q.validUntil ? (
          <>
            <dt className="text-ink-soft">Valid until</dt>
            <dd className="figure font-bold">{q.validUntil}</dd>
          </>
        ) : null}
      </dl>
      <table className="mt-6 w-full border-collapse rounded-md bg-panel text-left">
        <caption className="sr-only">Quote lines</caption>
        <thead>
          <tr className="border-b-2 border-rule text-sm text-ink-soft">
            <th scope="col" className="py-1 pr-3">Line</th>
            <th scope="col" className="py-1 pr-3">How it is computed</th>
            <th scope="col" className="py-1 text-right">Amount</th>
          </tr>
        </thead>
        <tbody>
          {q.lines.map((l) => (
            <tr key={l.key} className={`border-b border-rule-light align-top ${l.key === 'total' ? 'font-bold' : ''}`}>
              <th scope="row" className="py-1 pr-3">{l.label}</th>
              <td className="figure py-1 pr-3 text-sm">{l.arithmetic}</td>
              <td className="figure whitespace-nowrap py-1 text-right">{l.amountMinor === null ? '' : formatMoney(l.amountMinor, q.currency)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="mt-4 text-xl font-bold" data-testid="customer-total">Total {formatMoney(q.totalMinor, q.currency)}</p>
      {q.quoteTerms ? <p className="mt-4 whitespace-pre-line text-sm">{q.quoteTerms}</p> : null}
      <p className="mt-4 text-sm text-ink-soft">The machine time in this quote is an estimate computed from the cutting program; the time on the machine can differ.</p>
      <div className="mt-8">
        {closed ? (
          <div className="rounded-md border-2 border-rule p-4" data-testid="quote-link-state">
            <h2 className="text-lg">{closed.title}</h2>
            <p className="mt-1">{closed.text}</p>
          </div>
        ) : (
          <CustomerAnswer token={(await params).token} />
        )}
      </div>
    </main>
  );
}
