// The shop's dashboard (issue 15 point 5), the landing page of admins and estimators: this
// week's machine hours, jobs waiting, programs due soon with error findings, and how runs
// compare with their estimates. Each panel streams in on its own, with its own loading state.
import type { Metadata } from 'next';
import { Suspense } from 'react';
import { DueWithErrorsPanel, PanelLoading, RatioPanel, WaitingJobsPanel, WeekHoursPanel, RATIO_DAYS } from '@/components/reports/dashboard-panels';
import { PageHeader } from '@/components/ui/page-header';
import { guardPage } from '@/lib/auth/page-guard';

export const metadata: Metadata = { title: 'Dashboard' };

export default async function DashboardPage() {
  const user = await guardPage('dashboard');
  const now = new Date();
  return (
    <>
      <PageHeader title="Dashboard" lead="This week at the machines and what waits for the office. Days are UTC." />
      <div className="grid gap-6 lg:grid-cols-2">
        <Suspense fallback={<PanelLoading id="week-hours" title="Machine hours this week" />}>
          <WeekHoursPanel shopId={user.shopId} now={now} />
        </Suspense>
        <Suspense fallback={<PanelLoading id="waiting" title="Jobs waiting" />}>
          <WaitingJobsPanel shopId={user.shopId} />
        </Suspense>
        <Suspense fallback={<PanelLoading id="due-errors" title="Due soon with error findings" />}>
          <DueWithErrorsPanel shopId={user.shopId} now={now} />
        </Suspense>
        <Suspense fallback={<PanelLoading id="ratio" title={`Actual ÷ estimate, last ${RATIO_DAYS} days`} />}>
          <RatioPanel shopId={user.shopId} now={now} />
        </Suspense>
      </div>
    </>
  );
}
