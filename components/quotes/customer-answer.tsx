'use client';
// The customer's answer to a quote: accept (name, optional purchase-order number) or decline
// (optional reason), once, through POST /api/q/[token]. The answer replaces the form.
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { InputField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { AppError, type FieldErrors } from '@/lib/errors';
import { fetcher } from '@/lib/fetcher';

export function CustomerAnswer({ token }: { token: string }) {
  const router = useRouter();
  const [mode, setMode] = useState<'accept' | 'decline'>('accept');
  const [name, setName] = useState('');
  const [po, setPo] = useState('');
  const [reason, setReason] = useState('');
  const [busy, setBusy] = useState(false);
  const [fields, setFields] = useState<FieldErrors>({});
  const [problem, setProblem] = useState<string | null>(null);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    if (mode === 'accept' && !name.trim()) {
      setFields({ name: ['Enter your name.'] });
      return;
    }
    setBusy(true);
    setProblem(null);
    try {
      const body = mode === 'accept' ? { answer: 'accept', name, purchaseOrder: po || undefined } : { answer: 'decline', reason: reason || undefined };
      await fetcher(`/api/q/${encodeURIComponent(token)}`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
      router.refresh();
    } catch (err) {
      const ae = err instanceof AppError ? err : new AppError('internal', String(err));
      setFields(ae.fields ?? {});
      setProblem(ae.message);
      if (ae.status === 409 || ae.status === 404) router.refresh();
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} className="flex flex-col gap-4 rounded-md border-2 border-rule p-4" aria-label="Your answer">
      <fieldset className="flex flex-wrap gap-6">
        <legend className="mb-2 font-bold">Your answer</legend>
        <label className="flex min-h-target items-center gap-2">
          <input type="radio" name="answer" value="accept" checked={mode === 'accept'} onChange={() => setMode('accept')} /> Accept the quote
        </label>
        <label className="flex min-h-target items-center gap-2">
          <input type="radio" name="answer" value="decline" checked={mode === 'decline'} onChange={() => setMode('decline')} /> Decline it
        </label>
      </fieldset>
      {mode === 'accept' ? (
        <>
          <InputField id="answer-name" label="Your name" autoComplete="name" value={name} errors={fields.name} onChange={(e) => setName(e.target.value)} />
          <InputField id="answer-po" label="Purchase-order number (optional)" value={po} errors={fields.purchaseOrder} onChange={(e) => setPo(e.target.value)} />
        </>
      ) : (
        <InputField id="answer-reason" label="Reason (optional)" value={reason} errors={fields.reason} onChange={(e) => setReason(e.target.value)} />
      )}
      {problem ? <Notice tone="fault" title={problem} role="alert" /> : null}
      <p className="text-sm text-ink-soft">You can answer once; the shop sees your answer at once.</p>
      <div>
        <Button type="submit" disabled={busy}>{busy ? 'Sending…' : mode === 'accept' ? 'Accept the quote' : 'Decline the quote'}</Button>
      </div>
    </form>
  );
}
