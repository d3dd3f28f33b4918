// `node --require tsx/cjs scripts/dump-engine.ts OUT_DIR [--no-cli]`: the engine's behaviour
// written to files, so that a change meant to keep behaviour (a refactor, a speed change) can
// be checked byte for byte: run it before into one folder and after into another, then
// `diff -r BEFORE AFTER` (or compare the SHA256SUMS files each run writes).
//
// What it writes, for every committed example program (fixtures/programs, checks/ included)
// × every hold-down method and none × sheets 3, 12 and 18 mm thick:
//   analyze/…json   analyze() on the interpreted moves (both Z zeros), and a digest of the
//                   move list interpret() built (every column, the arc table included)
//   cli/…json       the estimate CLI's --json output, run as `npm run -s estimate` runs it
// and, once each, analyze() on the 6,000-part nest of the benchmark (fixtures/nest-sheet.ts) and
// on the benchmark's two generated 1,000,000-line programs (fixtures/program-generator.ts: the
// repeated designs and every part different), with the digests of their move lists and the
// estimate's totals.
import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { promisify } from 'node:util';
import { generateNestSheet } from '@/fixtures/nest-sheet';
import { BIRCH_18, generateProgram, NEST_SHEET, nestExtentMm, sheetsIn } from '@/fixtures/program-generator';
import { DEFAULT_DIALECT } from '@/fixtures/program-writer';
import { analyze, loadAnalysis, type AnalysisInput, type HoldDownMethod } from '@/lib/analysis';
import { interpret, type MoveList } from '@/lib/gcode';
import { estimate } from '@/lib/kinematics';
import { HOLD_DOWNS } from '@/lib/validation/enums';
import { parseMachineProfile } from '@/lib/validation/machine-profile';

const run = promisify(execFile);
const root = path.resolve(__dirname, '..');
const THICKNESSES_MM = [3, 12, 18];
const SHEET = { widthMm: 2440, lengthMm: 1220 };
const MACHINE_FILE = path.join(root, 'fixtures/machines/router-1.json');

function moveDigest(m: MoveList): string {
  const h = createHash('sha256');
  h.update(JSON.stringify([m.count, m.startX, m.startY, m.startZ, m.arcs.count]));
  for (const a of [m.x, m.y, m.z, m.kind, m.flags, m.tool, m.feed, m.spindle, m.aux, m.line]) h.update(new Uint8Array(a.buffer, a.byteOffset, m.count * a.BYTES_PER_ELEMENT));
  const t = m.arcs;
  for (const a of [t.move, t.cx, t.cy, t.cz, t.radius, t.sweep, t.plane]) h.update(new Uint8Array(a.buffer, a.byteOffset, t.count * a.BYTES_PER_ELEMENT));
  return h.digest('hex');
}

function programFiles(): string[] {
  const dir = path.join(root, 'fixtures/programs');
  const top = readdirSync(dir).filter((f) => /\.(nc|tap|gcode)$/.test(f));
  const checks = readdirSync(path.join(dir, 'checks')).filter((f) => f.endsWith('.nc')).map((f) => `checks/${f}`);
  return [...top, ...checks].sort();
}

async function main(): Promise<void> {
  const out = process.argv[2];
  if (!out) throw new Error('usage: scripts/dump-engine.ts OUT_DIR [--no-cli]');
  const withCli = !process.argv.includes('--no-cli');
  await loadAnalysis();
  mkdirSync(path.join(out, 'analyze'), { recursive: true });
  mkdirSync(path.join(out, 'cli'), { recursive: true });
  const machine = JSON.parse(readFileSync(MACHINE_FILE, 'utf8'));
  const parsed = parseMachineProfile(machine);
  if (!parsed.ok) throw new Error(parsed.message);
  const profile = parsed.profile;
  const tools = profile.tools.map((t) => ({ number: t.number, diameterMm: t.diameterMm, flutes: t.flutes, kind: t.kind }));
  const limits = { travelMm: profile.travelMm, maxFeedMmPerMin: profile.maxFeedMmPerMin };
  const holds: Array<HoldDownMethod | null> = [...HOLD_DOWNS, null];
  const written: string[] = [];
  const put = (rel: string, text: string) => {
    writeFileSync(path.join(out, rel), text);
    written.push(rel);
  };

  const cliJobs: Array<() => Promise<void>> = [];
  for (const file of programFiles()) {
    const text = readFileSync(path.join(root, 'fixtures/programs', file), 'utf8');
    const { moves } = interpret(text, { home: profile.homeMm });
    const name = file.replace('/', '-');
    put(`analyze/${name}.moves.sha256`, `${moveDigest(moves)}\n`);
    for (const t of THICKNESSES_MM) {
      for (const hold of holds) {
        const tag = `${name}__${hold ?? 'none'}__${t}mm`;
        for (const zZero of ['top', 'table'] as const) {
          const input: AnalysisInput = { sheet: { ...SHEET, thicknessMm: t }, zZero, holdDown: hold, tools, machine: limits };
          put(`analyze/${tag}__${zZero}.json`, `${JSON.stringify(analyze(moves, input), null, 1)}\n`);
        }
        if (withCli) {
          const args = ['--require', 'tsx/cjs', 'scripts/estimate.ts', path.join('fixtures/programs', file), '--machine', MACHINE_FILE, '--sheet', `${SHEET.widthMm}x${SHEET.lengthMm}x${t}`, '--json'];
          if (hold) args.push('--hold', hold);
          cliJobs.push(async () => {
            const { stdout } = await run(process.execPath, args, { cwd: root, maxBuffer: 64 << 20 });
            put(`cli/${tag}.json`, stdout);
          });
        }
      }
    }
  }
  // two CLI processes at a time (the machine has two cores)
  let next = 0;
  await Promise.all([0, 1].map(async () => {
    while (next < cliJobs.length) await cliJobs[next++]();
  }));

  const nest = generateNestSheet({ cols: 60, rows: 100, partWidthMm: 30, partHeightMm: 20, gapMm: 8, holeRadiusMm: 4 });
  const nestMoves = interpret(nest.text).moves;
  put('analyze/nest-6000.moves.sha256', `${moveDigest(nestMoves)}\n`);
  const nestInput: AnalysisInput = { sheet: nest.sheet, zZero: 'top', holdDown: 'vacuum', vacuumKpa: 60, tools: [{ number: 1, diameterMm: 3.175, flutes: 2, kind: 'compression' }] };
  put('analyze/nest-6000.json', `${JSON.stringify(analyze(nestMoves, nestInput))}\n`);

  const generated: Array<[string, string]> = [
    ['generated-repeated', generateProgram(1_000_000, 7)],
    ['generated-distinct', generateProgram(1_000_000, 7, DEFAULT_DIALECT, { designsPerSheet: NEST_SHEET.partsPerSheet })],
  ];
  for (const [name, text] of generated) {
    const extent = nestExtentMm(sheetsIn(text));
    const { moves, diagnostics, facts } = interpret(text);
    put(`analyze/${name}.moves.sha256`, `${moveDigest(moves)}\n`);
    const est = estimate(moves, profile);
    const { cumulativeS, ...figures } = est;
    const clock = createHash('sha256').update(new Uint8Array(cumulativeS.buffer, cumulativeS.byteOffset, cumulativeS.byteLength)).digest('hex');
    put(`analyze/${name}.estimate.json`, `${JSON.stringify({ facts, diagnostics, figures, cumulativeSSha256: clock }, null, 1)}\n`);
    const input: AnalysisInput = {
      sheet: { ...extent, thicknessMm: BIRCH_18.thicknessMm }, zZero: 'top', holdDown: 'vacuum', vacuumKpa: 60, tools,
      machine: { travelMm: { x: extent.widthMm + 100, y: extent.lengthMm + 100, z: profile.travelMm.z }, maxFeedMmPerMin: profile.maxFeedMmPerMin },
    };
    put(`analyze/${name}.json`, `${JSON.stringify(analyze(moves, input))}\n`);
  }

  const sums = written.sort().map((rel) => `${createHash('sha256').update(readFileSync(path.join(out, rel))).digest('hex')}  ${rel}`);
  writeFileSync(path.join(out, 'SHA256SUMS'), `${sums.join('\n')}\n`);
  console.log(`${written.length} files in ${out}`);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
