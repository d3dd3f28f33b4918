// The `npm run estimate` CLI: its --json equals the library's report for the demo machines,
// and bad input exits 2 with one line on stderr.
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { interpret } from '@/lib/gcode';
import { buildEstimateReport, ENGINE_VERSION, estimate, stockTopZ } from '@/lib/kinematics';
import { runEstimate } from '@/lib/estimate/run-estimate';
import { parseMachineProfile } from '@/lib/validation/machine-profile';

const root = path.resolve(__dirname, '../../..');
const dir = mkdtempSync(path.join(os.tmpdir(), 'kerfcast-estimate-'));
// A shelf-bracket profile in 18 mm birch ply, Z zero on the table (Alder & Finch demo job)
const program = [
  '(shelf bracket, 18 mm birch ply)',
  'G21 G90 G17 G54',
  'M6 T1',
  'M3 S18000',
  'G0 X20 Y20 Z25',
  'G1 Z12 F900',
  'G1 X220 F4800',
  'G3 X240 Y40 I0 J20',
  'G1 Y160',
  'G2 X220 Y180 I-20 J0',
  'G1 X20',
  'G1 Y20',
  'G4 P0.5',
  'G0 Z25',
  'M5',
  'M0',
  'G1 X0 Y0 Z25 F12000',
  'G5 (an unknown G code for a finding)',
  'M30',
].join('\n');
const file = path.join(dir, 'shelf-bracket.nc');
writeFileSync(file, program);

function cli(...args: string[]) {
  return spawnSync('node', ['--require', 'tsx/cjs', 'scripts/estimate.ts', ...args], { cwd: root, encoding: 'utf8' });
}

describe('estimate CLI', () => {
  it.each(['router-1.json', 'router-2.json'])('--json for %s matches the library', (machine) => {
    const profilePath = path.join(root, 'fixtures/machines', machine);
    const r = cli(file, '--machine', profilePath, '--sheet', '2440x1220x18', '--zero', 'table', '--hold', 'vacuum', '--vacuum-kpa', '60', '--json');
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const out = r.stdout.trim();
    expect(out.split('\n')).toHaveLength(1); // exactly one JSON object
    const got = JSON.parse(out);

    const parsed = parseMachineProfile(JSON.parse(readFileSync(profilePath, 'utf8')));
    if (!parsed.ok) throw new Error(parsed.message);
    const result = interpret(program, { home: parsed.profile.homeMm });
    const sha256 = createHash('sha256').update(program).digest('hex');
    const job = { sheet: { widthMm: 2440, lengthMm: 1220, thicknessMm: 18 }, zero: 'table' as const, hold: 'vacuum' as const, vacuumKpa: 60 };
    const want = runEstimate(program, parsed.profile, job, { name: 'shelf-bracket.nc', sha256 }).report;
    // the timing part of the report is the planner's own result, assembled independently here
    const timing = buildEstimateReport({
      file: { name: 'shelf-bracket.nc', sha256, lines: result.facts.lineCount, units: 'mm' },
      estimate: estimate(result.moves, parsed.profile, { stockTopZ: stockTopZ('table', 18) }),
      diagnostics: result.diagnostics,
    });
    expect(got).toEqual(want);
    expect(got.engine).toBe(ENGINE_VERSION);
    expect(got.programStops).toBe(1);
    expect(got.breakdownSeconds.cutting).toBeGreaterThan(0); // Z 12 is below the top at Z 18
    expect(got.parts).toEqual([]);
    const { findings: _f, parts: _p, checks: _c, ...timingOnly } = got;
    const { findings: _wf, parts: _wp, ...wantTiming } = timing;
    expect(timingOnly).toEqual(wantTiming);
    // every interpreter diagnostic is among the findings, with its code as the kind
    for (const d of result.diagnostics) expect(got.findings).toContainEqual({ kind: d.code, severity: d.severity, line: d.line, message: d.message });
    // G5 is no G code of NISTIR 6556 Table 4: the interpreter's diagnostic becomes a finding
    expect(got.findings.filter((f: { line: number }) => f.line === 18)).toEqual([{ kind: 'unsupported-g-code', severity: 'error', line: 18, message: 'G5 is not interpreted; the line is skipped.' }]);
    const b = got.breakdownSeconds;
    expect(b.cutting + b.air + b.rapid + b.plunge + b.dwell + b.toolChange + b.spindle).toBeCloseTo(got.totalSeconds, 4);
  });

  it('prints a table without --json', () => {
    const r = cli(file, '--machine', path.join(root, 'fixtures/machines/router-1.json'));
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/total\s+\d+:\d\d/);
    expect(r.stdout).toMatch(/Router 1/);
  });

  it('exits 2 with one line for a missing file', () => {
    const r = cli(path.join(dir, 'missing.nc'), '--machine', path.join(root, 'fixtures/machines/router-1.json'), '--json');
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/cannot read program .*missing\.nc/);
  });

  it('exits 2 with one line naming the field for a bad profile', () => {
    const bad = JSON.parse(readFileSync(path.join(root, 'fixtures/machines/router-2.json'), 'utf8'));
    bad.accelMmPerS2.z = -5;
    const badPath = path.join(dir, 'bad-profile.json');
    writeFileSync(badPath, JSON.stringify(bad));
    const r = cli(file, '--machine', badPath, '--json');
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/accelMmPerS2\.z: must be greater than 0/);
  });

  it('exits 2 for a profile that is not JSON and for bad arguments', () => {
    const notJson = path.join(dir, 'not-json.json');
    writeFileSync(notJson, '{ name: Router');
    expect(cli(file, '--machine', notJson).status).toBe(2);
    const r = cli(file, '--machine', path.join(root, 'fixtures/machines/router-1.json'), '--zero', 'bottom');
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/--zero must be top or table/);
    expect(cli(file).status).toBe(2); // no --machine
  });
});
