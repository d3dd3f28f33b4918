// Through-cut and program checks on the generated 1,000,000-line nested-parts program: the
// time analyze() takes and its ratio to interpretation time (target: analysis adds at most
// 30% to interpretation + planning; the planning time is measured by its own benchmark).
import { readFileSync } from 'node:fs';
import path from 'node:path';
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
  console.log(`parts ${out.parts.length}, findings ${out.findings.length} (${out.summary.errors} errors, ${out.summary.warnings} warnings), plunge points ${out.plungePoints.length}`);
}
