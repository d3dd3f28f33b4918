// Estimating-engine benchmark: on the generated 1,000,000-line program, (a) bare gcode-parser
// parseLine over every line, (b) interpretation + planning (interpret() then estimate()) on
// Router 1. Prints times, the ratio b/a (target ≤ 1.6), planning alone, and the planner's
// memory per move (its ring and the per-move clock, and the heap growth while it runs).
// Figures only; nothing here fails on a number.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { generateProgram } from '../../fixtures/program-generator';
import { interpret } from '../../lib/gcode';
import { estimate } from '../../lib/kinematics';
import { parseMachineProfile } from '../../lib/validation/machine-profile';
import { bareParse, median } from './support';

const LINES = Number(process.env.KINEMATICS_BENCH_LINES ?? '') || 1_000_000;
const ROUNDS = 3;



export default async function kinematicsBench(): Promise<void> {
  const root = path.resolve(__dirname, '../..');
  const parsed = parseMachineProfile(JSON.parse(readFileSync(path.join(root, 'fixtures/machines/router-1.json'), 'utf8')));
  if (!parsed.ok) throw new Error(`router-1.json: ${parsed.message}`);
  const profile = parsed.profile;

  const text = generateProgram(LINES, 1);
  console.log(`program: ${LINES.toLocaleString('en')} lines, ${(text.length / 1048576).toFixed(1)} MB; machine ${profile.name} (look-ahead ${profile.lookaheadBlocks} blocks, block rate ${profile.maxBlocksPerS}/s)`);

  // warm-up so that neither path pays for compilation in the timed rounds
  const warm = text.slice(0, 2_000_000);
  bareParse(warm);
  estimate(interpret(warm).moves, profile);

  const ta: number[] = [];
  const tb: number[] = [];
  const tp: number[] = [];
  let heapGrowth = 0;
  let last = estimate(interpret('').moves, profile);
  for (let r = 0; r < ROUNDS; r++) {
    let s = performance.now();
    bareParse(text);
    ta.push(performance.now() - s);

    s = performance.now();
    const result = interpret(text);
    const mid = performance.now();
    (globalThis as { gc?: () => void }).gc?.();
    const before = process.memoryUsage();
    const p0 = performance.now();
    last = estimate(result.moves, profile);
    const end = performance.now();
    const after = process.memoryUsage();
    tb.push(mid - s + (end - p0));
    tp.push(end - p0);
    heapGrowth = Math.max(heapGrowth, after.heapUsed + after.arrayBuffers - before.heapUsed - before.arrayBuffers);
  }
  const a = median(ta);
  const b = median(tb);
  const p = median(tp);
  const moves = last.moves;
  console.log(`bare gcode-parser parseLine:     ${(a / 1000).toFixed(2)} s`);
  console.log(`interpretation + planning:       ${(b / 1000).toFixed(2)} s   ratio ${(b / a).toFixed(2)} (target ≤ 1.6)`);
  console.log(`planning alone:                  ${(p / 1000).toFixed(2)} s   ${((moves / p) * 1000 / 1e6).toFixed(1)} M moves/s, ${last.blocks.toLocaleString('en')} blocks from ${moves.toLocaleString('en')} moves`);
  const held = last.cumulativeS.byteLength + last.plannerBytes;
  console.log(`planner memory:                  ${(held / moves).toFixed(1)} bytes/move held (clock ${last.cumulativeS.byteLength / moves} B/move + ring ${last.plannerBytes} B, peak ${last.plannerPeakBlocks} blocks); heap growth during planning ${(heapGrowth / moves).toFixed(1)} bytes/move`);
  console.log(`estimate: ${(last.totalSeconds / 3600).toFixed(2)} h, cutting ${(last.breakdownSeconds.cutting / 3600).toFixed(2)} h, ${last.tools.length} tools`);
}
