'use client';
// The status steps this user may take on the job now (worked out on the server from
// lib/jobs/status-moves.ts), as buttons. A step is sent as PATCH /api/jobs/[jobId] { status };
// the page then reloads its server parts (header, history). Cancelling asks once more.
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { fetcher } from '@/lib/fetcher';
import type { JobStatus } from '@/lib/validation/enums';

export function StatusActions({ jobId, moves }: { jobId: number; moves: { to: JobStatus; verb: string }[] }) {
  const router = useRouter();
  const [busy, setBusy] = useState<JobStatus | null>(null);
  const [confirmCancel, setConfirmCancel] = useState(false);
  const [message, setMessage] = useState<string | null>(null);

  async function move(to: JobStatus) {
    setBusy(to);
    setMessage(null);
    try {
      await fetcher(`/api/jobs/${jobId}`, { method: 'PATCH', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ status: to }) });
      setConfirmCancel(false);
      router.refresh();
    } catch (e) {
      setMessage((e as Error).message);
    } finally {
      setBusy(null);
    }
  }

  if (moves.length === 0) return null;
  return (
    <div className="flex flex-col gap-2" data-testid="status-actions">
      <div className="flex flex-wrap gap-2">
        {moves.map((m) =>
          m.to === 'cancelled' ? (
            <Button key={m.to} variant="danger" disabled={busy !== null} aria-expanded={confirmCancel} onClick={() => setConfirmCancel((v) => !v)}>
              {m.verb}
            </Button>
          ) : (
            <Button key={m.to} variant="secondary" disabled={busy !== null} onClick={() => move(m.to)}>
              {busy === m.to ? 'Saving…' : m.verb}
            </Button>
          ),
        )}
      </div>
      {confirmCancel ? (
        <div role="group" aria-label="Confirm cancelling" className="flex flex-wrap items-center gap-2 rounded-md border-2 border-fault bg-fault-tint p-3">
          <p className="font-bold">Cancel this job? It stays in the list, marked cancelled, and can no longer be edited.</p>
          <Button variant="danger" disabled={busy !== null} onClick={() => move('cancelled')}>
            {busy === 'cancelled' ? 'Cancelling…' : 'Yes, cancel the job'}
          </Button>
          <Button variant="secondary" onClick={() => setConfirmCancel(false)}>
            Keep the job
          </Button>
        </div>
      ) : null}
      {message ? <Notice tone="fault" title={message} role="alert" /> : null}
    </div>
  );
}
