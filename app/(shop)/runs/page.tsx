// Estimated vs actual (issue 15 point 2): the shop's runs with filters and pages, the figures per
// machine (median actual ÷ estimate and its quartiles, counted runs only), the two charts and
// the CSV exports. Filters come from the URL; a bad one in a hand-typed address is named above
// the report and left out. The figures and charts read every matching run (the newest
// CHART_RUN_LIMIT), the table one page of them.
import type { Metadata } from 'next';
import { Suspense } from 'react';
import { RatioFigures } from '@/components/reports/ratio-figures';
import { RunChartsLazy } from '@/components/reports/run-charts-lazy';
import { RunReportFilters } from '@/components/reports/run-report-filters';
import { RunReportTable } from '@/components/reports/run-report-table';
import { RunsPager } from '@/components/reports/runs-pager';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { CHART_RUN_LIMIT, runReportAll, runReportChoices, runReportPage } from '@/db/queries/run-reports';
import { guardPage } from '@/lib/auth/page-guard';
import { ratioPoints, ratioSummary, scatterPoints, summaryByMachine } from '@/lib/reports/run-stats';
import { runsExportHref, runsReportHref } from '@/lib/reports/runs-url';
import { fieldErrors } from '@/lib/validation/form';
import { searchParamsToObject } from '@/lib/validation/jobs';
import { runListQuerySchema, type RunListQuery } from '@/lib/validation/runs';

export const metadata: Metadata = { title: 'Runs' };

type SearchParams = Promise<Record<string, string | string[] | undefined>>;

function readQuery(raw: Record<string, string | undefined>): { query: RunListQuery; errors: Record<string, string[]> } {
  const first = runListQuerySchema.safeParse(raw);
  if (first.success) return { query: first.data, errors: {} };
  const errors = fieldErrors(first.error);
  const kept = Object.fromEntries(Object.entries(raw).filter(([key]) => !(key in errors)));
  return { query: runListQuerySchema.parse(kept), errors };
}

function ReportLoading() {
  return (
    <div role="status" aria-live="polite" className="rounded-md border-2 border-dashed border-rule bg-panel p-6 text-ink-soft" data-testid="runs-loading">
      Reading the runs…
    </div>
  );
}

async function RunsReport({ shopId, query, errors }: { shopId: number; query: RunListQuery; errors: Record<string, string[]> }) {
  const { page: _page, perPage: _perPage, ...filters } = query;
  const [page, all, choices] = await Promise.all([runReportPage(shopId, query), runReportAll(shopId, filters), runReportChoices(shopId)]);
  const filtered = Object.values(filters).some((v) => v !== undefined);
  const machines = choices.machines.filter((m) => all.rows.some((r) => r.machineId === m.id));
  const overall = ratioSummary(all.rows);
  const scatter = scatterPoints(all.rows);
  const ratio = ratioPoints(all.rows);

  return (
    <>
      <RunReportFilters query={query} machines={choices.machines} operators={choices.operators} errors={errors} />
      {page.total === 0 ? (
        <Notice tone="note" title={filtered ? 'No run matches these filters.' : 'No runs yet.'} role="status">
          {filtered
            ? 'Change a filter or clear them to see every run.'
            : 'Runs are logged from a job’s program page with the run timer, or entered there afterwards. Once the first run has finished, its estimate and actual time show here.'}
        </Notice>
      ) : (
        <>
          <section aria-labelledby="figures-title" className="mb-8">
            <h2 id="figures-title" className="mb-2 text-xl font-bold">
              How long runs took against their estimates
            </h2>
            <p className="mb-3 text-ink-soft">
              Only finished, uninterrupted, not voided runs with an estimate count. The estimate is the program’s stored estimate before any time factor, times the sheets cut.
              {all.truncated ? ` The figures and charts use the newest ${CHART_RUN_LIMIT} matching runs.` : ''}
            </p>
            {overall.counted === 0 ? (
              <Notice tone="note" title="None of these runs counts in the figures." role="status">
                Every run here is interrupted, voided, still open or without an estimate, so there is no ratio to show yet.
              </Notice>
            ) : (
              <RatioFigures machines={summaryByMachine(all.rows)} overall={overall} />
            )}
          </section>
          <section aria-label="Charts" className="mb-8">
            {scatter.length === 0 ? (
              <Notice tone="note" title="Nothing to chart yet." role="status">
                The charts need finished runs with an estimate.
              </Notice>
            ) : (
              <RunChartsLazy scatter={scatter} ratio={ratio} machines={machines.map((m) => ({ id: m.id, name: m.name }))} />
            )}
          </section>
          <section aria-labelledby="table-title">
            <div className="mb-3 flex flex-wrap items-end justify-between gap-3">
              <h2 id="table-title" className="text-xl font-bold">
                Runs
              </h2>
              <p className="flex flex-wrap gap-4">
                <a className="font-bold text-spruce underline underline-offset-4" href={runsExportHref(filters)} download>
                  Download these runs (CSV)
                </a>
                <a className="font-bold text-spruce underline underline-offset-4" href={query.machineId ? `/api/exports/estimates.csv?machineId=${query.machineId}` : '/api/exports/estimates.csv'} download>
                  Download the estimates (CSV)
                </a>
              </p>
            </div>
            {page.rows.length === 0 ? (
              <Notice tone="note" title={`There is no page ${query.page}: the table has ${page.pageCount}.`} role="status">
                <a className="font-bold text-spruce underline underline-offset-4" href={runsReportHref(query, { page: page.pageCount })}>
                  Go to the last page
                </a>
              </Notice>
            ) : (
              <>
                <RunReportTable rows={page.rows} />
                <RunsPager query={query} total={page.total} pageCount={page.pageCount} />
              </>
            )}
          </section>
        </>
      )}
    </>
  );
}

export default async function RunsPage({ searchParams }: { searchParams: SearchParams }) {
  const user = await guardPage('runs');
  const { query, errors } = readQuery(searchParamsToObject(await searchParams));
  const errorList = Object.values(errors).flat();
  return (
    <>
      <PageHeader title="Runs: estimated vs actual" lead="Every run logged at the machines, with how long it took against its estimate. Times are UTC." />
      {errorList.length > 0 ? (
        <div className="mb-4">
          <Notice tone="fault" title="Part of this address could not be used, so it was left out." role="alert">
            <ul>
              {errorList.map((m) => (
                <li key={m}>{m}</li>
              ))}
            </ul>
          </Notice>
        </div>
      ) : null}
      <Suspense fallback={<ReportLoading />}>
        <RunsReport shopId={user.shopId} query={query} errors={errors} />
      </Suspense>
    </>
  );
}
