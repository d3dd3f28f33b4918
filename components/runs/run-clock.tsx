'use client';
// The run timer's face: the running time from the server's events, counted on in the browser
// from the server's clock (the offset between the two is taken when the run was read), so a
// reload or a second screen shows the same time. Its look is Kerfcast's own: the night panel
// with one large mono figure, the state said in words with a mark of its own outline
// (docs/style.md: colour is never the only signal; no run-light colours).
import { useEffect, useState } from 'react';
import type { RunView } from '@/db/queries/runs';
import { clockFace } from '@/lib/runs/run-format';
import { runningSeconds } from '@/lib/runs/timer';

function StateMark({ paused }: { paused: boolean }) {
  // timing: a ring with a quarter sweep; paused: two upright bars in a ring. Both outlined.
  return (
    <svg aria-hidden="true" viewBox="0 0 24 24" className="h-7 w-7 shrink-0" fill="none" stroke="currentColor" strokeWidth="2.5">
      <circle cx="12" cy="12" r="10" />
      {paused ? (
        <path d="M9.5 7.5v9M14.5 7.5v9" />
      ) : (
        <path d="M12 12V4.5A7.5 7.5 0 0 1 19.5 12Z" fill="currentColor" strokeWidth="1.5" />
      )}
    </svg>
  );
}

export function RunClock({ run, fetchedAt }: { run: RunView; fetchedAt: number }) {
  const offsetMs = Date.parse(run.serverNow) - fetchedAt;
  const paused = run.status === 'paused';
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    if (paused) return;
    const timer = setInterval(() => setNow(Date.now()), 1000);
    return () => clearInterval(timer);
  }, [paused]);
  const seconds = run.events.length > 0 ? runningSeconds(run.events, now + offsetMs) : run.runningSeconds;
  const estimate = run.estimateSeconds;
  return (
    <div className="rounded-md bg-night p-4 text-white" data-testid="run-clock" data-state={run.status}>
      <p className="flex items-center gap-2 font-bold">
        <StateMark paused={paused} />
        <span data-testid="run-state">{paused ? 'Paused' : 'Timing'}</span>
        <span className="font-normal text-night-edge">· {run.machineName}</span>
      </p>
      <p className="figure mt-2 text-3xl" role="timer" aria-live="off" aria-label={`Running time ${clockFace(seconds)}`} data-testid="run-time">
        {clockFace(seconds)}
      </p>
      <p className="mt-1 text-sm text-white">
        Started {run.startedAt.slice(11, 16)} UTC by {run.operatorName}
        {estimate !== null ? ` · estimate ${clockFace(estimate)} a sheet` : ' · no stored estimate to compare with'}
      </p>
    </div>
  );
}
