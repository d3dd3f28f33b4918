// One program of a job: the 3D view of the version shown (the latest, or ?version=N) beside
// the server's stored estimate of it. The view streams the stored file from
// GET /api/programs/:programId/versions/:version/file and runs the same engine in a browser
// worker on the stored estimate's own inputs (machine version profile, job settings), then
// says whether its figures agree with the stored ones. Another shop's program, a program of
// another job, a mistyped id or version is the 404 page.
import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { EstimateTimes } from '@/components/runs/estimate-times';
import { ProgramRunsSection } from '@/components/runs/program-runs-section';
import { HoldDownSection } from '@/components/holddown/hold-down-section';
import { Notice } from '@/components/ui/notice';
import { ProgramPageViewer } from '@/components/viewer/program-page-viewer';
import { getJob } from '@/db/queries/jobs';
import { getMachine } from '@/db/queries/machines';
import { getProgramPage } from '@/db/queries/program-view';
import { guardPage } from '@/lib/auth/page-guard';
import { canDo } from '@/lib/auth/roles';
import { formatBytes, formatWhen } from '@/lib/jobs/format';
import { idSchema } from '@/lib/validation/ids';

export const metadata: Metadata = { title: 'Program' };

function parseRouteId(raw: string | undefined): number | null {
  if (raw === undefined || !/^\d+$/.test(raw)) return null;
  const parsed = idSchema.safeParse(raw);
  return parsed.success ? parsed.data : null;
}

function Figure({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div className="border-t border-rule-light py-2">
      <dt className="text-sm text-ink-soft">{label}</dt>
      <dd className="figure font-bold">{children}</dd>
    </div>
  );
}

export default async function ProgramPage({
  params,
  searchParams,
}: {
  params: Promise<{ jobId: string; programId: string }>;
  searchParams: Promise<{ version?: string | string[] }>;
}) {
  const user = await guardPage('jobs');
  const raw = await params;
  const query = await searchParams;
  const jobId = parseRouteId(raw.jobId);
  const programId = parseRouteId(raw.programId);
  const rawVersion = Array.isArray(query.version) ? query.version[0] : query.version;
  const version = rawVersion === undefined ? null : parseRouteId(rawVersion);
  if (jobId === null || programId === null || (rawVersion !== undefined && version === null)) notFound();
  const job = await getJob(user.shopId, jobId);
  if (!job) notFound();
  const data = await getProgramPage(user.shopId, job, programId, version);
  if (!data) notFound();
  const { program, version: shown, stored, inputs } = data;
  // the estimate's machine as it is now: a newer profile version (a calibration applied) asks for the estimate on it
  const estimateMachine = stored ? await getMachine(user.shopId, stored.estimate.machineId) : null;

  return (
    <>
      <p className="mb-2">
        <Link href={`/jobs/${job.id}`} className="font-bold text-spruce underline underline-offset-4">
          <span aria-hidden="true">← </span>
          {job.title}
        </Link>
      </p>
      <div className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b-2 border-rule-light pb-4">
        <div>
          <h1 className="break-all font-mono">{program.name}</h1>
          <p className="mt-2 text-ink-soft">
            Program of <span className="font-bold text-ink">{job.title}</span> for {job.customerName} ·{' '}
            <span className="figure">v{shown.version}</span>
            {shown.version !== program.latestVersion ? ' (an earlier version)' : ''} · <span className="figure">{shown.lines.toLocaleString('en')}</span> lines ·{' '}
            <span className="figure">{formatBytes(shown.bytes)}</span> · uploaded {formatWhen(shown.createdAt)}
          </p>
        </div>
        {program.versions.length > 1 ? (
          <nav aria-label="Versions" className="flex flex-wrap gap-2">
            {program.versions.map((v) => (
              <Link
                key={v.version}
                href={`/jobs/${job.id}/programs/${program.id}?version=${v.version}`}
                aria-current={v.version === shown.version ? 'page' : undefined}
                className={`figure rounded-md border-2 px-3 py-1 font-bold ${v.version === shown.version ? 'border-spruce bg-spruce text-white' : 'border-rule text-spruce'}`}
              >
                v{v.version}
              </Link>
            ))}
          </nav>
        ) : null}
      </div>

      <div className="grid items-start gap-8 xl:grid-cols-[minmax(0,2.4fr)_minmax(0,1fr)]">
        <div className="flex min-w-0 flex-col gap-6" data-testid="program-view-column">
          {inputs ? (
            <ProgramPageViewer
              programId={program.id}
              version={shown.version}
              name={program.name}
              profile={inputs.profile}
              job={inputs.settings}
              stored={stored && stored.estimate.status === 'done' ? { id: stored.estimate.id, engineVersion: stored.estimate.engineVersion } : null}
            />
          ) : (
            <Notice tone="caution" title="This job names no machine." role="status">
              The view plans the motion for a machine’s limits: choose the job’s machine on its edit page.
            </Notice>
          )}
        </div>

        <div className="flex min-w-0 flex-col gap-6">
          <section aria-labelledby="stored-title" className="rounded-md border-2 border-rule bg-panel p-5" data-testid="stored-estimate">
            <h2 id="stored-title" className="text-lg">Stored estimate</h2>
            {stored === null ? (
              <div className="mt-2">
                <Notice tone="caution" title="No estimate is stored for this version." role="status">
                  The job page requests one for the job’s machine.
                </Notice>
              </div>
            ) : (
              <dl className="mt-2">
                <Figure label="Machine">
                  {stored.machineName} <span className="font-normal text-ink-soft">(profile version {stored.estimate.machineVersion})</span>
                </Figure>
                <Figure label="Status">{stored.estimate.status}</Figure>
                {stored.estimate.totalSeconds !== null || stored.estimate.status === 'done' ? (
                  <EstimateTimes
                    programId={program.id}
                    version={shown.version}
                    totalSeconds={stored.estimate.totalSeconds}
                    calibratedSeconds={stored.estimate.calibratedSeconds}
                    timeFactor={stored.profile.timeFactor}
                    machine={
                      estimateMachine
                        ? { id: estimateMachine.id, name: estimateMachine.name, estimateVersion: stored.estimate.machineVersion, currentVersion: estimateMachine.version, currentTimeFactor: estimateMachine.timeFactor }
                        : null
                    }
                    canRequest={canDo(user.role, 'estimates:write') && estimateMachine?.archivedAt === null}
                  />
                ) : null}
                {stored.estimate.partCount !== null ? <Figure label="Parts">{stored.estimate.partCount}</Figure> : null}
                {stored.estimate.errorCount !== null ? (
                  <Figure label="Findings">
                    {stored.estimate.errorCount} errors, {stored.estimate.warningCount ?? 0} warnings, {stored.estimate.infoCount ?? 0} notes
                  </Figure>
                ) : null}
                <Figure label="Engine version">{stored.estimate.engineVersion}</Figure>
              </dl>
            )}
          </section>

          <HoldDownSection estimate={stored ? { id: stored.estimate.id, status: stored.estimate.status, machineId: stored.estimate.machineId } : null} programId={program.id} version={shown.version} role={user.role} />
          <ProgramRunsSection user={user} programId={program.id} version={shown.version} jobMachineId={job.machineId} />
        </div>
      </div>
    </>
  );
}
