// Properties the motion model must keep for any program (fast-check): a lower bound from the
// speed limits alone, monotonicity in every machine limit, invariance under collinear
// splitting, and accounting that adds up.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { estimate } from '@/lib/kinematics';
import type { MachineProfile } from '@/lib/validation/machine-profile';
import { alongS, restToRestS } from './support/closed-forms';
import { Moves, testProfile } from './support/moves';

type Step = { kind: 'feed' | 'rapid'; x: number; y: number; z: number; f: number } | { kind: 'arc'; sweep: number; r: number; f: number } | { kind: 'dwell'; s: number };

const coord = fc.double({ min: -200, max: 200, noNaN: true });
const step: fc.Arbitrary<Step> = fc.oneof(
  { weight: 6, arbitrary: fc.record({ kind: fc.constant('feed' as const), x: coord, y: coord, z: fc.double({ min: -20, max: 5, noNaN: true }), f: fc.integer({ min: 60, max: 20000 }) }) },
  { weight: 2, arbitrary: fc.record({ kind: fc.constant('rapid' as const), x: coord, y: coord, z: fc.double({ min: -5, max: 30, noNaN: true }), f: fc.constant(0) }) },
  { weight: 1, arbitrary: fc.record({ kind: fc.constant('arc' as const), sweep: fc.double({ min: -6.2, max: 6.2, noNaN: true }), r: fc.double({ min: 0.5, max: 80, noNaN: true }), f: fc.integer({ min: 60, max: 20000 }) }) },
  { weight: 1, arbitrary: fc.record({ kind: fc.constant('dwell' as const), s: fc.double({ min: 0, max: 3, noNaN: true }) }) },
);
const programArb = fc.array(step, { minLength: 1, maxLength: 40 });

const profileArb: fc.Arbitrary<MachineProfile> = fc
  .record({
    ax: fc.integer({ min: 100, max: 3000 }),
    ay: fc.integer({ min: 100, max: 3000 }),
    az: fc.integer({ min: 100, max: 3000 }),
    fx: fc.integer({ min: 1000, max: 40000 }),
    fz: fc.integer({ min: 1000, max: 20000 }),
    cornerTol: fc.double({ min: 0.001, max: 0.1, noNaN: true }),
    n: fc.integer({ min: 0, max: 40 }),
    rate: fc.constantFrom(0, 200, 1000, 5000),
  })
  .map((r) =>
    testProfile({
      accelMmPerS2: { x: r.ax, y: r.ay, z: r.az },
      maxFeedMmPerMin: { x: r.fx, y: r.fx, z: r.fz },
      rapidMmPerMin: { x: r.fx * 1.5, y: r.fx * 1.5, z: r.fz * 1.5 },
      cornerToleranceMm: r.cornerTol,
      lookaheadBlocks: r.n,
      maxBlocksPerS: r.rate,
    }),
  );

function build(steps: Step[], b = new Moves()) {
  let x = 0;
  let y = 0;
  for (const s of steps) {
    if (s.kind === 'feed') { b.feed(s.x, s.y, s.z, s.f); x = s.x; y = s.y; }
    else if (s.kind === 'rapid') { b.rapid(s.x, s.y, s.z); x = s.x; y = s.y; }
    else if (s.kind === 'arc') { b.arcXY(x - s.r, y, s.sweep, s.f); const m = b.build(); x = m.x[m.count - 1]; y = m.y[m.count - 1]; }
    else if (s.kind === 'dwell') b.dwell(s.s);
  }
  return b.build();
}

const total = (steps: Step[], p: MachineProfile) => estimate(build(steps), p).totalSeconds;
const notLess = (hi: number, lo: number) => hi >= lo * (1 - 1e-9) - 1e-12;

describe('invariants (fast-check)', () => {
  it('time ≥ Σ length / speed limit (+ dwells) over straight moves', () => {
    const straight = fc.array(step.filter((s) => s.kind !== 'arc'), { minLength: 1, maxLength: 40 });
    fc.assert(
      fc.property(straight, profileArb, (steps, p) => {
        let bound = 0;
        let px = 0, py = 0, pz = 0;
        for (const s of steps) {
          if (s.kind === 'dwell') { bound += Math.fround(s.s); continue; } // aux is a Float32Array
          const d = Math.hypot(s.x - px, s.y - py, s.z - pz);
          if (d > 1e-9) {
            const [ux, uy, uz] = [(s.x - px) / d, (s.y - py) / d, (s.z - pz) / d];
            // per-axis limits seen along u (support/closed-forms.ts, not the planner's helper)
            let v = s.kind === 'rapid' ? alongS([ux, uy, uz], [p.rapidMmPerMin.x / 60, p.rapidMmPerMin.y / 60, p.rapidMmPerMin.z / 60]) : Math.min(s.f / 60, alongS([ux, uy, uz], [p.maxFeedMmPerMin.x / 60, p.maxFeedMmPerMin.y / 60, p.maxFeedMmPerMin.z / 60]));
            if (p.maxBlocksPerS > 0) v = Math.min(v, d * p.maxBlocksPerS);
            bound += d / v;
            // as the planner (lib/kinematics/block-feed.ts, MIN_BLOCK_MM): a move under 1 nm is
            // no block, and the next one is measured from the last point that made one
            px = s.x; py = s.y; pz = s.z;
          }
        }
        expect(notLess(total(steps, p), bound)).toBe(true);
      }),
      { numRuns: 200 },
    );
  });

  it('time ≤ Σ each block’s rest-to-rest time + the fixed times (tool change, spin-up, dwells)', () => {
    // Upper bound: a trapezoid entered or left above rest is never slower than the same block
    // from rest to rest, and rest-to-rest time only grows as the speed or acceleration limit
    // falls (closed forms in support/closed-forms.ts, written from docs/references.md §3, not the
    // planner's helpers). Straight blocks take their exact limits; an arc's n chords (n =
    // ⌈θ / (2·acos(1 − e/r))⌉, chord count of §3), each of length L/n, take lower bounds of
    // theirs: speed min(F, √(a_plane·r), the smaller in-plane axis feed, (L/n)·R), acceleration
    // the smaller in-plane axis limit.
    let withArcs = 0;
    let runs = 0;
    fc.assert(
      fc.property(programArb, profileArb, (steps, p) => {
        runs++;
        const m = build(steps, new Moves().toolChange(1).spindleStart());
        let bound = p.toolChangeSeconds + p.spindleSpinUpSeconds;
        const feed: [number, number, number] = [p.maxFeedMmPerMin.x / 60, p.maxFeedMmPerMin.y / 60, p.maxFeedMmPerMin.z / 60];
        const rapid: [number, number, number] = [p.rapidMmPerMin.x / 60, p.rapidMmPerMin.y / 60, p.rapidMmPerMin.z / 60];
        const accel: [number, number, number] = [p.accelMmPerS2.x, p.accelMmPerS2.y, p.accelMmPerS2.z];
        const rate = p.maxBlocksPerS > 0 ? p.maxBlocksPerS : Infinity;
        let [px, py, pz] = [0, 0, 0];
        let i = 2; // after the tool change and the spindle start
        let arcs = 0;
        for (const s of steps) {
          if (s.kind === 'dwell') bound += Math.fround(s.s);
          else if (s.kind === 'arc') {
            const r = s.r;
            const sweep = Math.abs(s.sweep);
            const n = sweep === 0 ? 1 : Math.max(1, Math.ceil(sweep / (2 * Math.acos(1 - p.chordToleranceMm / r)) - 1e-9));
            const d = (r * sweep) / n;
            const v = Math.min(s.f / 60, Math.sqrt(Math.min(accel[0], accel[1]) * r), Math.min(feed[0], feed[1]), d * rate);
            if (d > 0) bound += n * restToRestS(d, v, Math.min(accel[0], accel[1]));
            [px, py, pz] = [m.x[i], m.y[i], m.z[i]];
            arcs++;
          } else {
            const dist = Math.hypot(s.x - px, s.y - py, s.z - pz);
            // a move under 1 nm makes no block; the next is measured from the last that did
            if (dist >= 1e-9) {
              const u: [number, number, number] = [(s.x - px) / dist, (s.y - py) / dist, (s.z - pz) / dist];
              const v = Math.min(s.kind === 'rapid' ? alongS(u, rapid) : Math.min(s.f / 60, alongS(u, feed)), dist * rate);
              bound += restToRestS(dist, v, alongS(u, accel));
              [px, py, pz] = [s.x, s.y, s.z];
            }
          }
          i++;
        }
        if (arcs > 0 && arcs < steps.length) withArcs++;
        const t = estimate(m, p).totalSeconds;
        expect(t).toBeLessThanOrEqual(bound * (1 + 1e-9) + 1e-9);
      }),
      { numRuns: 200 },
    );
    expect(runs).toBe(200);
    // about two thirds of the programs mix arcs with other moves (1 step in 10 is an arc)
    expect(withArcs).toBeGreaterThanOrEqual(60);
  });

  it('time never decreases when an acceleration, the block rate or the look-ahead is lowered', () => {
    fc.assert(
      fc.property(programArb, profileArb, fc.double({ min: 0.05, max: 1, noNaN: true }), fc.constantFrom('x', 'y', 'z') as fc.Arbitrary<'x' | 'y' | 'z'>, fc.integer({ min: 1, max: 40 }), fc.integer({ min: 50, max: 5000 }), (steps, p, k, axis, n, rate) => {
        const base = total(steps, p);
        const slowerAccel = { ...p, accelMmPerS2: { ...p.accelMmPerS2, [axis]: p.accelMmPerS2[axis] * k } };
        expect(notLess(total(steps, slowerAccel), base)).toBe(true);
        const lowerRate = p.maxBlocksPerS === 0 ? rate : Math.min(rate, p.maxBlocksPerS);
        expect(notLess(total(steps, { ...p, maxBlocksPerS: lowerRate }), base)).toBe(true);
        const shorter = p.lookaheadBlocks === 0 ? n : Math.max(1, Math.min(n, p.lookaheadBlocks - 1));
        expect(notLess(total(steps, { ...p, lookaheadBlocks: shorter }), base)).toBe(true);
      }),
      { numRuns: 150 },
    );
  });

  it('splitting a straight move into collinear pieces changes time by < 0.5% (unlimited look-ahead and block rate)', () => {
    let checked = 0;
    fc.assert(
      fc.property(programArb, profileArb, fc.nat(39), fc.integer({ min: 2, max: 50 }), (steps, p0, at, pieces) => {
        const p = { ...p0, lookaheadBlocks: 0, maxBlocksPerS: 0 };
        const i = at % steps.length;
        const s = steps[i];
        // only straight moves split; fc.pre draws another case instead of passing this one
        fc.pre(s.kind === 'feed' || s.kind === 'rapid');
        if (s.kind !== 'feed' && s.kind !== 'rapid') return;
        const prev = build(steps.slice(0, i));
        const [px, py, pz] = prev.count ? [prev.x[prev.count - 1], prev.y[prev.count - 1], prev.z[prev.count - 1]] : [0, 0, 0];
        // every piece at least 1 µm, well above the planner's 1 nm minimum block
        // (lib/kinematics/block-feed.ts, MIN_BLOCK_MM): shorter pieces merge into the next
        // block, which is the planner's rule, not the property under test
        fc.pre(Math.hypot(s.x - px, s.y - py, s.z - pz) / pieces >= 1e-3);
        checked++;
        const split: Step[] = [];
        for (let k = 1; k <= pieces; k++) split.push({ ...s, x: px + ((s.x - px) * k) / pieces, y: py + ((s.y - py) * k) / pieces, z: pz + ((s.z - pz) * k) / pieces });
        const a = total(steps, p);
        const b = total([...steps.slice(0, i), ...split, ...steps.slice(i + 1)], p);
        // 10 µs floor for rounding in the clock's sums
        expect(Math.abs(b - a)).toBeLessThan(0.005 * a + 1e-5);
      }),
      { numRuns: 200 },
    );
    // fc.pre skips do not count as runs: all 200 runs compared a split program
    expect(checked).toBe(200);
  });

  it('breakdown and per-tool seconds add up to the total; the clock never runs back', () => {
    fc.assert(
      fc.property(programArb, profileArb, fc.double({ min: -5, max: 20, noNaN: true }), (steps, p, top) => {
        const e = estimate(build(steps), p, { stockTopZ: top });
        const b = e.breakdownSeconds;
        const sum = b.cutting + b.air + b.rapid + b.plunge + b.dwell + b.toolChange + b.spindle;
        expect(sum).toBeCloseTo(e.totalSeconds, 9);
        expect(e.tools.reduce((s, t) => s + t.seconds, 0)).toBeCloseTo(e.totalSeconds, 9);
        for (let i = 1; i < e.cumulativeS.length; i++) expect(e.cumulativeS[i]).toBeGreaterThanOrEqual(e.cumulativeS[i - 1]);
        expect(e.cumulativeS[e.cumulativeS.length - 1]).toBeCloseTo(e.totalSeconds, 9);
      }),
      { numRuns: 200 },
    );
  });
});
