'use client';
// The runs of a program version, newest first: when, machine, operator, sheets, actual and
// estimated time and their ratio, and what became of the run (finished, interrupted, entered
// afterwards, voided). Each run its user may correct has a correction form (running time in
// minutes, sheets, interrupted, notes, and why); an admin can void a run. The server decides
// (the run's operator on the day it ended, an admin any run) and keeps who changed what; a
// run with changes lists them (who, when, from what to what, why). Laid out as a list, not a
// table, so it reads in the program page's narrow column; times as h:mm:ss like the timer.
import { useRef, useState } from 'react';
import useSWR from 'swr';
import { Button } from '@/components/ui/button';
import { InputField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import type { RunChangeView, RunDetail, RunView } from '@/db/queries/runs';
import type { AppError, FieldErrors } from '@/lib/errors';
import { fetcher } from '@/lib/fetcher';
import { formatWhen } from '@/lib/jobs/format';
import { mayCorrect as mayCorrectRun } from '@/lib/runs/correct-rule';
import { clockFace, parseDurationText } from '@/lib/runs/run-format';
import { postRun, type RunsMe } from './run-api';

function outcomeWords(r: RunView): string {
  if (r.status === 'voided') return `Voided${r.voidReason ? `: ${r.voidReason}` : ''}`;
  return [r.interrupted ? 'Interrupted' : 'Finished', r.manual ? 'entered afterwards' : ''].filter(Boolean).join(', ');
}

function CorrectForm({ run, mayVoid, onChanged }: { run: RunView; mayVoid: boolean; onChanged: () => Promise<unknown> }) {
  // the time as the timer shows it (h:mm:ss): exact to the second, and sent only when edited
  const shownTime = run.actualSeconds !== null ? clockFace(run.actualSeconds) : '';
  const [minutes, setMinutes] = useState(shownTime);
  const [sheets, setSheets] = useState(run.sheetsCut !== null ? String(run.sheetsCut) : '');
  const [interrupted, setInterrupted] = useState(run.interrupted);
  const [notes, setNotes] = useState(run.notes ?? '');
  const [reason, setReason] = useState('');
  const [fields, setFields] = useState<FieldErrors>({});
  const [problem, setProblem] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const details = useRef<HTMLDetailsElement>(null);

  async function send(kind: 'correct' | 'void') {
    setBusy(true);
    setFields({});
    setProblem(null);
    try {
      if (kind === 'void') {
        await postRun(`/api/runs/${run.id}/void`, { reason });
      } else {
        const body: Record<string, unknown> = { reason };
        if (minutes.trim() !== shownTime) {
          const seconds = parseDurationText(minutes);
          if (seconds === null) return setFields({ actualSeconds: ['Enter the running time in minutes (45) or as h:mm:ss (1:05:30).'] });
          body.actualSeconds = seconds;
        }
        const sheetsCut = /^\d+$/.test(sheets.trim()) ? Number(sheets) : sheets;
        if (sheetsCut !== run.sheetsCut) body.sheetsCut = sheetsCut;
        if (interrupted !== run.interrupted) body.interrupted = interrupted;
        if (notes !== (run.notes ?? '')) body.notes = notes;
        await postRun(`/api/runs/${run.id}`, body, 'PATCH');
      }
      // saved: the form closes and the next correction asks for its own reason
      setReason('');
      if (details.current) details.current.open = false;
      await onChanged();
    } catch (e) {
      const err = e as AppError;
      setFields(err.fields ?? {});
      setProblem(err.fields ? (err.fields._form?.[0] ?? null) : err.message);
    } finally {
      setBusy(false);
    }
  }

  return (
    <details className="mt-1" ref={details}>
      <summary className="min-h-target cursor-pointer py-2 font-bold text-spruce">
        Correct<span className="sr-only"> the run of {formatWhen(run.startedAt)}</span>
      </summary>
      <form
        className="flex flex-col gap-2 py-2"
        onSubmit={(e) => {
          e.preventDefault();
          void send('correct');
        }}
      >
        <InputField id={`fix-${run.id}-time`} label="Running time (min, or h:mm:ss)" value={minutes} onChange={(e) => setMinutes(e.target.value)} errors={fields.actualSeconds} />
        <InputField id={`fix-${run.id}-sheets`} label="Sheets cut" inputMode="numeric" value={sheets} onChange={(e) => setSheets(e.target.value)} errors={fields.sheetsCut} />
        <label className="flex min-h-target items-center gap-3 font-bold">
          <input type="checkbox" className="h-6 w-6" checked={interrupted} onChange={(e) => setInterrupted(e.target.checked)} />
          Interrupted
        </label>
        <InputField id={`fix-${run.id}-notes`} label="Notes" value={notes} onChange={(e) => setNotes(e.target.value)} errors={fields.notes} maxLength={2000} />
        <InputField id={`fix-${run.id}-reason`} label="Why (kept with the change)" value={reason} onChange={(e) => setReason(e.target.value)} errors={fields.reason} maxLength={500} />
        {problem ? <Notice tone="fault" title={problem} role="alert" /> : null}
        <div className="flex flex-wrap gap-2">
          <Button type="submit" variant="secondary" disabled={busy}>
            Save correction
          </Button>
          {mayVoid ? (
            <Button type="button" variant="danger" disabled={busy} onClick={() => void send('void')}>
              Void run
            </Button>
          ) : null}
        </div>
      </form>
    </details>
  );
}

function changeWords(c: RunChangeView): string {
  const what = c.field === 'actualSeconds' ? 'running time' : c.field === 'sheetsCut' ? 'sheets cut' : c.field;
  const show = (v: string | null) => {
    if (v === null || v === '') return '(none)';
    return c.field === 'actualSeconds' && /^\d+(\.\d+)?$/.test(v) ? clockFace(Number(v)) : v;
  };
  return `${what}: ${show(c.before)} → ${show(c.after)}`;
}

/** Who changed what on a run (its audit rows from GET /api/runs/:runId), read when opened. */
function RunChanges({ run }: { run: RunView }) {
  const [open, setOpen] = useState(false);
  const { data, error, isLoading } = useSWR<{ run: RunDetail }, AppError>(open ? `/api/runs/${run.id}` : null, fetcher);
  const n = run.changeCount;
  return (
    <details className="mt-1" data-testid="run-changes" onToggle={(e) => setOpen((e.target as HTMLDetailsElement).open)}>
      <summary className="min-h-target cursor-pointer py-2 font-bold text-spruce">
        {n === 1 ? '1 change' : `${n} changes`}: who changed what
      </summary>
      {error ? <Notice tone="fault" title="The changes could not be loaded." role="alert">{error.message}</Notice> : null}
      {isLoading ? <p role="status">Reading the changes…</p> : null}
      {data ? (
        <ol className="flex flex-col gap-1 border-l-2 border-rule-light pl-3" aria-label="Changes, oldest first">
          {data.run.changes.map((c, i) => (
            <li key={i} data-testid="run-change">
              <span className="figure">{formatWhen(c.at)}</span> · <span className="font-bold">{c.userName}</span> · {changeWords(c)}
              {c.reason ? <span className="block text-ink-soft">“{c.reason}”</span> : null}
            </li>
          ))}
        </ol>
      ) : null}
    </details>
  );
}

function Figure({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div>
      <dt className="text-xs text-ink-soft">{label}</dt>
      <dd className="figure font-bold">{children}</dd>
    </div>
  );
}

export function RunsTable({ runs, total, me, onChanged }: { runs: RunView[]; total: number; me: RunsMe; onChanged: () => Promise<unknown> }) {
  if (runs.length === 0) return <p className="text-ink-soft">No finished runs of this version yet.</p>;
  const now = new Date();
  return (
    <section aria-labelledby="earlier-runs-title">
      <h3 id="earlier-runs-title" className="mb-2 text-base font-bold">
        Earlier runs{total > runs.length + 1 ? ` (the latest ${runs.length} of ${total})` : ''}
      </h3>
      <ol className="flex flex-col">
        {runs.map((r) => {
          const ratio = r.actualSeconds !== null && r.estimatedRunSeconds !== null ? r.actualSeconds / r.estimatedRunSeconds : null;
          const mayCorrect = r.status === 'finished' && mayCorrectRun(me, r, now);
          const leftOut = r.status === 'voided' || r.interrupted;
          return (
            <li key={r.id} className="border-t border-rule-light py-3" data-testid="run-row" data-status={r.status}>
              <p>
                <span className="font-bold">{formatWhen(r.startedAt)}</span>{' '}
                <span className={r.status === 'voided' ? 'text-ink-faint line-through' : 'text-ink-soft'}>· {outcomeWords(r)}</span>
              </p>
              <p className="text-sm text-ink-soft">
                {r.machineName} · {r.operatorName} · {r.sheetsCut ?? 0} sheet{r.sheetsCut === 1 ? '' : 's'}
              </p>
              <dl className={`mt-1 grid grid-cols-3 gap-2 ${leftOut ? 'text-ink-soft' : ''}`}>
                <Figure label="Actual">{r.actualSeconds !== null ? clockFace(r.actualSeconds) : '—'}</Figure>
                <Figure label="Estimate">{r.estimatedRunSeconds !== null ? clockFace(r.estimatedRunSeconds) : '—'}</Figure>
                <Figure label={leftOut ? 'Ratio (left out)' : 'Actual ÷ estimate'}>{ratio !== null ? ratio.toFixed(3) : '—'}</Figure>
              </dl>
              {r.notes ? <p className="mt-1 text-sm text-ink-soft">“{r.notes}”</p> : null}
              {r.changeCount > 0 ? <RunChanges run={r} /> : null}
              {mayCorrect || (me.mayCorrectAny && r.status !== 'voided') ? <CorrectForm run={r} mayVoid={me.mayCorrectAny} onChanged={onChanged} /> : null}
            </li>
          );
        })}
      </ol>
    </section>
  );
}
