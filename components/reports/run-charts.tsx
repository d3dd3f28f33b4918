'use client';
// The two estimated-vs-actual charts (recharts): actual against estimated with the y = x line
// (a point above it ran longer than estimated), and actual ÷ estimate over time with the
// 1.0 line. Each machine is its own series with its own marker shape; runs left out of the
// statistics (interrupted, voided) are drawn as hollow crosses in one grey series, so shape and
// the legend's words carry the meaning, never colour alone. Client only: the charts measure the
// page, and their inline styles are set from script, which the page's CSP allows.
import { CartesianGrid, Legend, ReferenceLine, Scatter, ScatterChart, Tooltip, XAxis, YAxis } from 'recharts';
import type { RatioPoint, ScatterPoint } from '@/lib/reports/run-stats';
import { STANDING_WORDS } from '@/lib/reports/run-stats';

export interface ChartMachine {
  id: number;
  name: string;
}

// our palette's strong tones (tailwind.config.ts): spruce, ok blue, caution violet, ink soft
const SERIES_COLOURS = ['#0b5a57', '#1f4f8a', '#6a3590', '#3d434b'];
const SHAPES = ['circle', 'square', 'triangle', 'diamond', 'star', 'wye'] as const;
const LEFT_OUT_COLOUR = '#5c636c';

const minutes = (s: number) => s / 60;
const fmtMin = (v: number) => `${Math.round(v)}`;
const fmtDay = (ms: number) => new Date(ms).toISOString().slice(5, 10);

/** The next round number at or above v (1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6 or 8 times a power of ten). */
function niceCeil(v: number): number {
  const p = 10 ** Math.floor(Math.log10(v));
  return ([1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10].find((m) => m * p >= v) ?? 10) * p;
}

/** Ticks from lo to hi in steps of step, rounded so 1.00 and whole minutes fall on ticks. */
function stepTicks(lo: number, hi: number, step: number): number[] {
  const out: number[] = [];
  for (let i = 0; lo + i * step <= hi + 1e-9; i++) out.push(Math.round((lo + i * step) * 1000) / 1000);
  return out;
}

function splitBy<T extends { machineId: number; standing: string }>(points: readonly T[], machines: readonly ChartMachine[]) {
  return {
    byMachine: machines.map((m) => ({ machine: m, points: points.filter((p) => p.machineId === m.id && p.standing === 'counted') })).filter((g) => g.points.length > 0),
    leftOut: points.filter((p) => p.standing !== 'counted'),
  };
}

function ChartFrame({ title, caption, children, testId }: { title: string; caption: string; children: React.ReactNode; testId: string }) {
  return (
    <figure className="rounded-md border-2 border-rule bg-panel p-4" data-testid={testId}>
      <figcaption>
        <h3 className="text-lg font-bold">{title}</h3>
        <p className="text-sm text-ink-soft">{caption}</p>
      </figcaption>
      <div className="mt-3 h-[22rem] w-full">{children}</div>
    </figure>
  );
}

export function ActualVsEstimatedChart({ points, machines }: { points: ScatterPoint[]; machines: ChartMachine[] }) {
  const { byMachine, leftOut } = splitBy(points, machines);
  const max = niceCeil(Math.max(1, ...points.map((p) => Math.max(minutes(p.estimatedS), minutes(p.actualS)))) * 1.05);
  const ticks = stepTicks(0, max, max / 5);
  return (
    <ChartFrame
      testId="chart-actual-vs-estimated"
      title="Actual against estimated"
      caption="Each mark is a run, in minutes. On the diagonal line the run took exactly its estimate; above it, longer."
    >
      <ScatterChart responsive style={{ width: '100%', height: '100%' }} margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
        <CartesianGrid stroke="#c9ccd1" />
        <XAxis type="number" dataKey="x" name="Estimate (min)" domain={[0, max]} ticks={ticks} tickFormatter={fmtMin} label={{ value: 'Estimate (min)', position: 'insideBottom', offset: -12 }} />
        <YAxis type="number" dataKey="y" name="Actual (min)" domain={[0, max]} ticks={ticks} tickFormatter={fmtMin} width={64} label={{ value: 'Actual (min)', angle: -90, position: 'insideLeft', offset: 4 }} />
        <ReferenceLine segment={[{ x: 0, y: 0 }, { x: max, y: max }]} stroke="#15181c" strokeDasharray="6 4" ifOverflow="extendDomain" label={{ value: 'actual = estimate', position: 'insideTopLeft' }} />
        <Tooltip cursor={{ strokeDasharray: '3 3' }} formatter={(v) => (typeof v === 'number' ? v.toFixed(1) : String(v))} />
        <Legend verticalAlign="top" height={32} />
        {byMachine.map((g, i) => (
          <Scatter
            key={g.machine.id}
            name={g.machine.name}
            data={g.points.map((p) => ({ x: minutes(p.estimatedS), y: minutes(p.actualS), id: p.id }))}
            fill={SERIES_COLOURS[i % SERIES_COLOURS.length]}
            shape={SHAPES[i % SHAPES.length]}
            isAnimationActive={false}
          />
        ))}
        {leftOut.length > 0 ? (
          <Scatter name="Left out (interrupted or voided)" data={leftOut.map((p) => ({ x: minutes(p.estimatedS), y: minutes(p.actualS), id: p.id }))} fill="none" stroke={LEFT_OUT_COLOUR} shape="cross" isAnimationActive={false} />
        ) : null}
      </ScatterChart>
    </ChartFrame>
  );
}

export function RatioOverTimeChart({ points, machines }: { points: RatioPoint[]; machines: ChartMachine[] }) {
  const { byMachine, leftOut } = splitBy(points, machines);
  const ratios = points.map((p) => p.ratio);
  const lo = Math.floor(Math.min(0.8, ...ratios) * 0.97 * 10) / 10;
  const hi = Math.ceil(Math.max(1.2, ...ratios) * 1.03 * 10) / 10;
  const ticks = stepTicks(lo, hi, hi - lo > 1 ? 0.2 : 0.1);
  return (
    <ChartFrame testId="chart-ratio-over-time" title="Actual ÷ estimate over time" caption="Each mark is a run, by the day it ended (UTC). On the 1.00 line a run took exactly its estimate.">
      <ScatterChart responsive style={{ width: '100%', height: '100%' }} margin={{ top: 8, right: 48, bottom: 24, left: 8 }}>
        <CartesianGrid stroke="#c9ccd1" />
        <XAxis type="number" dataKey="x" name="Ended" scale="time" domain={['dataMin', 'dataMax']} tickFormatter={fmtDay} label={{ value: 'Day ended (month-day)', position: 'insideBottom', offset: -12 }} />
        <YAxis type="number" dataKey="y" name="Actual ÷ estimate" domain={[lo, hi]} ticks={ticks} tickFormatter={(v: number) => v.toFixed(2)} />
        <ReferenceLine y={1} stroke="#15181c" strokeDasharray="6 4" label={{ value: '1.00', position: 'right' }} />
        <Tooltip labelFormatter={() => ''} formatter={(v, name) => (name === 'Ended' && typeof v === 'number' ? new Date(v).toISOString().slice(0, 10) : typeof v === 'number' ? v.toFixed(3) : String(v))} />
        <Legend verticalAlign="top" height={32} />
        {byMachine.map((g, i) => (
          <Scatter
            key={g.machine.id}
            name={g.machine.name}
            data={g.points.map((p) => ({ x: p.atMs, y: p.ratio, id: p.id }))}
            fill={SERIES_COLOURS[i % SERIES_COLOURS.length]}
            shape={SHAPES[i % SHAPES.length]}
            line={{ stroke: SERIES_COLOURS[i % SERIES_COLOURS.length], strokeWidth: 1 }}
            isAnimationActive={false}
          />
        ))}
        {leftOut.length > 0 ? (
          <Scatter name={`Left out (${[...new Set(leftOut.map((p) => STANDING_WORDS[p.standing].split(':')[0].toLowerCase()))].join(', ')})`} data={leftOut.map((p) => ({ x: p.atMs, y: p.ratio, id: p.id }))} fill="none" stroke={LEFT_OUT_COLOUR} shape="cross" isAnimationActive={false} />
        ) : null}
      </ScatterChart>
    </ChartFrame>
  );
}

export default function RunCharts({ scatter, ratio, machines }: { scatter: ScatterPoint[]; ratio: RatioPoint[]; machines: ChartMachine[] }) {
  return (
    <div className="grid gap-6 lg:grid-cols-2">
      <ActualVsEstimatedChart points={scatter} machines={machines} />
      <RatioOverTimeChart points={ratio} machines={machines} />
    </div>
  );
}
