// One job: its facts, the status steps the user may take, its programs with the latest
// estimate of each (client part, SWR), the upload widget for roles that may upload, and the
// history of what changed. Another shop's job or a mistyped id is the 404 page.
import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { JobStatusBadge } from '@/components/jobs/job-status-badge';
import { ProgramsPanel } from '@/components/jobs/programs-panel';
import { StatusActions } from '@/components/jobs/status-actions';
import { JobQuotes } from '@/components/quotes/job-quotes';
import { LinkButton } from '@/components/ui/link-button';
import { getJob, listJobEvents, programCount } from '@/db/queries/jobs';
import { whoMay } from '@/lib/auth/messages';
import { guardPage } from '@/lib/auth/page-guard';
import { canDo } from '@/lib/auth/roles';
import { env } from '@/lib/env';
import { formatMm, formatWhen } from '@/lib/jobs/format';
import { historyLine } from '@/lib/jobs/history-words';
import { isEditable, movesFor } from '@/lib/jobs/status-moves';
import { HOLD_DOWN_LABELS } from '@/lib/validation/enums';
import { idSchema } from '@/lib/validation/ids';

export const metadata: Metadata = { title: 'Job' };

function Fact({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div className="border-t border-rule-light py-2">
      <dt className="text-sm text-ink-soft">{label}</dt>
      <dd className="font-bold">{children}</dd>
    </div>
  );
}

export default async function JobPage({ params }: { params: Promise<{ jobId: string }> }) {
  const user = await guardPage('jobs');
  const raw = (await params).jobId;
  const id = idSchema.safeParse(raw);
  if (!id.success || !/^\d+$/.test(raw)) notFound();
  const job = await getJob(user.shopId, id.data);
  if (!job) notFound();
  const [programs, events] = await Promise.all([programCount(user.shopId, job.id), listJobEvents(user.shopId, job.id)]);
  const moves = movesFor(user.role, job.status, { programCount: programs }).map((m) => ({ to: m.to, verb: m.verb }));
  const mayEdit = canDo(user.role, 'jobs:write') && isEditable(job.status);

  return (
    <>
      <p className="mb-2">
        <Link href="/jobs" className="font-bold text-spruce underline underline-offset-4">
          <span aria-hidden="true">← </span>All jobs
        </Link>
      </p>
      <div className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b-2 border-rule-light pb-4">
        <div>
          <h1>{job.title}</h1>
          <p className="mt-2 flex flex-wrap items-center gap-3 text-ink-soft">
            <span data-testid="job-status">
              <JobStatusBadge status={job.status} />
            </span>
            <span>for {job.customerName}</span>
          </p>
        </div>
        <div className="flex flex-wrap items-start gap-3">
          {mayEdit ? (
            <LinkButton href={`/jobs/${job.id}/edit`} variant="secondary">
              Edit job
            </LinkButton>
          ) : null}
          <StatusActions jobId={job.id} moves={moves} />
        </div>
      </div>

      <div className="grid items-start gap-8 lg:grid-cols-[minmax(0,2.2fr)_minmax(0,1fr)]">
        <div className="flex flex-col gap-8">
          <section aria-labelledby="facts-title" className="rounded-md border-2 border-rule bg-panel p-5">
            <h2 id="facts-title" className="text-lg">The job</h2>
            <dl className="mt-2 grid gap-x-6 sm:grid-cols-2 lg:grid-cols-3" data-testid="job-facts">
              <Fact label="Customer">{job.customerName}</Fact>
              <Fact label="Machine">{job.machineName ?? 'not set'}</Fact>
              <Fact label="Material">{job.materialName ?? 'not set'}</Fact>
              <Fact label="Sheet X × Y × T (mm)">
                <span className="figure">{`${formatMm(job.sheetWidthMm)} × ${formatMm(job.sheetLengthMm)} × ${formatMm(job.sheetThicknessMm)}`}</span>
              </Fact>
              <Fact label="Z zero">{job.zZero === 'top' ? 'Top of stock' : 'Table surface'}</Fact>
              <Fact label="Hold-down">
                {HOLD_DOWN_LABELS[job.holdDown]}
                {job.holdDown === 'vacuum' && job.vacuumKpa !== null ? <> at <span className="figure">{formatMm(job.vacuumKpa)} kPa</span></> : null}
              </Fact>
              <Fact label="Quantity (pieces)">
                <span className="figure">{job.quantity}</span>
              </Fact>
              <Fact label="Due">{job.dueDate ? <span className="figure">{job.dueDate}</span> : 'no date'}</Fact>
              <Fact label="Last changed">
                <span className="figure text-base">{formatWhen(job.updatedAt)}</span>
              </Fact>
            </dl>
            {job.notes ? (
              <div className="mt-2 border-t border-rule-light pt-2">
                <p className="text-sm text-ink-soft">Notes</p>
                <p className="whitespace-pre-line">{job.notes}</p>
              </div>
            ) : null}
          </section>

          <ProgramsPanel
            jobId={job.id}
            canUpload={canDo(user.role, 'programs:write')}
            canRequestEstimates={canDo(user.role, 'estimates:write')}
            maxUploadBytes={env.PROGRAM_MAX_BYTES}
            uploadRoles={whoMay('programs:write', true)}
          />
          {canDo(user.role, 'quotes:read') ? <JobQuotes jobId={job.id} canWrite={canDo(user.role, 'quotes:write')} /> : null}
        </div>

        <section aria-labelledby="history-title" className="rounded-md border-2 border-rule bg-panel p-5">
          <h2 id="history-title" className="text-lg">History</h2>
          {events.length === 0 ? (
            <p className="mt-2 text-ink-soft">Nothing recorded yet.</p>
          ) : (
            <ol className="mt-2" data-testid="job-history">
              {events.map((e) => (
                <li key={e.id} className="border-t border-rule-light py-2 first:border-t-0">
                  <p>
                    <span className="font-bold">{e.userName ?? 'Kerfcast'}</span> {historyLine(e.kind, e.detail)}
                  </p>
                  <p className="figure text-sm text-ink-soft">
                    <time dateTime={new Date(e.createdAt).toISOString()}>{formatWhen(e.createdAt)}</time>
                  </p>
                </li>
              ))}
            </ol>
          )}
        </section>
      </div>
    </>
  );
}
