'use client';
// The latest estimate of one program, read from GET /api/estimates/[estimateId] with SWR and
// polled while it waits or runs: waiting and running show the share done; done shows the run
// time, the findings (counted, then listed as the report words them, with their lines) and
// the parts and what holds them; failed shows the reason and, for roles that may request
// estimates, a retry.
import { useState } from 'react';
import useSWR from 'swr';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { ProgressBar } from '@/components/ui/progress-bar';
import type { AppError } from '@/lib/errors';
import { fetcher } from '@/lib/fetcher';
import { countFindings, holdSentence, pollInterval, summarizeParts, HELD_BY_WORDS, type EstimateView, type ReportFindingView, type ReportView } from '@/lib/jobs/estimate-view';
import { formatDuration, formatMm } from '@/lib/jobs/format';

const SEVERITY = {
  error: { glyph: '✕', word: 'Error', tone: 'border-fault bg-fault-tint text-fault' },
  warning: { glyph: '!', word: 'Warning', tone: 'border-caution bg-caution-tint text-caution' },
  info: { glyph: 'i', word: 'Note', tone: 'border-note bg-note-tint text-note' },
} as const;

const FIRST_FINDINGS = 12;

function Figure({ label, value, hint }: { label: string; value: string; hint?: string }) {
  return (
    <div>
      <dt className="text-sm text-ink-soft">{label}</dt>
      <dd className="figure text-2xl font-bold">{value}</dd>
      {hint ? <dd className="text-sm text-ink-soft">{hint}</dd> : null}
    </div>
  );
}

function FindingItem({ finding }: { finding: ReportFindingView }) {
  const s = SEVERITY[finding.severity] ?? SEVERITY.info;
  return (
    <li className="flex gap-3 border-t border-rule-light py-2 first:border-t-0" data-testid="finding" data-severity={finding.severity}>
      <span className={`inline-flex h-7 shrink-0 items-center gap-1 rounded-full border-2 px-2 text-sm font-bold ${s.tone}`}>
        <span aria-hidden="true">{s.glyph}</span>
        {s.word}
        <span className="sr-only">:</span>
      </span>
      <p>
        <span className="figure font-bold">{finding.line > 0 ? `Line ${finding.line}` : 'Whole program'}</span>
        {finding.part ? <span className="text-ink-soft"> · part {finding.part}</span> : null}
        <span className="text-ink-soft"> — </span>
        {finding.message}
      </p>
    </li>
  );
}

function Findings({ report }: { report: ReportView }) {
  const [all, setAll] = useState(false);
  const counts = countFindings(report);
  const shown = all ? report.findings : report.findings.slice(0, FIRST_FINDINGS);
  return (
    <section aria-label="Findings" className="mt-4">
      <h5 className="font-bold">Findings</h5>
      <p data-testid="finding-counts" className="mt-1 flex flex-wrap gap-2">
        {(['error', 'warning', 'info'] as const).map((severity) => {
          const n = severity === 'error' ? counts.errors : severity === 'warning' ? counts.warnings : counts.notes;
          const s = SEVERITY[severity];
          return (
            <span key={severity} className={`inline-flex items-center gap-1 rounded-full border-2 px-3 text-sm font-bold ${s.tone}`}>
              <span aria-hidden="true">{s.glyph}</span>
              <span className="figure">{n}</span> {n === 1 ? s.word.toLowerCase() : `${s.word.toLowerCase()}s`}
            </span>
          );
        })}
      </p>
      {report.checks?.note ? <p className="mt-2 text-sm text-ink-soft" data-testid="checks-note">{report.checks.note}</p> : null}
      {report.findings.length === 0 ? (
        <p className="mt-2">No findings in this program.</p>
      ) : (
        <>
          <ul className="mt-2" aria-label="Findings by line">
            {shown.map((f, i) => (
              <FindingItem key={`${f.line}-${f.kind}-${i}`} finding={f} />
            ))}
          </ul>
          {report.findings.length > FIRST_FINDINGS ? (
            <Button variant="secondary" className="mt-2" aria-expanded={all} onClick={() => setAll((v) => !v)}>
              {all ? `Show the first ${FIRST_FINDINGS} only` : `Show all ${report.findings.length} listed findings`}
            </Button>
          ) : null}
        </>
      )}
    </section>
  );
}

function Parts({ report }: { report: ReportView }) {
  const summary = summarizeParts(report.parts);
  return (
    <section aria-label="Parts" className="mt-4">
      <h5 className="font-bold">Parts</h5>
      <p className="mt-1" data-testid="parts-summary">
        {summary.unheld > 0 ? <span className="font-bold text-fault"><span aria-hidden="true">✕ </span></span> : null}
        {holdSentence(summary)}
        {report.checks?.holdDownAssumed ? ' No hold-down was given, so only tabs and onion skin count.' : ''}
      </p>
      {report.parts.length > 0 ? (
        <div className="mt-2 overflow-x-auto rounded-md border-2 border-rule-light">
          <table className="w-full border-collapse text-left text-sm">
            <caption className="sr-only">Parts in the order they are cut free</caption>
            <thead className="bg-ground">
              <tr>
                <th scope="col" className="px-3 py-2 text-right">Order</th>
                <th scope="col" className="px-3 py-2 text-right">Part</th>
                <th scope="col" className="px-3 py-2 text-right">Size X × Y (mm)</th>
                <th scope="col" className="px-3 py-2 text-right">Area (mm²)</th>
                <th scope="col" className="px-3 py-2 text-right">Holes</th>
                <th scope="col" className="px-3 py-2">Held</th>
                <th scope="col" className="px-3 py-2 text-right">Cut free at line</th>
                <th scope="col" className="px-3 py-2 text-right">Tool</th>
              </tr>
            </thead>
            <tbody>
              {[...report.parts].sort((a, b) => a.order - b.order).map((p) => (
                <tr key={p.id} className="border-t border-rule-light" data-testid="part-row">
                  <td className="figure px-3 py-2 text-right">{p.order}</td>
                  <td className="figure px-3 py-2 text-right">{p.id}</td>
                  <td className="figure whitespace-nowrap px-3 py-2 text-right">{`${formatMm(p.bbox.maxX - p.bbox.minX)} × ${formatMm(p.bbox.maxY - p.bbox.minY)}`}</td>
                  <td className="figure px-3 py-2 text-right">{Math.round(p.areaMm2).toLocaleString('en')}</td>
                  <td className="figure px-3 py-2 text-right">{p.holes}</td>
                  <td className={`px-3 py-2 ${p.held ? '' : 'font-bold text-fault'}`}>
                    {p.held ? HELD_BY_WORDS[p.holdBy].replace('held ', '') : <><span aria-hidden="true">✕ </span>by nothing</>}
                  </td>
                  <td className="figure px-3 py-2 text-right">{p.freedAtLine ?? '—'}</td>
                  <td className="figure px-3 py-2 text-right">T{p.tool}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
    </section>
  );
}

function DoneEstimate({ estimate, report }: { estimate: EstimateView; report: ReportView }) {
  return (
    <div data-testid="estimate-done">
      <dl className="grid gap-4 sm:grid-cols-3">
        <Figure label="Estimated run time" value={formatDuration(report.totalSeconds)} hint="from the machine profile" />
        <Figure label="Calibrated run time" value={formatDuration(report.calibratedSeconds)} hint="with the machine's time factor" />
        <Figure label="Program" value={`${report.file.lines.toLocaleString('en')} lines`} hint={`units ${report.file.units}; profile v${estimate.machineVersion}, engine ${estimate.engineVersion}`} />
      </dl>
      <Findings report={report} />
      <Parts report={report} />
    </div>
  );
}

export function EstimatePanel({ estimateId, programId, canRetry }: { estimateId: number; programId: number; canRetry: boolean }) {
  const { data, error, mutate } = useSWR<{ estimate: EstimateView }, AppError>(`/api/estimates/${estimateId}`, fetcher, {
    refreshInterval: (latest) => pollInterval(latest?.estimate.status),
  });
  const [retrying, setRetrying] = useState(false);
  const [retryError, setRetryError] = useState<string | null>(null);

  if (error) {
    return (
      <Notice tone="fault" title="The estimate could not be loaded." role="alert">
        <p>{error.message}</p>
        <Button variant="secondary" className="mt-2" onClick={() => mutate()}>
          Try again
        </Button>
      </Notice>
    );
  }
  if (!data) {
    return (
      <p role="status" className="text-ink-soft">
        Loading the estimate…
      </p>
    );
  }
  const estimate = data.estimate;

  async function retry() {
    setRetrying(true);
    setRetryError(null);
    try {
      await fetcher(`/api/programs/${programId}/estimates`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ machineId: estimate.machineId, version: estimate.programVersion }),
      });
      await mutate();
    } catch (e) {
      setRetryError((e as Error).message);
    } finally {
      setRetrying(false);
    }
  }

  if (estimate.status === 'pending' || estimate.status === 'running') {
    const running = estimate.status === 'running';
    return (
      <div role="status" data-testid="estimate-waiting" data-status={estimate.status}>
        <p className="font-bold">{running ? 'Computing the estimate…' : 'Waiting for a free estimate worker…'}</p>
        <div className="mt-2 max-w-xl">
          <ProgressBar label="Estimate progress" value={running ? estimate.progress : null} text={running ? `${Math.round(estimate.progress * 100)} %` : 'queued'} />
        </div>
        <p className="mt-1 text-sm text-ink-soft">This page updates by itself when it is done.</p>
      </div>
    );
  }
  if (estimate.status === 'failed') {
    return (
      <div data-testid="estimate-failed">
        <Notice tone="fault" title="The estimate failed." role="alert">
          <p>{estimate.error ?? 'No reason was stored.'}</p>
          {canRetry ? (
            <Button variant="secondary" className="mt-2" disabled={retrying} onClick={retry}>
              {retrying ? 'Asking again…' : 'Try the estimate again'}
            </Button>
          ) : null}
          {retryError ? <p className="mt-2 font-bold text-fault">{retryError}</p> : null}
        </Notice>
      </div>
    );
  }
  if (!estimate.report) {
    return <Notice tone="fault" title="The estimate is done but its report is missing." role="alert" />;
  }
  return <DoneEstimate estimate={estimate} report={estimate.report} />;
}
