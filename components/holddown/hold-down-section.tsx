'use client';
// "Hold-down" on the program page: every way of holding this estimate's parts side by side
// (GET /api/estimates/:id/hold-down, SWR; polled while the estimate is still being made), a
// method selector, and for the chosen method what it holds and why, its warnings, hand work,
// machine time, consumables and cost. The choice is published to the viewer's parts panel
// (lib/viewer/hold-overlay.ts), which colours each part held or not held for it. An estimate
// made before the comparison existed says so and offers a new estimate to roles that may ask;
// the section then follows that estimate until its comparison is ready.
import { useEffect, useState, useSyncExternalStore } from 'react';
import useSWR from 'swr';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import type { HoldDownAnswer } from '@/db/queries/hold-down';
import { canDo } from '@/lib/auth/roles';
import { AppError } from '@/lib/errors';
import { fetcher } from '@/lib/fetcher';
import type { HoldOption } from '@/lib/holddown/compare';
import { HOLD_OPTION_IDS, RULE_OUT_REASONS } from '@/lib/holddown/rule-out';
import type { HoldOptionId } from '@/lib/holddown/types';
import { overlayMethods } from '@/lib/holddown/overlay';
import { formatDuration } from '@/lib/jobs/format';
import { formatMoney } from '@/lib/quotes/price';
import type { EstimateStatus, Role } from '@/lib/validation/enums';
import { holdOverlay } from '@/lib/viewer/hold-overlay';

export interface HoldDownSectionProps {
  /** the stored estimate the page shows; null: none */
  estimate: { id: number; status: EstimateStatus; machineId: number } | null;
  programId: number;
  version: number;
  role: Role;
}

/** parts listed per verdict before "and N more" */
const LISTED = 100;

function seconds(s: number): string {
  return s < 60 ? `${Math.round(s)} s` : `${formatDuration(s)} (${Math.round(s).toLocaleString('en')} s)`;
}

export function HoldDownSection({ estimate, programId, version, role }: HoldDownSectionProps) {
  if (!canDo(role, 'holddown:read')) return null;
  return (
    <section aria-labelledby="hold-down-title" className="rounded-md border-2 border-rule bg-panel p-5" data-testid="hold-down">
      <h2 id="hold-down-title" className="text-lg">
        Hold-down
      </h2>
      {estimate === null ? (
        <p className="mt-2 text-ink-soft">No estimate is stored for this version, so there is nothing to compare yet.</p>
      ) : (
        <Comparison key={estimate.id} estimate={estimate} programId={programId} version={version} canRequest={canDo(role, 'estimates:write')} />
      )}
    </section>
  );
}

function Comparison({ estimate, programId, version, canRequest }: { estimate: NonNullable<HoldDownSectionProps['estimate']>; programId: number; version: number; canRequest: boolean }) {
  // after "Request a new estimate" the section follows the estimate the request named (the
  // same row computed again, or a new one), polling it until its comparison is ready
  const [followed, setFollowed] = useState<number | null>(null);
  const shownId = followed ?? estimate.id;
  // methods the job cannot use, compared without them (lib/holddown/rule-out.ts)
  const [ruledOut, setRuledOut] = useState<HoldOptionId[]>([]);
  const query = ruledOut.length > 0 ? `?ruleOut=${ruledOut.join(',')}` : '';
  const { data, error, isLoading, mutate } = useSWR<HoldDownAnswer, AppError>(`/api/estimates/${shownId}/hold-down${query}`, fetcher, {
    refreshInterval: (latest) => (latest && latest.availability === 'not-done' && latest.estimateStatus !== 'failed' ? 3000 : 0),
    keepPreviousData: true,
  });
  const toggleRuledOut = (id: HoldOptionId, on: boolean) => setRuledOut((now) => HOLD_OPTION_IDS.filter((m) => (m === id ? on : now.includes(m))));
  const overlay = useSyncExternalStore(holdOverlay.subscribe, holdOverlay.getSnapshot, holdOverlay.getSnapshot);
  const [requesting, setRequesting] = useState<{ state: 'idle' | 'busy' } | { state: 'failed'; message: string }>({ state: 'idle' });

  useEffect(() => {
    if (data?.availability === 'ready') holdOverlay.publish(shownId, overlayMethods(data), data.recommended);
    return () => holdOverlay.clear();
  }, [data, shownId]);

  const followNote =
    followed !== null && followed !== estimate.id ? (
      <p className="text-sm text-ink-soft" data-testid="hold-down-followed">
        Shown for the estimate just requested (no. <span className="figure">{followed}</span>); reload the page to see its figures under Stored estimate.
      </p>
    ) : null;

  if (error) {
    return (
      <div className="mt-2">
        <Notice tone="fault" title="The comparison could not be loaded." role="alert">
          <p>{error.message}</p>
          <Button variant="secondary" className="mt-2" onClick={() => mutate()}>
            Try again
          </Button>
        </Notice>
      </div>
    );
  }
  if (isLoading || !data) {
    return (
      <div role="status" className="mt-2 flex items-center gap-3 rounded-md border-2 border-dashed border-rule p-4 text-ink-soft">
        <span aria-hidden="true" className="h-5 w-5 animate-spin rounded-full border-4 border-rule-light border-t-spruce" />
        Comparing the hold-down methods…
      </div>
    );
  }
  if (data.availability !== 'ready') {
    const request = async () => {
      setRequesting({ state: 'busy' });
      try {
        const answer = await fetcher<{ estimate: { id: number } }>(`/api/programs/${programId}/estimates`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ machineId: estimate.machineId, version }) });
        setRequesting({ state: 'idle' });
        if (answer.estimate.id === shownId) await mutate();
        else setFollowed(answer.estimate.id);
      } catch (err) {
        setRequesting({ state: 'failed', message: err instanceof Error ? err.message : String(err) });
      }
    };
    return (
      <div className="mt-2 flex flex-col gap-2" data-testid="hold-down-unavailable">
        {followNote}
        <Notice tone={data.availability === 'not-done' && data.estimateStatus !== 'failed' ? 'note' : 'caution'} title={data.availability === 'not-done' ? 'Not compared yet.' : 'This estimate has no comparison.'} role="status">
          <p>{data.note.replace(data.caution, '').trim()}</p>
          {data.availability === 'not-computed' && canRequest ? (
            <div className="mt-2">
              <Button variant="secondary" onClick={request} disabled={requesting.state === 'busy'}>
                {requesting.state === 'busy' ? 'Requesting…' : 'Request a new estimate'}
              </Button>
              {requesting.state === 'failed' ? <p className="mt-1 font-bold text-fault" role="alert">{requesting.message}</p> : null}
            </div>
          ) : null}
        </Notice>
      </div>
    );
  }

  const chosen = data.options.find((o) => o.method === overlay.selected) ?? data.options.find((o) => o.method === data.recommended) ?? data.options[0];
  const money = (m: number) => formatMoney(m, data.currency);
  const recommended = data.options.find((o) => o.method === data.recommended) ?? null;
  return (
    <div className="mt-2 flex flex-col gap-4">
      {followNote}
      <Notice tone={recommended ? 'ok' : 'caution'} title={recommended ? `Suggested: ${recommended.label}` : 'No method holds every part.'} role="status">
        {/* the title already says there is no method; the note goes on with each method's parts */}
        <p data-testid="hold-down-note">{data.note.replace(data.caution, '').replace(/^No method holds every part\. /, '').trim()}</p>
        {data.wouldChange.length > 0 ? (
          <>
            <p className="mt-2 font-bold">What would change the verdict</p>
            <ul className="ml-5 list-disc">
              {data.wouldChange.map((w) => (
                <li key={w}>{w}</li>
              ))}
            </ul>
          </>
        ) : null}
      </Notice>

      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 font-bold">Method shown (here and in the parts of the view)</legend>
        {data.options.map((o) => (
          <MethodChoice key={o.method} option={o} data={data} checked={o.method === chosen?.method} money={money} />
        ))}
      </fieldset>

      <fieldset className="flex flex-col gap-1" data-testid="hold-down-rule-out">
        <legend className="mb-1 font-bold">Methods this job cannot use</legend>
        <p className="text-sm text-ink-soft">Compared without them: the suggestion is made among the rest.</p>
        {data.options.map((o) => (
          <label key={o.method} className="flex min-h-target cursor-pointer items-center gap-3 text-sm">
            <input type="checkbox" className="h-5 w-5 shrink-0" checked={ruledOut.includes(o.method)} onChange={(e) => toggleRuledOut(o.method, e.target.checked)} />
            <span className="flex flex-col">
              <span className="font-bold">{o.label}</span>
              <span className="text-ink-soft">{RULE_OUT_REASONS[o.method]}</span>
            </span>
          </label>
        ))}
      </fieldset>

      {chosen ? <MethodDetail option={chosen} data={data} money={money} /> : null}

      <p className="text-sm text-ink-soft">{data.caution}</p>
    </div>
  );
}

function MethodChoice({ option: o, data, checked, money }: { option: HoldOption; data: HoldDownAnswer; checked: boolean; money: (m: number) => string }) {
  const tag = o.method === data.recommended ? 'Suggested' : o.method === data.runnerUp ? 'Runner-up' : 'Ruled out';
  return (
    <label className={`flex cursor-pointer gap-3 rounded-md border-2 p-3 ${checked ? 'border-spruce bg-spruce-light' : 'border-rule-light'}`} data-method={o.method}>
      <input type="radio" name="hold-down-method" value={o.method} checked={checked} onChange={() => holdOverlay.select(o.method)} className="mt-1 h-5 w-5 shrink-0" />
      <span className="flex min-w-0 flex-col">
        <span className="font-bold">{o.label}</span>
        <span className="text-sm">
          <span className="figure">
            {o.heldParts.length} of {data.partCount}
          </span>{' '}
          held · <span className="figure">{money(o.jobCostMinor)}</span> for the job
        </span>
        <span className={`text-sm font-bold ${tag === 'Ruled out' ? 'text-ink-soft' : 'text-ok'}`}>
          {tag === 'Suggested' ? '✓ ' : tag === 'Runner-up' ? '○ ' : '– '}
          {tag}
          {o.warnings.length > 0 ? <span className="ml-2 text-caution">! {o.warnings.length === 1 ? 'a warning' : `${o.warnings.length} warnings`}</span> : null}
        </span>
      </span>
    </label>
  );
}

function MethodDetail({ option: o, data, money }: { option: HoldOption; data: HoldDownAnswer; money: (m: number) => string }) {
  return (
    <div className="flex flex-col gap-3 border-t-2 border-rule-light pt-3" data-testid="hold-down-detail">
      <h3 className="font-bold">{o.label}</h3>
      {o.ruledOut ? (
        <p>
          <span className="font-bold">Why not: </span>
          {o.ruledOut}
        </p>
      ) : null}
      {o.warnings.map((w) => (
        <Notice key={w} tone="caution" title="Warning" role="status">
          {w}
        </Notice>
      ))}
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="text-ink-soft">Parts held</dt>
        <dd className="figure font-bold" data-testid="hold-down-held">
          {o.heldParts.length} of {data.partCount}
        </dd>
        <dt className="text-ink-soft">Hand work per sheet</dt>
        <dd className="figure">{seconds(o.labourSeconds)}</dd>
        <dt className="text-ink-soft">Machine time added</dt>
        <dd className="figure">{o.machineSecondsDelta > 0 ? seconds(o.machineSecondsDelta) : 'none'}</dd>
        <dt className="text-ink-soft">Consumables per sheet</dt>
        <dd className="figure">{money(o.consumablesMinor)}</dd>
        <dt className="text-ink-soft">Cost per sheet</dt>
        <dd className="figure font-bold">{money(o.costMinor)}</dd>
        <dt className="text-ink-soft">For the job</dt>
        <dd className="figure font-bold">
          {money(o.jobCostMinor)} <span className="font-normal">({data.quantity.toLocaleString('en')} pieces, {data.sheets} {data.sheets === 1 ? 'sheet' : 'sheets'})</span>
        </dd>
      </dl>
      <details className="text-sm">
        <summary className="cursor-pointer font-bold text-spruce">How the cost is computed</summary>
        <ul className="ml-5 mt-1 list-disc">
          {o.labourSteps.map((s) => (
            <li key={s.label}>
              {s.label}: {s.arithmetic}
            </li>
          ))}
          <li>Machine time: {o.machineArithmetic}</li>
          <li>{o.costArithmetic}</li>
        </ul>
      </details>
      <PartList title="Parts not held" parts={o.unheldParts} testId="hold-down-unheld" open={o.unheldParts.length > 0 && o.unheldParts.length <= 12} />
      <PartList title="Parts held" parts={o.heldParts} testId="hold-down-held-list" open={false} />
    </div>
  );
}

function PartList({ title, parts, testId, open }: { title: string; parts: HoldOption['heldParts']; testId: string; open: boolean }) {
  if (parts.length === 0) return null;
  const shown = [...parts].sort((a, b) => a.order - b.order).slice(0, LISTED);
  return (
    <details className="text-sm" open={open} data-testid={testId}>
      <summary className="cursor-pointer font-bold text-spruce">
        {title} ({parts.length})
      </summary>
      <ul className="mt-1 flex flex-col gap-1">
        {shown.map((p) => (
          <li key={p.part}>
            <span className="figure font-bold">Part {p.order}:</span> {p.reason}
          </li>
        ))}
      </ul>
      {parts.length > LISTED ? <p className="mt-1 text-ink-soft">and {parts.length - LISTED} more.</p> : null}
    </details>
  );
}
