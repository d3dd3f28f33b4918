'use client';
// A run entered afterwards by hand (POST /api/runs/manual): the machine, when it started (UTC,
// the clock pages show), and when it ended or how long it took, with sheets cut, whether it
// was interrupted and notes. The server's field errors are shown at their fields.
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { InputField, SelectField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import type { AppError, FieldErrors } from '@/lib/errors';
import { parseDurationText } from '@/lib/runs/run-format';
import { postRun, type MachineChoice } from './run-api';

export function ManualRunForm({ programId, version, machines, defaultMachineId, onDone }: { programId: number; version: number; machines: MachineChoice[]; defaultMachineId: number | null; onDone: () => Promise<unknown> }) {
  const [machineId, setMachineId] = useState(defaultMachineId === null ? '' : String(defaultMachineId));
  const [start, setStart] = useState('');
  const [end, setEnd] = useState('');
  const [duration, setDuration] = useState('');
  const [sheets, setSheets] = useState('1');
  const [interrupted, setInterrupted] = useState(false);
  const [notes, setNotes] = useState('');
  const [busy, setBusy] = useState(false);
  const [fields, setFields] = useState<FieldErrors>({});
  const [outcome, setOutcome] = useState<{ ok: boolean; message: string } | null>(null);
  if (machines.length === 0) return null;

  async function submit() {
    const local: FieldErrors = {};
    const seconds = duration.trim() === '' ? undefined : parseDurationText(duration);
    if (seconds === null) local.durationSeconds = ['Enter the duration in minutes (45) or as h:mm:ss (1:05:30).'];
    if (Object.keys(local).length > 0) return setFields(local);
    setBusy(true);
    setFields({});
    setOutcome(null);
    try {
      await postRun('/api/runs/manual', {
        programId,
        version,
        machineId: Number(machineId),
        startedAt: start,
        ...(end.trim() ? { finishedAt: end } : {}),
        ...(seconds !== undefined ? { durationSeconds: seconds } : {}),
        sheetsCut: /^\d+$/.test(sheets.trim()) ? Number(sheets) : sheets,
        interrupted,
        ...(notes.trim() ? { notes } : {}),
      });
      setOutcome({ ok: true, message: 'Run saved.' });
      setStart('');
      setEnd('');
      setDuration('');
      setNotes('');
      await onDone();
    } catch (e) {
      const err = e as AppError;
      setFields(err.fields ?? {});
      setOutcome({ ok: false, message: err.message });
    } finally {
      setBusy(false);
    }
  }

  return (
    <details className="rounded-md border-2 border-rule-light p-3">
      <summary className="min-h-target cursor-pointer py-2 font-bold text-spruce">Enter a run afterwards</summary>
      <form
        className="mt-3 flex flex-col gap-3"
        aria-label="Enter a run afterwards"
        onSubmit={(e) => {
          e.preventDefault();
          void submit();
        }}
      >
        <SelectField id="manual-machine" name="machineId" label="Machine" value={machineId} onChange={(e) => setMachineId(e.target.value)} options={machines.map((m) => ({ value: String(m.id), label: m.name }))} errors={fields.machineId} />
        <InputField id="manual-start" name="startedAt" type="datetime-local" step={1} label="Started (UTC)" value={start} onChange={(e) => setStart(e.target.value)} errors={fields.startedAt} required />
        <InputField id="manual-end" name="finishedAt" type="datetime-local" step={1} label="Ended (UTC)" hint="Or leave it empty and give the duration." value={end} onChange={(e) => setEnd(e.target.value)} errors={fields.finishedAt} />
        <InputField id="manual-duration" name="durationSeconds" label="Duration (min, or h:mm:ss)" inputMode="decimal" value={duration} onChange={(e) => setDuration(e.target.value)} errors={fields.durationSeconds} />
        <InputField id="manual-sheets" name="sheetsCut" label="Sheets cut" inputMode="numeric" value={sheets} onChange={(e) => setSheets(e.target.value)} errors={fields.sheetsCut} />
        <label className="flex min-h-target items-center gap-3 font-bold">
          <input type="checkbox" className="h-6 w-6" checked={interrupted} onChange={(e) => setInterrupted(e.target.checked)} />
          The run was interrupted
        </label>
        <InputField id="manual-notes" name="notes" label="Notes (optional)" value={notes} onChange={(e) => setNotes(e.target.value)} errors={fields.notes} maxLength={2000} />
        {outcome ? <Notice tone={outcome.ok ? 'ok' : 'fault'} title={outcome.message} role={outcome.ok ? 'status' : 'alert'} /> : null}
        <Button type="submit" variant="secondary" disabled={busy}>
          {busy ? 'Saving…' : 'Save the run'}
        </Button>
      </form>
    </details>
  );
}
