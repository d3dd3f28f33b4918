// The calibration panel of a machine page (server part): the suggested time factor from the
// machine's last N uninterrupted runs (median actual ÷ uncalibrated estimate), the runs it
// comes from, the interquartile range, the plain-words note, the factor and profile version
// in use, and for admins the button that applies it as a new machine version.
import { Notice } from '@/components/ui/notice';
import { machineCalibration } from '@/db/queries/runs';
import { whoMay } from '@/lib/auth/messages';
import { canDo } from '@/lib/auth/roles';
import type { SessionUser } from '@/lib/auth/session-user';
import { CalibrationApply } from './calibration-apply';

function Figure({ label, value, testId }: { label: string; value: string; testId?: string }) {
  return (
    <div className="border-t border-rule-light py-2">
      <dt className="text-sm text-ink-soft">{label}</dt>
      <dd className="figure text-lg font-bold" data-testid={testId}>
        {value}
      </dd>
    </div>
  );
}

export async function CalibrationSection({ user, machineId, archived }: { user: SessionUser; machineId: number; archived: boolean }) {
  const c = await machineCalibration(user.shopId, machineId);
  if (!c) return null;
  const mayApply = canDo(user.role, 'calibration:apply') && !archived;
  const differs = c.suggestedFactor !== null && Math.abs(c.suggestedFactor - c.currentFactor) >= 0.0005;
  return (
    <section aria-labelledby="calibration-title" className="flex flex-col gap-3" data-testid="calibration-panel">
      <h2 id="calibration-title">Calibration</h2>
      <p className="text-ink-soft">
        How long this machine’s runs really take against their estimates. Shop settings: the last {c.lastRuns} uninterrupted runs, at least {c.minimumRuns} before a suggestion. Interrupted and voided
        runs are left out.
      </p>
      <div className="rounded-md border-2 border-rule bg-panel p-4">
        <dl className="grid gap-x-6 sm:grid-cols-2 lg:grid-cols-4">
          <Figure label="Suggested time factor" value={c.suggestedFactor === null ? 'none yet' : `× ${c.suggestedFactor.toFixed(3)}`} testId="calibration-suggested" />
          <Figure label="Runs it comes from" value={String(c.runs)} testId="calibration-runs" />
          <Figure label="Middle half of the ratios (IQR)" value={c.iqr ? `${c.iqr.q1.toFixed(3)} – ${c.iqr.q3.toFixed(3)} (${c.iqr.range.toFixed(3)})` : '—'} />
          <Figure label={`In use (profile version ${c.machineVersion})`} value={`× ${c.currentFactor.toFixed(3)}`} testId="calibration-current" />
        </dl>
        <p className="mt-3" data-testid="calibration-message">
          {c.message}
        </p>
        {c.suggestedFactor !== null && c.iqr && c.iqr.range > 0.2 ? (
          <div className="mt-3">
            <Notice tone="caution" title="The runs spread widely.">
              Look at the runs on the Runs page before applying: a few unusual runs (a re-cut sheet, a long pause not taken off the timer) move the spread more than the median.
            </Notice>
          </div>
        ) : null}
        <div className="mt-4">
          {mayApply && c.suggestedFactor !== null ? (
            <CalibrationApply machineId={machineId} suggestedFactor={c.suggestedFactor} currentFactor={c.currentFactor} differs={differs} />
          ) : !mayApply && differs ? (
            <p className="text-sm text-ink-soft">{whoMay('calibration:apply', true)} can apply the suggestion.</p>
          ) : null}
        </div>
      </div>
    </section>
  );
}
