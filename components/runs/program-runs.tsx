'use client';
// The Runs section of a program page (client part): the open run of this program version
// with its timer (pause, resume, finish with sheets cut, interrupted and notes), the start
// form when none is open, a run entered afterwards, and the version's runs with their
// corrections. Every state comes from the server (GET /api/runs, refreshed every 5 s), so
// a reload or a second device shows the same timer; each button posts one move and shows the
// server's answer (409 when another operator's run holds the machine).
import { useState } from 'react';
import useSWR from 'swr';
import { Button } from '@/components/ui/button';
import { InputField, SelectField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import type { RunPage, RunView } from '@/db/queries/runs';
import type { AppError, FieldErrors } from '@/lib/errors';
import { fetcher } from '@/lib/fetcher';
import { ManualRunForm } from './manual-run-form';
import { postRun, type MachineChoice, type RunsMe } from './run-api';
import { RunClock } from './run-clock';
import { RunsTable } from './runs-table';

const errorOf = (e: unknown) => e as AppError;

function FinishForm({ run, onDone }: { run: RunView; onDone: () => Promise<unknown> }) {
  const [sheets, setSheets] = useState('1');
  const [interrupted, setInterrupted] = useState(false);
  const [notes, setNotes] = useState('');
  const [busy, setBusy] = useState<string | null>(null);
  const [problem, setProblem] = useState<{ message: string; fields?: FieldErrors } | null>(null);

  async function move(kind: 'pause' | 'resume' | 'finish') {
    setBusy(kind);
    setProblem(null);
    try {
      const sheetsCut = /^\d+$/.test(sheets.trim()) ? Number(sheets) : sheets;
      await postRun(`/api/runs/${run.id}/${kind}`, kind === 'finish' ? { sheetsCut, interrupted, ...(notes.trim() ? { notes } : {}) } : undefined);
      await onDone();
    } catch (e) {
      setProblem({ message: errorOf(e).message, fields: errorOf(e).fields });
      await onDone();
    } finally {
      setBusy(null);
    }
  }

  return (
    <form
      className="flex flex-col gap-3"
      aria-label="Finish the run"
      onSubmit={(e) => {
        e.preventDefault();
        void move('finish');
      }}
    >
      <div className="flex flex-wrap gap-2">
        {run.status === 'running' ? (
          <Button type="button" variant="secondary" disabled={busy !== null} onClick={() => void move('pause')}>
            {busy === 'pause' ? 'Pausing…' : 'Pause'}
          </Button>
        ) : (
          <Button type="button" variant="secondary" disabled={busy !== null} onClick={() => void move('resume')}>
            {busy === 'resume' ? 'Resuming…' : 'Resume'}
          </Button>
        )}
      </div>
      <InputField id={`run-${run.id}-sheets`} name="sheetsCut" label="Sheets cut" inputMode="numeric" value={sheets} onChange={(e) => setSheets(e.target.value)} errors={problem?.fields?.sheetsCut} />
      <label className="flex min-h-target items-center gap-3 font-bold">
        <input type="checkbox" className="h-6 w-6" checked={interrupted} onChange={(e) => setInterrupted(e.target.checked)} />
        The run was interrupted (left out of the statistics)
      </label>
      <InputField id={`run-${run.id}-notes`} name="notes" label="Notes (optional)" value={notes} onChange={(e) => setNotes(e.target.value)} errors={problem?.fields?.notes} maxLength={2000} />
      {problem && !problem.fields ? <Notice tone="fault" title={problem.message} role="alert" /> : null}
      <Button type="submit" disabled={busy !== null}>
        {busy === 'finish' ? 'Finishing…' : 'Finish run'}
      </Button>
    </form>
  );
}

function StartForm({ programId, version, machines, defaultMachineId, onDone }: { programId: number; version: number; machines: MachineChoice[]; defaultMachineId: number | null; onDone: () => Promise<unknown> }) {
  const [machineId, setMachineId] = useState(defaultMachineId === null ? '' : String(defaultMachineId));
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<AppError | null>(null);
  if (machines.length === 0) return <Notice tone="note" title="The shop has no machine in use to run on." role="status" />;
  return (
    <form
      className="flex flex-col gap-3"
      aria-label="Start a run"
      onSubmit={async (e) => {
        e.preventDefault();
        setBusy(true);
        setProblem(null);
        try {
          await postRun('/api/runs', { programId, version, machineId: Number(machineId) });
        } catch (err) {
          setProblem(errorOf(err));
        } finally {
          await onDone();
          setBusy(false);
        }
      }}
    >
      <SelectField id="run-machine" name="machineId" label="Machine" value={machineId} onChange={(e) => setMachineId(e.target.value)} options={machines.map((m) => ({ value: String(m.id), label: m.name }))} errors={problem?.fields?.machineId} />
      {problem && !problem.fields ? <Notice tone={problem.code.startsWith('conflict') ? 'caution' : 'fault'} title={problem.message} role="alert" /> : null}
      <Button type="submit" disabled={busy}>
        {busy ? 'Starting…' : 'Start the timer'}
      </Button>
    </form>
  );
}

export function ProgramRuns(props: { programId: number; version: number; machines: MachineChoice[]; defaultMachineId: number | null; initial: RunPage; me: RunsMe }) {
  const { programId, version, machines, defaultMachineId, initial, me } = props;
  const key = `/api/runs?programId=${programId}&version=${version}&perPage=25`;
  const [fetchedAt, setFetchedAt] = useState(() => Date.now());
  const { data, error, isLoading, mutate } = useSWR<RunPage, AppError>(
    key,
    async (url: string) => {
      const page = await fetcher<RunPage>(url);
      setFetchedAt(Date.now());
      return page;
    },
    { fallbackData: initial, refreshInterval: 5000, revalidateOnMount: true },
  );
  const runs = data?.runs ?? [];
  const open = runs.find((r) => r.status === 'running' || r.status === 'paused') ?? null;

  return (
    <section aria-labelledby="runs-title" className="rounded-md border-2 border-rule bg-panel p-5" data-testid="program-runs">
      <h2 id="runs-title" className="text-lg">
        Runs of v{version}
      </h2>
      <p className="mt-1 text-sm text-ink-soft">The timer runs on the server: a reload or another screen shows the same time. Pause it while sheets are loaded so the time compares with the estimate.</p>
      <div className="mt-4 flex flex-col gap-4">
        {error && !data ? <Notice tone="fault" title="The runs could not be loaded." role="alert">{error.message}</Notice> : null}
        {isLoading && !data ? <p role="status">Loading the runs…</p> : null}
        {open ? (
          <>
            <RunClock run={open} fetchedAt={fetchedAt} />
            {me.mayRun && (open.operatorId === me.id || me.mayCorrectAny) ? (
              <FinishForm key={open.id} run={open} onDone={() => mutate()} />
            ) : (
              <Notice tone="note" title={`${open.operatorName} is running this program.`} role="status">
                Only {open.operatorName} or an admin can pause or finish it.
              </Notice>
            )}
          </>
        ) : me.mayRun ? (
          <StartForm programId={programId} version={version} machines={machines} defaultMachineId={defaultMachineId} onDone={() => mutate()} />
        ) : (
          <Notice tone="note" title="No run is open for this version." role="status">
            Operators and admins start runs here.
          </Notice>
        )}
        {me.mayRun ? <ManualRunForm programId={programId} version={version} machines={machines} defaultMachineId={defaultMachineId} onDone={() => mutate()} /> : null}
        <RunsTable runs={runs.filter((r) => r !== open)} total={data?.total ?? 0} me={me} onChanged={() => mutate()} />
      </div>
    </section>
  );
}
