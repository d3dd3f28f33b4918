'use client';
// The job's quotes and the quote builder (GET/POST /api/jobs/[jobId]/quotes, SWR). The
// builder prices with lib/quotes/price.ts, the function the server stores the quote with,
// so every change of an input moves the total at once and the saved quote matches what was
// shown. Sending, the PDF, withdrawing a link and revising are on each quote of the list.
// The hold-down method is the builder's choice: each method is offered with what the estimate's
// hold-down comparison (GET /api/estimates/:id/hold-down) says it holds, the suggested one can
// be taken with one click, and the hold-down labour line follows the method chosen.
import { useRouter } from 'next/navigation';
import { useMemo, useState } from 'react';
import useSWR from 'swr';
import { Button } from '@/components/ui/button';
import { InputField, SelectField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import type { HoldDownAnswer } from '@/db/queries/hold-down';
import type { QuoteBasis, QuoteView } from '@/db/queries/quotes';
import { AppError, type FieldErrors } from '@/lib/errors';
import { fetcher } from '@/lib/fetcher';
import { buildPrice, formatMoney, formatSeconds, PriceInputError, type PriceBuildUp } from '@/lib/quotes/price';
import { minorToInput, parseMajorToMinor } from '@/lib/units/money';
import { HOLD_DOWN_LABELS, HOLD_DOWNS, type HoldDown, type QuoteStatus } from '@/lib/validation/enums';

interface Data {
  quotes: QuoteView[];
  bases: QuoteBasis[];
}

const STATUS_WORDS: Record<QuoteStatus, string> = { draft: 'Draft', sent: 'Sent', accepted: 'Accepted', declined: 'Declined', expired: 'Expired' };
const STATUS_STYLE: Record<QuoteStatus, string> = {
  draft: 'border-rule text-ink',
  sent: 'border-note text-note',
  accepted: 'border-ok text-ok',
  declined: 'border-fault text-fault',
  expired: 'border-caution text-caution',
};

interface Draft {
  estimateId: number;
  quantity: string;
  partsPerSheet: string;
  holdDown: HoldDown;
  extra: { label: string; amount: string }[];
  revisionOf?: number;
  revisionNumber?: string;
}

function draftFrom(basis: QuoteBasis): Draft {
  return {
    estimateId: basis.estimateId,
    quantity: String(basis.defaults.quantity),
    partsPerSheet: String(basis.defaults.partsPerSheet),
    holdDown: basis.defaults.holdDown,
    extra: [],
  };
}

type Priced = { ok: true; price: PriceBuildUp; body: Record<string, unknown> } | { ok: false; fields: FieldErrors };

function price(draft: Draft, basis: QuoteBasis): Priced {
  const fields: FieldErrors = {};
  const int = (key: string, text: string, label: string) => {
    if (!/^\d+$/.test(text.trim()) || Number(text) < 1) fields[key] = [`Enter the ${label} as a whole number of 1 or more.`];
    return Number(text);
  };
  const quantity = int('quantity', draft.quantity, 'quantity');
  const partsPerSheet = int('partsPerSheet', draft.partsPerSheet, 'parts per sheet');
  const extraLines = draft.extra.map((x, i) => {
    if (!x.label.trim()) fields[`extraLines.${i}.label`] = ['Name the line.'];
    const m = parseMajorToMinor(x.amount, basis.figures.currency);
    if (!m.ok) fields[`extraLines.${i}.amountMinor`] = [m.message];
    return { label: x.label, amountMinor: m.ok ? m.minor : 0 };
  });
  if (Object.keys(fields).length > 0) return { ok: false, fields };
  const inputs = { quantity, partsPerSheet, holdDown: draft.holdDown, extraLines };
  try {
    return { ok: true, price: buildPrice(inputs, basis.figures), body: { estimateId: basis.estimateId, ...inputs, revisionOf: draft.revisionOf } };
  } catch (err) {
    if (err instanceof PriceInputError) return { ok: false, fields: { [err.field]: [err.message] } };
    throw err;
  }
}

async function post<T>(url: string, body?: unknown): Promise<T> {
  return fetcher<T>(url, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body ?? {}) });
}

export function JobQuotes({ jobId, canWrite }: { jobId: number; canWrite: boolean }) {
  const router = useRouter();
  const { data, error, isLoading, mutate } = useSWR<Data, AppError>(`/api/jobs/${jobId}/quotes`, fetcher);
  const [draft, setDraft] = useState<Draft | null>(null);
  const [busy, setBusy] = useState<string | null>(null);
  const [message, setMessage] = useState<{ tone: 'ok' | 'fault'; text: string } | null>(null);
  const [serverFields, setServerFields] = useState<FieldErrors>({});

  const basis = data?.bases.find((b) => b.estimateId === draft?.estimateId) ?? null;
  // what the hold-down comparison says of each method for the draft's estimate (none: not shown)
  const { data: holdDown } = useSWR<HoldDownAnswer, AppError>(draft ? `/api/estimates/${draft.estimateId}/hold-down` : null, fetcher, { shouldRetryOnError: false });
  const compared = holdDown?.availability === 'ready' ? holdDown : null;
  const suggested = compared?.options.find((o) => o.method === compared.recommended) ?? null;
  const holdDownHint = (h: HoldDown) => {
    const o = compared?.options.find((x) => x.holdDown === h);
    return o ? ` (holds ${o.heldParts.length} of ${compared!.partCount}${o.method === compared!.recommended ? ', suggested' : ''})` : '';
  };
  const priced = useMemo(() => (draft && basis ? price(draft, basis) : null), [draft, basis]);
  const fields = { ...(priced && !priced.ok ? priced.fields : {}), ...serverFields };

  async function run(key: string, work: () => Promise<string>) {
    setBusy(key);
    setMessage(null);
    try {
      setMessage({ tone: 'ok', text: await work() });
      await mutate();
      router.refresh();
    } catch (err) {
      const e = err instanceof AppError ? err : new AppError('internal', String(err));
      setServerFields(e.fields ?? {});
      setMessage({ tone: 'fault', text: e.message });
      await mutate();
    } finally {
      setBusy(null);
    }
  }

  if (error) {
    return (
      <section aria-labelledby="quotes-title" className="rounded-md border-2 border-rule bg-panel p-5">
        <h2 id="quotes-title" className="text-lg">Quotes</h2>
        <Notice tone="fault" title="The quotes could not be loaded." role="alert">
          <p>{error.message}</p>
          <Button variant="secondary" className="mt-2" onClick={() => mutate()}>Try again</Button>
        </Notice>
      </section>
    );
  }

  const set = (change: Partial<Draft>) => {
    setServerFields({});
    setDraft((d) => (d ? { ...d, ...change } : d));
  };

  return (
    <section aria-labelledby="quotes-title" className="rounded-md border-2 border-rule bg-panel p-5" data-testid="job-quotes">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 id="quotes-title" className="text-lg">Quotes</h2>
        {canWrite && data && data.bases.length > 0 && !draft ? (
          <Button onClick={() => { setMessage(null); setDraft(draftFrom(data.bases[0]!)); }}>New quote</Button>
        ) : null}
      </div>
      {message ? (
        <div className="mt-3">
          <Notice tone={message.tone} title={message.text} role={message.tone === 'fault' ? 'alert' : 'status'} />
        </div>
      ) : null}

      {isLoading || !data ? (
        <div role="status" className="mt-3 flex items-center gap-3 rounded-md border-2 border-dashed border-rule p-6 text-ink-soft">
          <span aria-hidden="true" className="h-5 w-5 animate-spin rounded-full border-4 border-rule-light border-t-spruce" />
          Loading quotes…
        </div>
      ) : (
        <>
          {data.bases.length === 0 ? (
            <p className="mt-2 text-ink-soft">A quote is built from a finished estimate: upload a program and wait for its estimate.</p>
          ) : null}

          {draft && basis ? (
            <form
              className="mt-4 flex flex-col gap-4 border-t-2 border-rule-light pt-4"
              aria-label="Quote builder"
              onSubmit={(e) => {
                e.preventDefault();
                if (!priced?.ok) return;
                void run('create', async () => {
                  const made = await post<{ quote: QuoteView }>(`/api/jobs/${jobId}/quotes`, priced.body);
                  setDraft(null);
                  return `Quote ${made.quote.number} saved as a draft.`;
                });
              }}
            >
              {draft.revisionNumber ? <p className="font-bold">Revising quote {draft.revisionNumber}</p> : null}
              <div className="grid gap-4 sm:grid-cols-2">
                <SelectField
                  id="quote-estimate"
                  label="Estimate"
                  value={String(draft.estimateId)}
                  errors={fields.estimateId}
                  onChange={(e) => {
                    const b = data.bases.find((x) => x.estimateId === Number(e.target.value));
                    if (b) setDraft({ ...draftFrom(b), extra: draft.extra, revisionOf: draft.revisionOf, revisionNumber: draft.revisionNumber });
                  }}
                  options={data.bases.map((b) => ({
                    value: String(b.estimateId),
                    label: `${b.programName} v${b.programVersion} on ${b.figures.machineName} v${b.machineVersion}: ${formatSeconds(b.figures.secondsPerSheet)} per sheet`,
                  }))}
                />
                <div className="flex flex-col gap-2">
                  <SelectField
                    id="quote-hold-down"
                    label="Hold-down method (labour)"
                    hint={suggested ? `The hold-down comparison suggests ${suggested.label.toLowerCase()}; the hold-down labour follows the method chosen here.` : undefined}
                    value={draft.holdDown}
                    onChange={(e) => set({ holdDown: e.target.value as HoldDown })}
                    options={HOLD_DOWNS.map((h) => ({ value: h, label: `${HOLD_DOWN_LABELS[h]}${holdDownHint(h)}` }))}
                  />
                  {suggested && suggested.holdDown !== draft.holdDown ? (
                    <div>
                      <Button type="button" variant="secondary" onClick={() => set({ holdDown: suggested.holdDown })}>
                        Use {suggested.label.toLowerCase()}
                      </Button>
                    </div>
                  ) : null}
                </div>
                <InputField id="quote-quantity" name="quantity" label="Quantity (pieces)" inputMode="numeric" value={draft.quantity} errors={fields.quantity} onChange={(e) => set({ quantity: e.target.value })} />
                <InputField
                  id="quote-parts-per-sheet"
                  name="partsPerSheet"
                  label="Parts per sheet"
                  hint={`The estimate found ${basis.figures.estimatePartCount} parts in the program.`}
                  inputMode="numeric"
                  value={draft.partsPerSheet}
                  errors={fields.partsPerSheet}
                  onChange={(e) => set({ partsPerSheet: e.target.value })}
                />
              </div>
              <fieldset className="flex flex-col gap-3">
                <legend className="font-bold">Lines of your own</legend>
                {draft.extra.map((x, i) => (
                  <div key={i} className="flex flex-wrap items-end gap-3">
                    <InputField id={`quote-extra-${i}-label`} label="Line" value={x.label} errors={fields[`extraLines.${i}.label`]} onChange={(e) => set({ extra: draft.extra.map((y, j) => (j === i ? { ...y, label: e.target.value } : y)) })} />
                    <InputField id={`quote-extra-${i}-amount`} label={`Amount (${basis.figures.currency})`} inputMode="decimal" value={x.amount} errors={fields[`extraLines.${i}.amountMinor`]} onChange={(e) => set({ extra: draft.extra.map((y, j) => (j === i ? { ...y, amount: e.target.value } : y)) })} />
                    <Button type="button" variant="secondary" onClick={() => set({ extra: draft.extra.filter((_, j) => j !== i) })}>Remove line</Button>
                  </div>
                ))}
                <div>
                  <Button type="button" variant="secondary" onClick={() => set({ extra: [...draft.extra, { label: '', amount: '' }] })}>Add a line</Button>
                </div>
              </fieldset>

              {priced?.ok ? <BuildUp price={priced.price} /> : <Notice tone="caution" title="Fix the fields marked above to see the price." />}
              <p className="text-sm text-ink-soft">The machine time is an estimate from the program and the machine profile; the time on the machine can differ.</p>
              <div className="flex flex-wrap gap-3">
                <Button type="submit" disabled={!priced?.ok || busy !== null}>{busy === 'create' ? 'Saving…' : 'Save draft quote'}</Button>
                <Button type="button" variant="secondary" onClick={() => { setDraft(null); setServerFields({}); }}>Cancel</Button>
              </div>
            </form>
          ) : null}

          {data.quotes.length === 0 ? (
            <p className="mt-3 text-ink-soft">No quotes yet.</p>
          ) : (
            <ul className="mt-4 flex flex-col gap-3" data-testid="quote-list">
              {data.quotes.map((q) => (
                <li key={q.id} className="rounded-md border-2 border-rule-light p-3" data-testid={`quote-${q.number}`}>
                  <div className="flex flex-wrap items-center justify-between gap-3">
                    <p>
                      <span className="font-bold">{q.number}</span>{' '}
                      <span className={`ml-2 rounded border-2 px-2 text-sm font-bold ${STATUS_STYLE[q.status]}`} data-testid="quote-status">{STATUS_WORDS[q.status]}</span>
                      {q.linkRevoked && q.status === 'sent' ? <span className="ml-2 text-sm text-ink-soft">link withdrawn</span> : null}
                    </p>
                    <p className="figure font-bold" data-testid="quote-total">{formatMoney(q.totalMinor, q.currency)}</p>
                  </div>
                  <p className="text-sm text-ink-soft">
                    {q.inputs.quantity} pieces, {q.inputs.partsPerSheet} per sheet
                    {q.revisionOf ? `, revises ${data.quotes.find((o) => o.id === q.revisionOf)?.number ?? 'an earlier quote'}` : ''}
                    {q.validUntil ? `, valid until ${q.validUntil}` : ''}
                  </p>
                  {q.status === 'accepted' ? <p className="mt-1 font-bold text-ok">Accepted by {q.answerName}{q.answerPo ? `, purchase order ${q.answerPo}` : ''}.</p> : null}
                  {q.status === 'declined' ? <p className="mt-1 font-bold text-fault">Declined{q.declineReason ? `: ${q.declineReason}` : '.'}</p> : null}
                  {q.lastMail?.status === 'failed' && q.status === 'draft' ? (
                    <p className="mt-1 text-sm font-bold text-fault" role="alert">Last send to {q.lastMail.toAddress} failed: {q.lastMail.error}</p>
                  ) : null}
                  <div className="mt-2 flex flex-wrap gap-2">
                    <a className="inline-flex min-h-target items-center rounded-md border-2 border-rule px-4 font-bold hover:bg-ground" href={`/api/quotes/${q.id}/pdf`} download>
                      Download PDF
                    </a>
                    {canWrite && q.status === 'draft' ? (
                      <Button disabled={busy !== null} onClick={() => run(`send-${q.id}`, async () => { await post(`/api/quotes/${q.id}/send`); return `Quote ${q.number} sent to the customer.`; })}>
                        {busy === `send-${q.id}` ? 'Sending…' : q.lastMail?.status === 'failed' ? 'Try sending again' : 'Send to customer'}
                      </Button>
                    ) : null}
                    {canWrite && q.status === 'sent' && !q.linkRevoked ? (
                      <Button variant="danger" disabled={busy !== null} onClick={() => run(`revoke-${q.id}`, async () => { await post(`/api/quotes/${q.id}/revoke`); return `The customer link of ${q.number} is withdrawn.`; })}>
                        Withdraw link
                      </Button>
                    ) : null}
                    {canWrite && q.status !== 'accepted' && data.bases.some((b) => b.estimateId === q.estimateId) ? (
                      <Button
                        variant="secondary"
                        onClick={() => {
                          setMessage(null);
                          setDraft({
                            estimateId: q.estimateId,
                            quantity: String(q.inputs.quantity),
                            partsPerSheet: String(q.inputs.partsPerSheet),
                            holdDown: q.inputs.holdDown,
                            extra: q.inputs.extraLines.map((x) => ({ label: x.label, amount: minorToInput(x.amountMinor, q.currency) })),
                            revisionOf: q.id,
                            revisionNumber: q.number,
                          });
                        }}
                      >
                        Revise
                      </Button>
                    ) : null}
                  </div>
                </li>
              ))}
            </ul>
          )}
        </>
      )}
    </section>
  );
}

function BuildUp({ price }: { price: PriceBuildUp }) {
  return (
    <table className="w-full border-collapse text-left" data-testid="quote-build-up">
      <caption className="sr-only">Price build-up</caption>
      <thead>
        <tr className="border-b-2 border-rule text-sm text-ink-soft">
          <th scope="col" className="py-1 pr-3">Line</th>
          <th scope="col" className="py-1 pr-3">How it is computed</th>
          <th scope="col" className="py-1 text-right">Amount</th>
        </tr>
      </thead>
      <tbody>
        {price.lines.map((l) => (
          <tr key={l.key} className={`border-b border-rule-light align-top ${l.key === 'total' ? 'font-bold' : ''}`} data-line={l.key}>
            <th scope="row" className="py-1 pr-3 font-bold">{l.label}</th>
            <td className="figure py-1 pr-3 text-sm">{l.arithmetic}</td>
            <td className="figure whitespace-nowrap py-1 text-right" data-testid={l.key === 'total' ? 'build-up-total' : undefined}>
              {l.amountMinor === null ? '' : formatMoney(l.amountMinor, price.currency)}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
