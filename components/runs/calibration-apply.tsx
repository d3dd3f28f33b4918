'use client';
// Applying a suggested time factor (admin): POST /api/machines/:machineId/calibration with the
// factor shown, which the server checks is still the suggestion. The answer names the new
// machine version; the page is then read again so the profile and versions show it.
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import type { CalibrationApplied } from '@/db/queries/runs';
import type { AppError } from '@/lib/errors';
import { postRun } from './run-api';

export function CalibrationApply({ machineId, suggestedFactor, currentFactor, differs }: { machineId: number; suggestedFactor: number; currentFactor: number; differs: boolean }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [applied, setApplied] = useState<CalibrationApplied | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  if (!differs && !applied) return null;
  return (
    <div className="flex flex-col gap-3">
      {applied ? (
        <Notice tone="ok" title={`Applied: profile version ${applied.version} uses the time factor ${applied.timeFactor.toFixed(3)}.`} role="status">
          Estimates made from now on use version {applied.version}; stored estimates and quotes keep the figures they were made with.
        </Notice>
      ) : null}
      {problem ? <Notice tone="fault" title={problem} role="alert" /> : null}
      {applied || !differs ? null : (
        <Button
          type="button"
          disabled={busy}
          onClick={async () => {
            setBusy(true);
            setProblem(null);
            try {
              const answer = await postRun<{ applied: CalibrationApplied }>(`/api/machines/${machineId}/calibration`, { suggestedFactor });
              setApplied(answer.applied);
              router.refresh();
            } catch (e) {
              setProblem((e as AppError).message);
            } finally {
              setBusy(false);
            }
          }}
        >
          {busy ? 'Applying…' : `Apply × ${suggestedFactor.toFixed(3)} (now × ${currentFactor.toFixed(3)})`}
        </Button>
      )}
    </div>
  );
}
