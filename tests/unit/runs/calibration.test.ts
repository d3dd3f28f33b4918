// Calibration maths (lib/runs/calibration.ts) against hand-computed worked examples.
// Quartiles by linear interpolation between order statistics, Hyndman & Fan (1996), "Sample
// quantiles in statistical packages", The American Statistician 50(4), definition 7:
// Q(p) = x[h] with h = (n − 1)·p (0-based), interpolated between neighbours. numpy's
// documentation gives np.percentile([1, 2, 3, 4], [25, 75]) = [1.75, 3.25] for it (from memory).
import { describe, expect, it } from 'vitest';
import { calibrate, countsInStatistics, factorInWords, runRatio, spreadOf, type RunForStats } from '@/lib/runs/calibration';

let nextId = 1;
function run(actualSeconds: number, estimatedSeconds: number, day: number, extra: Partial<RunForStats> = {}): RunForStats {
  return { id: nextId++, actualSeconds, estimatedSeconds, interrupted: false, voided: false, finishedAt: new Date(Date.UTC(2026, 10, day, 12)), ...extra };
}

describe('median and interquartile range (Hyndman & Fan type 7)', () => {
  it('gives 1.75 and 3.25 for 1, 2, 3, 4 (numpy percentile example)', () => {
    const s = spreadOf([4, 1, 3, 2]);
    expect(s.median).toBe(2.5);
    expect(s.q1).toBeCloseTo(1.75, 12);
    expect(s.q3).toBeCloseTo(3.25, 12);
    expect(s.iqr).toBeCloseTo(1.5, 12);
  });

  it('odd count by hand: 0.9 1.0 1.1 1.2 1.3 → median 1.1, Q1 1.0 (h = 1), Q3 1.2 (h = 3)', () => {
    const s = spreadOf([1.3, 0.9, 1.2, 1.0, 1.1]);
    expect(s.median).toBeCloseTo(1.1, 12);
    expect(s.q1).toBeCloseTo(1.0, 12);
    expect(s.q3).toBeCloseTo(1.2, 12);
  });

  it('even count by hand: 1.00 1.04 1.10 1.20 1.30 1.50 → median 1.15, Q1 = 1.04 + 0.25·0.06 = 1.055, Q3 = 1.20 + 0.75·0.10 = 1.275', () => {
    const s = spreadOf([1.5, 1.04, 1.2, 1.0, 1.3, 1.1]);
    expect(s.median).toBeCloseTo(1.15, 12);
    expect(s.q1).toBeCloseTo(1.055, 12);
    expect(s.q3).toBeCloseTo(1.275, 12);
    expect(s.iqr).toBeCloseTo(0.22, 12);
  });

  it('refuses an empty list rather than inventing a figure', () => {
    expect(() => spreadOf([])).toThrow();
  });
});

describe('which runs count', () => {
  it('leaves out interrupted, voided, open and estimate-less runs', () => {
    expect(countsInStatistics(run(600, 500, 1))).toBe(true);
    expect(countsInStatistics(run(600, 500, 1, { interrupted: true }))).toBe(false);
    expect(countsInStatistics(run(600, 500, 1, { voided: true }))).toBe(false);
    expect(countsInStatistics(run(600, 500, 1, { finishedAt: null }))).toBe(false);
    expect(countsInStatistics(run(600, 500, 1, { estimatedSeconds: null }))).toBe(false);
    expect(runRatio({ actualSeconds: 660, estimatedSeconds: 600 })).toBeCloseTo(1.1, 12);
    expect(runRatio({ actualSeconds: 660, estimatedSeconds: null })).toBeNull();
  });

  it('a voided 10× run and an interrupted 0.2× run do not move the median', () => {
    // ratios 1.0 1.1 1.2 1.3 1.4 by hand → median 1.2; with the two outliers left in it would be 1.15
    const good = [1.0, 1.1, 1.2, 1.3, 1.4].map((r, i) => run(1000 * r, 1000, i + 1));
    const c = calibrate([...good, run(10_000, 1000, 10, { voided: true }), run(200, 1000, 11, { interrupted: true })], { lastRuns: 20, minimumRuns: 5 });
    expect(c.suggestedFactor).toBe(1.2);
    expect(c.runs).toBe(5);
    expect(c.iqr).toEqual({ q1: 1.1, q3: 1.3, range: 0.2 });
  });
});

describe('the minimum-runs rule and the last N', () => {
  it('suggests nothing with fewer runs than the minimum and says how many more', () => {
    const c = calibrate([run(1100, 1000, 1), run(1200, 1000, 2), run(1150, 1000, 3), run(1000, 1000, 4, { interrupted: true })], { lastRuns: 20, minimumRuns: 5 });
    expect(c.suggestedFactor).toBeNull();
    expect(c.runs).toBe(3);
    expect(c.minimumRuns).toBe(5);
    expect(c.message).toMatch(/Only 3 .* at least 5, so 2 more/);
    const none = calibrate([], { lastRuns: 20, minimumRuns: 5 });
    expect(none).toMatchObject({ suggestedFactor: null, runs: 0, iqr: null });
    expect(none.message).toMatch(/^No finished/);
  });

  it('suggests at exactly the minimum', () => {
    const c = calibrate([0.95, 1.05, 1.1, 1.15, 1.25].map((r, i) => run(1000 * r, 1000, i + 1)), { lastRuns: 20, minimumRuns: 5 });
    expect(c.suggestedFactor).toBe(1.1);
    expect(c.message).toMatch(/about 10 % longer than estimated/);
  });

  it('uses only the newest N counting runs', () => {
    // five old runs at 2.0, then five new at 1.0 1.1 1.2 1.3 1.4: with N = 5 the median is 1.2
    const old = [1, 2, 3, 4, 5].map((d) => run(2000, 1000, d));
    const recent = [1.0, 1.1, 1.2, 1.3, 1.4].map((r, i) => run(1000 * r, 1000, 20 + i));
    const c = calibrate([...recent, ...old], { lastRuns: 5, minimumRuns: 3 });
    expect(c.suggestedFactor).toBe(1.2);
    expect(c.runIds).toEqual(recent.map((r) => r.id).reverse());
    const all = calibrate([...recent, ...old], { lastRuns: 20, minimumRuns: 3 });
    // ten ratios 1.0 1.1 1.2 1.3 1.4 2 2 2 2 2 → median (1.4 + 2.0) / 2 = 1.7
    expect(all.suggestedFactor).toBe(1.7);
  });

  it('rounds the factor to three decimals and says what applying it does', () => {
    const c = calibrate([1.0, 1.0, 1.0123, 1.03, 1.04].map((r, i) => run(1000 * r, 1000, i + 1)), { lastRuns: 20, minimumRuns: 5, currentFactor: 1 });
    expect(c.suggestedFactor).toBe(1.012);
    expect(c.message).toMatch(/from 1\.000 to 1\.012 in a new machine version/);
  });
});

describe('plain words', () => {
  it('says longer, shorter or about the same', () => {
    expect(factorInWords(1.12)).toBe('runs take about 12 % longer than estimated');
    expect(factorInWords(0.9)).toBe('runs take about 10 % less time than estimated');
    expect(factorInWords(1.004)).toBe('runs take about as long as estimated');
  });
});
