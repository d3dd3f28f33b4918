'use client';
// The stored estimate's two times side by side on the program page (issue 15 point 3): the
// raw time the engine computed from the machine profile and the calibrated time (raw × the
// profile version's time factor), with the factor named. When the machine has a newer profile
// version than the one the estimate was made on (a calibration applied, a profile edited),
// it says so and, for roles that request estimates, asks for the estimate on the current
// version: the request is queued (POST /api/programs/:id/estimates), its progress is followed
// (GET /api/estimates/:id) and the page is read again once it is done, so the new estimate's
// raw and calibrated times show here.
import { useRouter } from 'next/navigation';
import { useEffect, useState } from 'react';
import useSWR from 'swr';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { ProgressBar } from '@/components/ui/progress-bar';
import type { AppError } from '@/lib/errors';
import { fetcher } from '@/lib/fetcher';
import { formatDuration } from '@/lib/jobs/format';
import { pollInterval, type EstimateView } from '@/lib/jobs/estimate-view';

export interface EstimateTimesProps {
  programId: number;
  version: number;
  totalSeconds: number | null;
  calibratedSeconds: number | null;
  /** the time factor of the machine version the estimate was made on */
  timeFactor: number;
  machine: { id: number; name: string; estimateVersion: number; currentVersion: number; currentTimeFactor: number } | null;
  canRequest: boolean;
}

const factorText = (f: number) => `× ${f.toFixed(3)}`;

function Following({ estimateId, onDone }: { estimateId: number; onDone: () => void }) {
  const { data, error } = useSWR<{ estimate: EstimateView }, AppError>(`/api/estimates/${estimateId}`, fetcher, {
    refreshInterval: (latest) => pollInterval(latest?.estimate.status) || (latest ? 0 : 1500),
  });
  const status = data?.estimate.status;
  useEffect(() => {
    if (status === 'done') onDone();
  }, [status, onDone]);
  if (error) return <p className="font-bold text-fault" role="alert">{error.message}</p>;
  if (status === 'failed') return <p className="font-bold text-fault" role="alert">The estimate failed: {data?.estimate.error ?? 'no reason given'}.</p>;
  if (status === 'done') return <p role="status">Done; reading the new figures…</p>;
  return (
    <div role="status" className="flex flex-col gap-1">
      <p>Estimating on the current profile…</p>
      <ProgressBar value={data ? data.estimate.progress : null} label="Estimate progress" text={data ? `${Math.round(data.estimate.progress * 100)} %` : 'queued'} />
    </div>
  );
}

export function EstimateTimes({ programId, version, totalSeconds, calibratedSeconds, timeFactor, machine, canRequest }: EstimateTimesProps) {
  const router = useRouter();
  const [requested, setRequested] = useState<{ state: 'idle' } | { state: 'busy' } | { state: 'following'; id: number } | { state: 'failed'; message: string }>({ state: 'idle' });
  const stale = machine !== null && machine.currentVersion > machine.estimateVersion;

  async function request() {
    if (!machine) return;
    setRequested({ state: 'busy' });
    try {
      const answer = await fetcher<{ estimate: { id: number; status: string } }>(`/api/programs/${programId}/estimates`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ machineId: machine.id, version }),
      });
      if (answer.estimate.status === 'done') router.refresh();
      else setRequested({ state: 'following', id: answer.estimate.id });
    } catch (e) {
      setRequested({ state: 'failed', message: (e as AppError).message });
    }
  }

  return (
    <div className="border-t border-rule-light py-2" data-testid="estimate-times">
      <dl className="grid grid-cols-2 gap-3">
        <div>
          <dt className="text-sm text-ink-soft">Raw machine time</dt>
          <dd className="figure font-bold" data-testid="estimate-raw">{totalSeconds !== null ? formatDuration(totalSeconds) : '—'}</dd>
          <dd className="text-xs text-ink-soft">from the profile</dd>
        </div>
        <div>
          <dt className="text-sm text-ink-soft">Calibrated time</dt>
          <dd className="figure font-bold" data-testid="estimate-calibrated">{calibratedSeconds !== null ? formatDuration(calibratedSeconds) : '—'}</dd>
          <dd className="text-xs text-ink-soft" data-testid="estimate-factor">raw {factorText(timeFactor)}</dd>
        </div>
      </dl>
      {stale && machine ? (
        <div className="mt-3">
          <Notice tone="caution" title={`${machine.name} is now at profile version ${machine.currentVersion} (time factor ${machine.currentTimeFactor.toFixed(3)}).`} role="status">
            <p>This estimate was made on version {machine.estimateVersion}; quotes made from it keep their figures.</p>
            {canRequest ? (
              <div className="mt-2 flex flex-col gap-2">
                {requested.state === 'following' ? (
                  <Following estimateId={requested.id} onDone={() => router.refresh()} />
                ) : (
                  <Button variant="secondary" onClick={() => void request()} disabled={requested.state === 'busy'}>
                    {requested.state === 'busy' ? 'Requesting…' : `Estimate on profile version ${machine.currentVersion}`}
                  </Button>
                )}
                {requested.state === 'failed' ? <p className="font-bold text-fault" role="alert">{requested.message}</p> : null}
              </div>
            ) : (
              <p className="mt-1">A programmer, estimator or admin can request the estimate on the current version.</p>
            )}
          </Notice>
        </div>
      ) : null}
    </div>
  );
}
