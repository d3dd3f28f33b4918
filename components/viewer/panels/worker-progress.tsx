'use client';
// The worker's progress while it reads, plans and checks the program: a progressbar that
// assistive technology reads (aria-valuenow 0–100), the stage in words, and a cancel button.
import { Button } from '@/components/ui/button';
import type { ViewerProgress } from '@/lib/viewer/view-run';

export function WorkerProgress({ progress, onCancel }: { progress: ViewerProgress; onCancel?: () => void }) {
  const value = Math.max(0, Math.min(100, Math.round(progress.percent)));
  return (
    <div className="rounded-md border-2 border-rule bg-panel p-4" data-testid="viewer-progress">
      <p className="font-bold" id="viewer-progress-label">
        {progress.stage}…
      </p>
      <div className="mt-2 flex items-center gap-3">
        <progress
          role="progressbar"
          aria-labelledby="viewer-progress-label"
          aria-valuemin={0}
          aria-valuemax={100}
          aria-valuenow={value}
          max={100}
          value={value}
          className="h-4 w-full flex-1 overflow-hidden rounded-full border-2 border-rule bg-ground [&::-moz-progress-bar]:bg-note [&::-webkit-progress-bar]:bg-ground [&::-webkit-progress-value]:bg-note"
        />
        <span className="figure w-14 shrink-0 text-right text-sm text-ink-soft">{value}%</span>
        {onCancel ? (
          <Button variant="secondary" onClick={onCancel}>
            Cancel
          </Button>
        ) : null}
      </div>
    </div>
  );
}
