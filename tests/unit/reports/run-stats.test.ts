// The runs report's figures (lib/reports/run-stats.ts): which runs count, the median and
// quartiles of actual ÷ estimate overall and per machine, and the chart points. Checked against
// simple-statistics (median, quantile: the R-7 / Hyndman & Fan 1996 definition 7 quantile) on a
// pseudo-random set, and against hand-computed small cases.
import { median as ssMedian, quantile as ssQuantile, sum as ssSum } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { endedWithin, ratioPoints, ratioSummary, runStanding, scatterPoints, summaryByMachine, type ReportRun } from '@/lib/reports/run-stats';

let nextId = 1;
function run(actualSeconds: number | null, estimatedSeconds: number | null, day: number, extra: Partial<ReportRun> = {}): ReportRun {
  const finishedAt = new Date(Date.UTC(2026, 10, day, 12));
  return { id: nextId++, machineId: 1, machineName: 'Router 1', actualSeconds, estimatedSeconds, interrupted: false, voided: false, finishedAt, startedAt: new Date(finishedAt.getTime() - 3_600_000), ...extra };
}

/** A fixed pseudo-random sequence (a 32-bit linear congruential generator, Numerical Recipes' constants). */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

describe('which runs count (interrupted, voided, open and unestimated runs are left out)', () => {
  it('names each standing', () => {
    expect(runStanding(run(100, 90, 1))).toBe('counted');
    expect(runStanding(run(100, 90, 1, { voided: true }))).toBe('voided');
    expect(runStanding(run(100, 90, 1, { interrupted: true }))).toBe('interrupted');
    expect(runStanding(run(null, 90, 1, { finishedAt: null }))).toBe('open');
    expect(runStanding(run(100, null, 1))).toBe('no-estimate');
    // a voided run that was also interrupted is reported as voided (the stronger reason)
    expect(runStanding(run(100, 90, 1, { voided: true, interrupted: true }))).toBe('voided');
  });

  it('hand-computed: ratios 1.1, 1.2, 1.0 count; a voided 3.0 and an interrupted 0.2 do not move the median', () => {
    const runs = [run(110, 100, 1), run(120, 100, 2), run(100, 100, 3), run(300, 100, 4, { voided: true }), run(20, 100, 5, { interrupted: true }), run(50, null, 6)];
    const s = ratioSummary(runs);
    expect(s.counted).toBe(3);
    expect(s.leftOut).toEqual({ voided: 1, interrupted: 1, open: 0, 'no-estimate': 1 });
    expect(s.median).toBeCloseTo(1.1, 12);
    // type 7 on 1.0 1.1 1.2: Q1 at h = 0.5 → 1.05, Q3 at h = 1.5 → 1.15
    expect(s.q1).toBeCloseTo(1.05, 12);
    expect(s.q3).toBeCloseTo(1.15, 12);
    // Σ actual ÷ Σ estimate = 330 / 300
    expect(s.totalRatio).toBeCloseTo(1.1, 12);
  });

  it('nothing counted: no figures, only the reasons', () => {
    const s = ratioSummary([run(100, 90, 1, { voided: true }), run(100, 90, 2, { interrupted: true })]);
    expect(s).toMatchObject({ counted: 0, median: null, q1: null, q3: null, totalRatio: null });
    expect(s.leftOut.voided + s.leftOut.interrupted).toBe(2);
  });
});

describe('against simple-statistics on 200 pseudo-random runs over two machines', () => {
  const rnd = lcg(20261204);
  const runs: ReportRun[] = [];
  for (let i = 0; i < 200; i++) {
    const machineId = i % 2 === 0 ? 1 : 2;
    const est = 600 + rnd() * 5400;
    const ratio = (machineId === 1 ? 1.12 : 0.94) * (0.9 + rnd() * 0.2);
    const extra: Partial<ReportRun> = { machineId, machineName: machineId === 1 ? 'Router 1' : 'Router 2', interrupted: i % 17 === 0, voided: i % 23 === 0 };
    runs.push(run(est * ratio, est, 1 + (i % 28), extra));
  }
  const counted = runs.filter((r) => !r.interrupted && !r.voided);

  it('overall median and quartiles equal simple-statistics’ median and quantile(0.25 / 0.75)', () => {
    const ratios = counted.map((r) => r.actualSeconds! / r.estimatedSeconds!);
    const s = ratioSummary(runs);
    expect(s.counted).toBe(ratios.length);
    expect(s.median).toBeCloseTo(ssMedian(ratios), 12);
    expect(s.q1).toBeCloseTo(ssQuantile(ratios, 0.25), 12);
    expect(s.q3).toBeCloseTo(ssQuantile(ratios, 0.75), 12);
    expect(s.totalRatio).toBeCloseTo(ssSum(counted.map((r) => r.actualSeconds!)) / ssSum(counted.map((r) => r.estimatedSeconds!)), 12);
  });

  it('per machine, in name order, each against simple-statistics', () => {
    const by = summaryByMachine(runs);
    expect(by.map((m) => m.machineName)).toEqual(['Router 1', 'Router 2']);
    for (const m of by) {
      const ratios = counted.filter((r) => r.machineId === m.machineId).map((r) => r.actualSeconds! / r.estimatedSeconds!);
      expect(m.counted).toBe(ratios.length);
      expect(m.median).toBeCloseTo(ssMedian(ratios), 12);
      expect(m.q1).toBeCloseTo(ssQuantile(ratios, 0.25), 12);
      expect(m.q3).toBeCloseTo(ssQuantile(ratios, 0.75), 12);
    }
    // the invented machine figures show through: Router 1 over, Router 2 under its estimates
    expect(by[0].median!).toBeGreaterThan(1.05);
    expect(by[1].median!).toBeLessThan(1);
  });
});

describe('chart points', () => {
  it('actual against estimated: every run with both times, left-out runs marked, open and unestimated runs absent', () => {
    const a = run(110, 100, 1);
    const v = run(300, 100, 2, { voided: true });
    const open = run(null, 100, 3, { finishedAt: null });
    const none = run(100, null, 4);
    const points = scatterPoints([a, v, open, none]);
    expect(points.map((p) => [p.id, p.standing, p.estimatedS, p.actualS])).toEqual([
      [a.id, 'counted', 100, 110],
      [v.id, 'voided', 100, 300],
    ]);
    expect(points[0].ratio).toBeCloseTo(1.1, 12);
  });

  it('ratio over time: oldest first by the end of the run', () => {
    const late = run(100, 100, 20);
    const early = run(90, 100, 2);
    const points = ratioPoints([late, early]);
    expect(points.map((p) => p.id)).toEqual([early.id, late.id]);
    expect(points[0].atMs).toBe(Date.UTC(2026, 10, 2, 12));
  });

  it('the last 30 days: a run ended 30 days and one minute ago is out, one ended 29 days ago is in', () => {
    const now = new Date(Date.UTC(2026, 11, 4, 12));
    const out = run(100, 100, 1, { finishedAt: new Date(now.getTime() - 30 * 86_400_000 - 60_000) });
    const inside = run(100, 100, 1, { finishedAt: new Date(now.getTime() - 29 * 86_400_000) });
    const open = run(null, 100, 1, { finishedAt: null });
    expect(endedWithin([out, inside, open], now, 30).map((r) => r.id)).toEqual([inside.id]);
  });
});
