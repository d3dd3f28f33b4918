// The dashboard's four panels, each read on the server on its own (so one slow query does not
// hold the others): machine hours estimated for this week's scheduled jobs by machine, jobs
// waiting by status, programs due soon whose latest estimate still has error findings, and the
// median actual ÷ estimate per machine over the last 30 days. Each says plainly when it is empty.
import Link from 'next/link';
import type { ReactNode } from 'react';
import { JobStatusBadge } from '@/components/jobs/job-status-badge';
import { Notice } from '@/components/ui/notice';
import { dueProgramsWithErrors, jobsWaitingByStatus, runsEndedSince, weekPrograms } from '@/db/queries/run-reports';
import { hoursByMachine, isoWeekDays, nextDays } from '@/lib/reports/dashboard-figures';
import { summaryByMachine } from '@/lib/reports/run-stats';
import { JOB_STATUS_LABELS } from '@/lib/validation/enums';

/** How many days ahead "due soon" looks (today included). */
export const DUE_DAYS = 7;
/** The window of the ratio panel. */
export const RATIO_DAYS = 30;

const linkClass = 'font-bold text-spruce underline underline-offset-4';
const cell = 'px-3 py-2';

export function Panel({ id, title, lead, children }: { id: string; title: string; lead: string; children: ReactNode }) {
  return (
    <section aria-labelledby={`${id}-title`} className="flex flex-col gap-3 rounded-md border-2 border-rule bg-panel p-4" data-testid={`panel-${id}`}>
      <div>
        <h2 id={`${id}-title`} className="text-xl font-bold">
          {title}
        </h2>
        <p className="text-sm text-ink-soft">{lead}</p>
      </div>
      {children}
    </section>
  );
}

export function PanelLoading({ id, title }: { id: string; title: string }) {
  return (
    <Panel id={id} title={title} lead="">
      <p role="status" className="text-ink-soft">
        Reading…
      </p>
    </Panel>
  );
}

function SmallTable({ caption, heads, children }: { caption: string; heads: { label: string; numeric?: boolean }[]; children: ReactNode }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">{caption}</caption>
        <thead>
          <tr className="border-b-2 border-rule">
            {heads.map((h) => (
              <th key={h.label} scope="col" className={`${cell} font-bold ${h.numeric ? 'text-right' : ''}`}>
                {h.label}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>{children}</tbody>
      </table>
    </div>
  );
}

export async function WeekHoursPanel({ shopId, now }: { shopId: number; now: Date }) {
  const { monday, sunday } = isoWeekDays(now);
  const week = await weekPrograms(shopId, monday, sunday);
  const machines = hoursByMachine(week.programs);
  const total = machines.reduce((s, m) => s + m.hours, 0);
  return (
    <Panel id="week-hours" title="Machine hours this week" lead={`Scheduled and running jobs due ${monday} to ${sunday}: calibrated estimate per sheet × sheets needed (⌈quantity ÷ parts per sheet⌉).`}>
      {machines.length === 0 ? (
        <Notice tone="note" title="No job is scheduled for this week." role="status">
          Jobs count here once they are scheduled with a due date this week and a machine.
        </Notice>
      ) : (
        <SmallTable caption="Estimated machine hours by machine" heads={[{ label: 'Machine' }, { label: 'Jobs', numeric: true }, { label: 'Hours', numeric: true }]}>
          {machines.map((m) => (
            <tr key={m.machineId} className="border-t border-rule-light">
              <td className={cell}>
                {m.machineName}
                {m.programsWithoutEstimate > 0 ? <span className="block text-sm text-caution">{m.programsWithoutEstimate} program(s) without a finished estimate, not counted</span> : null}
                {m.programsWithoutParts > 0 ? <span className="block text-sm text-caution">{m.programsWithoutParts} program(s) with no parts found, counted as one sheet</span> : null}
              </td>
              <td className={`${cell} figure text-right`}>{m.jobs}</td>
              <td className={`${cell} figure text-right`}>{m.hours.toFixed(1)} h</td>
            </tr>
          ))}
          <tr className="border-t-2 border-rule font-bold">
            <td className={cell}>All machines</td>
            <td className={`${cell} figure text-right`}>{machines.reduce((s, m) => s + m.jobs, 0)}</td>
            <td className={`${cell} figure text-right`}>{total.toFixed(1)} h</td>
          </tr>
        </SmallTable>
      )}
      {week.jobsWithoutMachine > 0 ? <p className="text-sm text-caution">{week.jobsWithoutMachine} job(s) this week have no machine chosen and are not counted.</p> : null}
      {week.jobsWithoutPrograms > 0 ? <p className="text-sm text-caution">{week.jobsWithoutPrograms} job(s) this week have no program yet.</p> : null}
    </Panel>
  );
}

export async function WaitingJobsPanel({ shopId }: { shopId: number }) {
  const rows = await jobsWaitingByStatus(shopId);
  const total = rows.reduce((s, r) => s + r.count, 0);
  return (
    <Panel id="waiting" title="Jobs waiting" lead="Jobs not yet running, done or cancelled, by the step they wait at.">
      {total === 0 ? (
        <Notice tone="note" title="No job is waiting." role="status" />
      ) : (
        <ul className="flex flex-col divide-y divide-rule-light">
          {rows.map((r) => (
            <li key={r.status} className="flex items-center justify-between gap-3 py-2">
              <Link className={linkClass} href={`/jobs?status=${r.status}`} aria-label={`${r.count} ${JOB_STATUS_LABELS[r.status]} jobs`}>
                <JobStatusBadge status={r.status} />
              </Link>
              <span className="figure text-lg font-bold">{r.count}</span>
            </li>
          ))}
        </ul>
      )}
    </Panel>
  );
}

export async function DueWithErrorsPanel({ shopId, now }: { shopId: number; now: Date }) {
  const { from, to } = nextDays(now, DUE_DAYS);
  const rows = await dueProgramsWithErrors(shopId, from, to);
  return (
    <Panel
      id="due-errors"
      title="Due soon with error findings"
      lead={`Programs of jobs due ${from} to ${to} whose latest version’s estimate still has error findings. The check is an aid, not a guarantee: a program without findings still needs its usual checks.`}
    >
      {rows.length === 0 ? (
        <Notice tone="ok" title="No program due in the next days has error findings." role="status" />
      ) : (
        <SmallTable caption="Programs due soon with error findings" heads={[{ label: 'Due' }, { label: 'Job and program' }, { label: 'Errors', numeric: true }]}>
          {rows.map((r) => (
            <tr key={`${r.programId}`} className="border-t border-rule-light">
              <td className={`${cell} whitespace-nowrap`}>{r.dueDate}</td>
              <td className={cell}>
                <Link className={linkClass} href={`/jobs/${r.jobId}/programs/${r.programId}`}>
                  {r.programName} v{r.version}
                </Link>
                <span className="block text-sm text-ink-soft">{r.jobTitle}</span>
              </td>
              <td className={`${cell} figure text-right font-bold text-fault`}>
                <span aria-hidden="true">✕ </span>
                {r.errorCount}
              </td>
            </tr>
          ))}
        </SmallTable>
      )}
    </Panel>
  );
}

export async function RatioPanel({ shopId, now }: { shopId: number; now: Date }) {
  const rows = await runsEndedSince(shopId, new Date(now.getTime() - RATIO_DAYS * 86_400_000));
  const machines = summaryByMachine(rows);
  return (
    <Panel id="ratio" title={`Actual ÷ estimate, last ${RATIO_DAYS} days`} lead="Median per machine over finished, uninterrupted, not voided runs, with the middle half of the runs (Q1–Q3).">
      {machines.length === 0 ? (
        <Notice tone="note" title={`No run ended in the last ${RATIO_DAYS} days.`} role="status" />
      ) : (
        <SmallTable caption="Median actual ÷ estimate per machine" heads={[{ label: 'Machine' }, { label: 'Runs', numeric: true }, { label: 'Median', numeric: true }, { label: 'Q1–Q3', numeric: true }]}>
          {machines.map((m) => (
            <tr key={m.machineId} className="border-t border-rule-light">
              <td className={cell}>
                <Link className={linkClass} href={`/runs?machineId=${m.machineId}`}>
                  {m.machineName}
                </Link>
              </td>
              <td className={`${cell} figure text-right`}>{m.counted}</td>
              <td className={`${cell} figure text-right font-bold`}>{m.median === null ? '—' : m.median.toFixed(3)}</td>
              <td className={`${cell} figure text-right`}>{m.q1 === null ? '—' : `${m.q1.toFixed(3)}–${m.q3!.toFixed(3)}`}</td>
            </tr>
          ))}
        </SmallTable>
      )}
    </Panel>
  );
}
