'use client';
// The runs of a program version, newest first: when, machine, operator, sheets, actual and
// estimated time and their ratio, and what became of the run (finished, interrupted, entered
// afterwards, voided). Each run its user may correct has a correction form (running time in
// minutes, sheets, interrupted, notes, and why); an admin can void a run. The server decides
// (the run's operator on the day it ended, an admin any run) and keeps who changed what.
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { InputField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import type { RunView } from '@/db/queries/runs';
import type { AppError, FieldErrors } from '@/lib/errors';
import { formatDuration, formatWhen } from '@/lib/jobs/format';
import { mayCorrect as mayCorrectRun } from '@/lib/runs/correct-rule';
import { parseDurationText } from '@/lib/runs/run-format';
import { postRun, type RunsMe } from './run-api';

function outcomeWords(r: RunView): string {
  if (r.status === 'voided') return `Voided${r.voidReason ? `: ${r.voidReason}` : ''}`;
  return [r.interrupted ? 'Interrupted' : 'Finished', r.manual ? 'entered afterwards' : ''].filter(Boolean).join(', ');
}

function CorrectForm({ run, mayVoid, onChanged }: { run: RunView; mayVoid: boolean; onChanged: () => Promise<unknown> }) {
  const [minutes, setMinutes] = useState(run.actualSeconds !== null ? String(Math.round((run.actualSeconds / 60) * 10) / 10) : '');
  const [sheets, setSheets] = useState(run.sheetsCut !== null ? String(run.sheetsCut) : '');
  const [interrupted, setInterrupted] = useState(run.interrupted);
  const [notes, setNotes] = useState(run.notes ?? '');
  const [reason, setReason] = useState('');
  const [fields, setFields] = useState<FieldErrors>({});
  const [problem, setProblem] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function send(kind: 'correct' | 'void') {
    setBusy(true);
    setFields({});
    setProblem(null);
    try {
      if (kind === 'void') {
        await postRun(`/api/runs/${run.id}/void`, { reason });
      } else {
        const seconds = parseDurationText(minutes);
        const body: Record<string, unknown> = { reason };
        if (seconds === null) return setFields({ actualSeconds: ['Enter the running time in minutes (45) or as h:mm:ss (1:05:30).'] });
        if (run.actualSeconds === null || Math.abs(seconds - run.actualSeconds) >= 1) body.actualSeconds = seconds;
        const sheetsCut = /^\d+$/.test(sheets.trim()) ? Number(sheets) : sheets;
        if (sheetsCut !== run.sheetsCut) body.sheetsCut = sheetsCut;
        if (interrupted !== run.interrupted) body.interrupted = interrupted;
        if (notes !== (run.notes ?? '')) body.notes = notes;
        await postRun(`/api/runs/${run.id}`, body, 'PATCH');
      }
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
    <details className="mt-1">
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

export function RunsTable({ runs, total, me, onChanged }: { runs: RunView[]; total: number; me: RunsMe; onChanged: () => Promise<unknown> }) {
  if (runs.length === 0) return <p className="text-ink-soft">No finished runs of this version yet.</p>;
  const now = new Date();
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="mb-2 text-left font-bold">
          Earlier runs{total > runs.length + 1 ? ` (the latest ${runs.length} of ${total})` : ''}
        </caption>
        <thead className="bg-night text-white">
          <tr>
            <th scope="col" className="p-2">Run</th>
            <th scope="col" className="p-2 text-right">Actual</th>
            <th scope="col" className="p-2 text-right">Estimate</th>
            <th scope="col" className="p-2 text-right">Actual ÷ estimate</th>
          </tr>
        </thead>
        <tbody>
          {runs.map((r) => {
            const ratio = r.actualSeconds !== null && r.estimatedRunSeconds !== null ? r.actualSeconds / r.estimatedRunSeconds : null;
            const mayCorrect = r.status === 'finished' && mayCorrectRun(me, r, now);
            return (
              <tr key={r.id} className="border-b border-rule-light align-top" data-testid="run-row" data-status={r.status}>
                <td className="p-2">
                  <span className="font-bold">{formatWhen(r.startedAt)}</span>
                  <br />
                  {r.machineName} · {r.operatorName} · {r.sheetsCut ?? 0} sheet{r.sheetsCut === 1 ? '' : 's'}
                  <br />
                  <span className={r.status === 'voided' ? 'text-ink-faint line-through' : 'text-ink-soft'}>{outcomeWords(r)}</span>
                  {r.notes ? <span className="block text-ink-soft">“{r.notes}”</span> : null}
                  {mayCorrect || (me.mayCorrectAny && r.status !== 'voided') ? <CorrectForm run={r} mayVoid={me.mayCorrectAny} onChanged={onChanged} /> : null}
                </td>
                <td className="figure p-2 text-right">{r.actualSeconds !== null ? formatDuration(r.actualSeconds) : '—'}</td>
                <td className="figure p-2 text-right">{r.estimatedRunSeconds !== null ? formatDuration(r.estimatedRunSeconds) : '—'}</td>
                <td className="figure p-2 text-right">{ratio !== null ? ratio.toFixed(3) : '—'}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
