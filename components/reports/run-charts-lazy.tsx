'use client';
// The charts loaded in the browser only (they measure the page; see run-charts.tsx), with a
// loading state while their code arrives.
import dynamic from 'next/dynamic';

function ChartsLoading() {
  return (
    <div role="status" aria-live="polite" className="grid gap-6 lg:grid-cols-2" data-testid="charts-loading">
      {['Actual against estimated', 'Actual ÷ estimate over time'].map((t) => (
        <div key={t} className="flex h-[26rem] items-center justify-center rounded-md border-2 border-dashed border-rule bg-panel text-ink-soft">
          Drawing the chart “{t}”…
        </div>
      ))}
    </div>
  );
}

export const RunChartsLazy = dynamic(() => import('./run-charts'), { ssr: false, loading: ChartsLoading });
