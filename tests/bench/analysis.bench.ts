// Through-cut and program checks on the generated 1,000,000-line nested-parts program: the
// time analyze() takes, its ratio to interpretation time and to interpretation + planning
// (target: the analysis adds at most 30% to interpretation + planning). A second figure on a
// nest of 6,000 small parts that do not overlap, from fixtures/nest-sheet.ts.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { generateNestSheet } from '@/fixtures/nest-sheet';
import { generateProgram } from '@/fixtures/program-generator';
import { analyze } from '@/lib/analysis';
import { interpret } from '@/lib/gcode';

const LINES = 1_000_000;

export default async function bench(): Promise<void> {
  const machine = JSON.parse(readFileSync(path.resolve(__dirname, '../../fixtures/machines/router-1.json'), 'utf8'));
  const text = generateProgram(LINES, 7);
  const input = {
    sheet: { widthMm: 2440, lengthMm: 1220, thicknessMm: 18 },
    zZero: 'top' as const,
    holdDown: 'vacuum' as const,
    vacuumKpa: 60,
    tools: machine.tools,
    machine: { travel: machine.travel, maxFeed: machine.maxFeed },
  };
  // one warm-up run of each, then the timed runs
  let t0 = performance.now();
  let result = interpret(text);
  const interpretColdMs = performance.now() - t0;
  analyze(result.moves, input);
  const runs = 3;
  let interpretMs = Infinity;
  let analyzeMs = Infinity;
  let out = analyze(result.moves, input);
  for (let r = 0; r < runs; r++) {
    t0 = performance.now();
    result = interpret(text);
    interpretMs = Math.min(interpretMs, performance.now() - t0);
    t0 = performance.now();
    out = analyze(result.moves, input);
    analyzeMs = Math.min(analyzeMs, performance.now() - t0);
  }
  console.log(`program: ${LINES.toLocaleString('en')} lines, ${result.moves.count.toLocaleString('en')} moves, ${result.moves.arcs.count.toLocaleString('en')} arcs`);
  console.log(`interpret: ${interpretMs.toFixed(0)} ms (first run ${interpretColdMs.toFixed(0)} ms)`);
  console.log(`analyze:   ${analyzeMs.toFixed(0)} ms (best of ${runs})`);
  console.log(`ratio analyze / interpret: ${(analyzeMs / interpretMs).toFixed(3)}`);
  let planMs = NaN;
  try {
    const { estimate } = await import('@/lib/kinematics');
    const { parseMachineProfile } = await import('@/lib/validation/machine-profile');
    const parsed = parseMachineProfile(machine);
    if (parsed.ok) {
      estimate(result.moves, parsed.profile);
      t0 = performance.now();
      estimate(result.moves, parsed.profile);
      planMs = performance.now() - t0;
    }
  } catch {
    // the planner is measured by its own benchmark when it cannot be loaded here
  }
  if (Number.isFinite(planMs)) {
    console.log(`planning:  ${planMs.toFixed(0)} ms`);
    console.log(`analysis adds ${((analyzeMs / (interpretMs + planMs)) * 100).toFixed(1)}% to interpretation + planning (target ≤ 30%)`);
  }
  console.log(`parts ${out.parts.length}, findings ${out.findings.length} (${out.summary.errors} errors, ${out.summary.warnings} warnings), plunge points ${out.plungePoints.length}`);

  const nest = generateNestSheet({ cols: 60, rows: 100, partWidthMm: 30, partHeightMm: 20, gapMm: 8, holeRadiusMm: 4 });
  const nestMoves = interpret(nest.text).moves;
  const nestInput = { ...input, sheet: nest.sheet, tools: [{ number: 1, diameter: 3.175, flutes: 2, kind: 'compression' }] };
  analyze(nestMoves, nestInput);
  t0 = performance.now();
  interpret(nest.text);
  const nestInterpMs = performance.now() - t0;
  t0 = performance.now();
  const nestOut = analyze(nestMoves, nestInput);
  const nestMs = performance.now() - t0;
  console.log(`nest of ${nestOut.parts.length} parts with a hole each (${nest.text.split('\n').length.toLocaleString('en')} lines): interpret ${nestInterpMs.toFixed(0)} ms, analyze ${nestMs.toFixed(0)} ms, ${((nestMs / nestOut.parts.length) * 1000).toFixed(0)} µs per part`);
}
