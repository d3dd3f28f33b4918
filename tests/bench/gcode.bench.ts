// G-code engine benchmark: on one generated 1,000,000-line program, (a) bare gcode-parser
// parseLine over every line, (b) our whole interpretation to the move list. Prints times,
// lines per second, the ratio b/a (target ≤ 1.3), peak memory and bytes per move (target
// ≤ 100). Also (c): the interpretation with parseLine on every line (tokenizer 'parser'),
// to show what the fast scanner buys. Figures only; nothing here fails on a number.
import v8 from 'node:v8';
import vm from 'node:vm';
import { generateProgram } from '../../fixtures/program-generator';
import { interpret, moveListBytes } from '../../lib/gcode';
import { bareParse, median } from './support';

const LINES = Number(process.env.GCODE_BENCH_LINES ?? '') || 1_000_000;
const ROUNDS = 3;


// a real gc() between rounds makes the memory baseline mean something without a node flag
v8.setFlagsFromString('--expose_gc');
const gc = vm.runInNewContext('gc') as () => void;

function mb(bytes: number): string {
  return (bytes / 1048576).toFixed(1) + ' MB';
}


export default async function gcodeBench(): Promise<void> {
  const t0 = performance.now();
  const text = generateProgram(LINES, 1);
  console.log(`program: ${LINES.toLocaleString('en')} lines, ${mb(text.length)} of text, generated in ${((performance.now() - t0) / 1000).toFixed(2)} s`);

  // warm both paths so neither pays for compilation in the timed rounds
  bareParse(text.slice(0, 2_000_000));
  interpret(text.slice(0, 2_000_000));

  const ta: number[] = [];
  const tb: number[] = [];
  const tc: number[] = [];
  let peak = 0;
  let result: ReturnType<typeof interpret> | undefined;
  for (let r = 0; r < ROUNDS; r++) {
    let s = performance.now();
    bareParse(text);
    ta.push(performance.now() - s);
    result = undefined;
    gc();
    const base = process.memoryUsage();
    const baseBytes = base.heapUsed + base.arrayBuffers;
    let localPeak = 0;
    s = performance.now();
    result = interpret(text, {
      progressEvery: 50_000,
      onProgress: () => {
        const m = process.memoryUsage();
        localPeak = Math.max(localPeak, m.heapUsed + m.arrayBuffers - baseBytes);
      },
    });
    tb.push(performance.now() - s);
    const m = process.memoryUsage();
    peak = Math.max(peak, localPeak, m.heapUsed + m.arrayBuffers - baseBytes);
    s = performance.now();
    interpret(text, { tokenizer: 'parser' });
    tc.push(performance.now() - s);
  }
  const a = median(ta);
  const b = median(tb);
  if (!result) return;

  const moves = result.moves;
  const bytes = moveListBytes(moves);
  console.log(`(a) bare parseLine:     ${(a / 1000).toFixed(3)} s  ${Math.round(LINES / (a / 1000)).toLocaleString('en')} lines/s  (rounds ${ta.map((t) => (t / 1000).toFixed(3)).join(' ')})`);
  console.log(`(b) whole interpret():  ${(b / 1000).toFixed(3)} s  ${Math.round(LINES / (b / 1000)).toLocaleString('en')} lines/s  (rounds ${tb.map((t) => (t / 1000).toFixed(3)).join(' ')})`);
  const c = median(tc);
  console.log(`(c) interpret(), parseLine on every line: ${(c / 1000).toFixed(3)} s  ${Math.round(LINES / (c / 1000)).toLocaleString('en')} lines/s`);
  console.log(`ratio b/a: ${(b / a).toFixed(3)}  (target ≤ 1.3);  c/a: ${(c / a).toFixed(3)}`);
  console.log(`moves: ${moves.count.toLocaleString('en')} (${moves.arcs.count.toLocaleString('en')} arcs), diagnostics: ${result.diagnostics.length}`);
  console.log(`move list: ${mb(bytes)}, ${(bytes / moves.count).toFixed(1)} bytes per move  (target ≤ 100)`);
  console.log(`peak memory above baseline during interpret (heap + array buffers, sampled every 50,000 lines and at the end): ${mb(peak)}, ${(peak / moves.count).toFixed(1)} bytes per move`);
  // a program full of errors: every 4th line broken in one of several ways
  const broken = ['G1 X1..2', 'G0 G1 X5', 'G1 X#1', 'G2 X5 R1 I1', 'G1 X Y', 'O100 sub'];
  const bad = text
    .split('\n')
    .map((l, k) => (k % 4 === 3 ? broken[k % broken.length] : l))
    .join('\n');
  const sd = performance.now();
  const rd = interpret(bad);
  const d = performance.now() - sd;
  console.log(`(d) interpret(), every 4th line an error: ${(d / 1000).toFixed(3)} s, ${rd.diagnostics.length} diagnostics listed (capped per code), ${rd.moves.count.toLocaleString('en')} moves kept; d/a ${(d / a).toFixed(3)}`);
}
