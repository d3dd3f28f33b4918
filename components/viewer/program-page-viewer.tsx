'use client';
// The viewer on the program page: streams the stored file from
// GET /api/programs/:programId/versions/:version/file, runs it in the browser worker on the
// stored estimate's own inputs, and says whether the worker's report and the stored one agree
// exactly (same code, same inputs: the JSON is compared whole), or why not.
import { useCallback, useEffect, useMemo, useState } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import type { EstimateReport } from '@/lib/kinematics/estimate-report';
import { ENGINE_VERSION } from '@/lib/kinematics/version';
import type { EstimateJob } from '@/lib/estimate/run-estimate';
import type { MachineProfile } from '@/lib/validation/machine-profile';
import { compareReports, type ReportComparison } from '@/lib/viewer/compare-reports';
import type { ViewerInput, ViewerResult } from '@/lib/viewer/view-run';
import { ProgramViewer } from './program-viewer';

export interface ProgramPageViewerProps {
  programId: number;
  version: number;
  name: string;
  profile: MachineProfile;
  job: EstimateJob;
  /** the stored estimate to compare with (done ones only), or null */
  stored: { id: number; engineVersion: string } | null;
}

type Load<T> = { status: 'loading' } | { status: 'ok'; value: T } | { status: 'failed'; message: string };

async function readError(res: Response): Promise<string> {
  try {
    const body = (await res.json()) as { error?: { message?: string } };
    return body.error?.message ?? `The server answered ${res.status}.`;
  } catch {
    return `The server answered ${res.status}.`;
  }
}

export function ProgramPageViewer({ programId, version, name, profile, job, stored }: ProgramPageViewerProps) {
  const [file, setFile] = useState<Load<Blob>>({ status: 'loading' });
  const [storedReport, setStoredReport] = useState<Load<EstimateReport | null>>({ status: stored ? 'loading' : 'ok', value: null } as Load<EstimateReport | null>);
  const [result, setResult] = useState<ViewerResult | null>(null);
  const [attempt, setAttempt] = useState(0);

  useEffect(() => {
    let live = true;
    fetch(`/api/programs/${programId}/versions/${version}/file`, { cache: 'no-store' })
      .then(async (res) => {
        if (!res.ok) throw new Error(await readError(res));
        const blob = await res.blob();
        if (live) setFile({ status: 'ok', value: blob });
      })
      .catch((err: Error) => live && setFile({ status: 'failed', message: err.message }));
    return () => {
      live = false;
    };
  }, [programId, version, attempt]);

  useEffect(() => {
    if (!stored) return;
    let live = true;
    fetch(`/api/estimates/${stored.id}`, { cache: 'no-store' })
      .then(async (res) => {
        if (!res.ok) throw new Error(await readError(res));
        // GET /api/estimates/:id puts the stored report inside the estimate
        const body = (await res.json()) as { estimate?: { report?: EstimateReport } };
        if (live) setStoredReport({ status: 'ok', value: body.estimate?.report ?? null });
      })
      .catch((err: Error) => live && setStoredReport({ status: 'failed', message: err.message }));
    return () => {
      live = false;
    };
  }, [stored]);

  const input = useMemo<ViewerInput>(() => ({ name, profile, job }), [name, profile, job]);
  const onResult = useCallback((r: ViewerResult) => setResult(r), []);

  let comparison: ReportComparison | null = null;
  if (result && storedReport.status === 'ok' && storedReport.value) comparison = compareReports(storedReport.value, result.report);

  return (
    <div className="flex flex-col gap-4">
      <section aria-labelledby="agree-title" className="rounded-md border-2 border-rule bg-panel p-4" data-testid="figures-agree">
        <h2 id="agree-title" className="text-lg">
          This view and the stored estimate
        </h2>
        <div className="mt-2">
          {!stored ? (
            <p>No finished estimate is stored for this version, so there is nothing to compare; the view uses the job’s settings and the machine’s current profile.</p>
          ) : stored.engineVersion !== ENGINE_VERSION ? (
            <Notice tone="caution" title="The figures may differ: the engine changed." role="status">
              The stored estimate was made with engine {stored.engineVersion}; this view runs engine {ENGINE_VERSION}. Request a new estimate on the job page for figures from the same engine.
            </Notice>
          ) : storedReport.status === 'failed' ? (
            <Notice tone="fault" title="The stored report could not be read." role="alert">
              {storedReport.message}
            </Notice>
          ) : storedReport.status === 'ok' && !storedReport.value ? (
            <p>The stored estimate has no report to compare with.</p>
          ) : !result || storedReport.status === 'loading' ? (
            <p className="text-ink-soft">Comparing once the view has its figures…</p>
          ) : comparison?.identical ? (
            <Notice tone="ok" title="They agree exactly." role="status">
              The worker in this browser ran the same engine ({ENGINE_VERSION}) on the same file, machine profile and job settings, and its report is identical to the stored one, every figure, finding and part.
            </Notice>
          ) : (
            <Notice tone="caution" title="They do not agree." role="status">
              <p>Same engine ({ENGINE_VERSION}) and the same inputs should give the same report; these differ:</p>
              <ul className="ml-5 list-disc">
                {comparison?.differences.map((d) => (
                  <li key={d}>{d}</li>
                ))}
              </ul>
            </Notice>
          )}
        </div>
      </section>
      {file.status === 'failed' ? (
        <Notice tone="fault" title="The stored program file could not be read." role="alert">
          <p>{file.message}</p>
          <Button variant="secondary" className="mt-2" onClick={() => {
              setFile({ status: 'loading' });
              setAttempt((a) => a + 1);
            }}>
            Try again
          </Button>
        </Notice>
      ) : file.status === 'loading' ? (
        <div role="status" className="rounded-md border-2 border-dashed border-rule p-6 text-ink-soft">
          Fetching the stored program file…
        </div>
      ) : (
        <ProgramViewer file={file.value} input={input} onResult={onResult} />
      )}
    </div>
  );
}
