'use client';
// The job's programs (GET /api/jobs/[jobId]/programs, SWR) with the latest estimate of each,
// and the upload widget for roles that may upload. A stored upload refreshes the list here and
// the server-rendered parts of the page (status, history) through router.refresh().
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useCallback } from 'react';
import useSWR from 'swr';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import type { AppError } from '@/lib/errors';
import { fetcher } from '@/lib/fetcher';
import { formatBytes, formatWhen } from '@/lib/jobs/format';
import type { EstimateStatus } from '@/lib/validation/enums';
import { EstimatePanel } from './estimate-panel';
import { UploadWidget } from './upload-widget';

interface ProgramItem {
  id: number;
  name: string;
  latestVersion: number;
  latest: { version: number; sha256: string; bytes: number; lines: number; createdAt: string; estimate: { id: number; status: EstimateStatus } | null };
}

interface Props {
  jobId: number;
  canUpload: boolean;
  canRequestEstimates: boolean;
  maxUploadBytes: number;
  uploadRoles: string;
}

export function ProgramsPanel({ jobId, canUpload, canRequestEstimates, maxUploadBytes, uploadRoles }: Props) {
  const router = useRouter();
  const { data, error, isLoading, mutate } = useSWR<{ programs: ProgramItem[] }, AppError>(`/api/jobs/${jobId}/programs`, fetcher);
  const onStored = useCallback(() => {
    void mutate();
    router.refresh();
  }, [mutate, router]);

  let list: React.ReactNode;
  if (error) {
    list = (
      <Notice tone="fault" title="The programs could not be loaded." role="alert">
        <p>{error.message}</p>
        <Button variant="secondary" className="mt-2" onClick={() => mutate()}>
          Try again
        </Button>
      </Notice>
    );
  } else if (isLoading || !data) {
    list = (
      <div role="status" className="flex items-center gap-3 rounded-md border-2 border-dashed border-rule p-6 text-ink-soft">
        <span aria-hidden="true" className="h-5 w-5 animate-spin rounded-full border-4 border-rule-light border-t-spruce" />
        Loading programs…
      </div>
    );
  } else if (data.programs.length === 0) {
    list = (
      <Notice tone="note" title="No programs yet." role="status">
        {canUpload ? 'Upload the G-code for this job above; each file gets an estimate for the job’s machine.' : `${uploadRoles} uploads the G-code for this job.`}
      </Notice>
    );
  } else {
    list = (
      <ul className="flex flex-col gap-6" aria-label="Programs of this job">
        {data.programs.map((p) => (
          <li key={p.id} className="rounded-md border-2 border-rule bg-panel p-5" data-testid="program" data-program-name={p.name}>
            <div className="flex flex-wrap items-baseline justify-between gap-3 border-b-2 border-rule-light pb-3">
              <h4 className="break-all font-mono text-lg font-bold">
                <Link href={`/jobs/${jobId}/programs/${p.id}`} className="text-spruce underline underline-offset-4" data-testid="program-link">
                  {p.name}
                </Link>
              </h4>
              <p className="text-sm text-ink-soft">
                <span className="figure">v{p.latest.version}</span> · <span className="figure">{p.latest.lines.toLocaleString('en')}</span> lines ·{' '}
                <span className="figure">{formatBytes(p.latest.bytes)}</span> · uploaded {formatWhen(p.latest.createdAt)} ·{' '}
                <a className="font-bold text-spruce underline underline-offset-4" href={`/api/programs/${p.id}/versions/${p.latest.version}/file`}>
                  Download
                </a>
              </p>
            </div>
            <div className="pt-3">
              {p.latest.estimate ? (
                <EstimatePanel estimateId={p.latest.estimate.id} programId={p.id} canRetry={canRequestEstimates} />
              ) : (
                <Notice tone="caution" title="No estimate for this version." role="status">
                  The shop has no machine to estimate on. Add one on the machines page.
                </Notice>
              )}
            </div>
          </li>
        ))}
      </ul>
    );
  }

  return (
    <section aria-labelledby="programs-title" className="flex flex-col gap-4">
      <h2 id="programs-title">Programs and estimates</h2>
      {canUpload ? <UploadWidget jobId={jobId} maxBytes={maxUploadBytes} onStored={onStored} /> : null}
      {list}
    </section>
  );
}
