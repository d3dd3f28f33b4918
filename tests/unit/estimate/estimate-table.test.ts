// The CLI's words: the table and the report's counts for the Alder & Finch demo programs. The
// rules are the product's own (README "Command-line estimate"): counts with their plurals,
// hold-downs by label, a heading above the per-tool rows, no capitals for emphasis, each
// finding's line once, verdicts worded as findings, and the README's example sheet within
// Router 1's travel.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { runEstimate, type EstimateJob } from '@/lib/estimate/run-estimate';
import { parseMachineProfile, type MachineProfile } from '@/lib/validation/machine-profile';
import { count, formatEstimateTable, partVerdict } from '@/scripts/estimate-table';
import { parseEstimateArgs, USAGE } from '@/scripts/estimate-args';

const root = path.resolve(__dirname, '../../..');
const read = (p: string) => readFileSync(path.join(root, p), 'utf8');
function profile(name: string): MachineProfile {
  const r = parseMachineProfile(JSON.parse(read(`fixtures/machines/${name}`)));
  if (!r.ok) throw new Error(r.message);
  return r.profile;
}
const router1 = profile('router-1.json');
const sheet = { widthMm: 600, lengthMm: 400, thicknessMm: 18 };

function run(program: string, job: Partial<EstimateJob> = {}) {
  const full: EstimateJob = { sheet, zero: 'top', hold: null, vacuumKpa: null, ...job };
  const { report } = runEstimate(read(program), router1, full, { name: path.basename(program), sha256: '0'.repeat(64) });
  return { report, table: formatEstimateTable(report, router1.name, router1.timeFactor) };
}

describe('estimate table and counts', () => {
  it('counts take their plural: 1 hole, 1 error; 2 holes, 0 errors', () => {
    expect(count(1, 'hole')).toBe('1 hole');
    expect(count(2, 'hole')).toBe('2 holes');
    expect(count(0, 'error')).toBe('0 errors');
    const { table } = run('fixtures/programs/checks/hole-after-profile.nc', { hold: 'tape-glue' });
    expect(table).toMatch(/1 hole,/);
    expect(table).toMatch(/1 through-cut part,/);
    expect(table).toMatch(/\b1 error\b/);
    expect(table).not.toMatch(/\b1 (holes|errors|warnings|tabs|parts|lines)\b/);
  });

  it('the findings line and checks.errors/warnings/infos count exactly the findings listed, the interpreter’s included', () => {
    // the shelf brackets end with G28: the interpreter's home-position note is an info finding
    const { report, table } = run('fixtures/programs/shelf-brackets-birch-18mm.nc', { sheet: { widthMm: 2440, lengthMm: 1220, thicknessMm: 18 }, hold: 'vacuum', vacuumKpa: 60 });
    const by = (s: string) => report.findings.filter((f) => f.severity === s).length;
    expect(by('info')).toBeGreaterThan(0);
    expect(report.checks).toMatchObject({ errors: by('error'), warnings: by('warning'), infos: by('info') });
    expect(table).toContain(`findings           ${report.findings.length}: ${count(by('error'), 'error')}, ${count(by('warning'), 'warning')}, ${by('info')} info`);
  });

  it('shows hold-down labels, not codes, and words the verdict as a finding', () => {
    const { report, table } = run('fixtures/programs/checks/hole-after-profile.nc', { hold: 'tape-glue' });
    expect(table).toMatch(/^hold-down\s+Tape and glue$/m);
    expect(table).not.toMatch(/tape-glue/);
    expect(table).toContain('counted as held (tape and glue assumed)');
    expect(table).not.toMatch(/\bheld by\b/);
    // no verdict says "held" alone
    for (const p of report.parts as Parameters<typeof partVerdict>[0][]) expect(partVerdict(p)).toMatch(/no hold problem found|counted as held|not held/);
  });

  it('without --hold it says no hold-down was given rather than that tabs were chosen', () => {
    const { table, report } = run('fixtures/programs/checks/hole-after-profile.nc');
    expect(table).toContain('No hold-down was given, so only tabs or onion skin left by the program count');
    const unheld = report.findings.find((f) => f.kind === 'unheld-part')!;
    expect(unheld.message).toMatch(/no hold-down was given/);
    expect(table).not.toMatch(/hold-down is tabs/);
  });

  it('has a heading above the per-tool rows, and no words in capitals for emphasis', () => {
    const { table } = run('fixtures/programs/checks/hole-after-profile.nc', { hold: 'clamps' });
    const lines = table.split('\n');
    const heading = lines.findIndex((l) => l.startsWith('time by tool'));
    expect(heading).toBeGreaterThan(0);
    expect(lines[heading]).toMatch(/time\s+feed distance/);
    expect(lines[heading + 1]).toMatch(/^ {2}T1\s/);
    // capitals only in codes and units (M0/M1, T1, G2, ΔP, mm², kPa), never a shouted word
    expect(table).not.toMatch(/\b[A-Z]{3,}\b/);
  });

  it('prints each finding’s line once: "line N  severity: Sentence."', () => {
    const { report, table } = run('fixtures/programs/checks/hole-after-profile.nc', { hold: 'clamps' });
    expect(report.findings.length).toBeGreaterThan(0);
    for (const f of report.findings) {
      // two findings may share a sentence (the same plunge at two lines): take the row
      // that carries this finding's own line, and require exactly one such row
      const own = f.line > 0 ? `line ${f.line}` : 'whole program';
      const rows = table.split('\n').filter((l) => l.includes(f.message) && l.trimStart().startsWith(own + ' '));
      expect(rows, `${f.kind} at ${own}`).toHaveLength(1);
      const row = rows[0];
      const n = row.match(/\bline \d+\b/g) ?? [];
      // the row's own "line N" and at most the other lines the sentence names
      expect(n[0]).toBe(f.line > 0 ? `line ${f.line}` : undefined);
      expect(n.filter((x) => x === `line ${f.line}`)).toHaveLength(f.line > 0 ? 1 : 0);
      expect(f.message).toMatch(/^[A-Z].*\.$/s);
    }
  });
});

describe('--sheet help and the README example', () => {
  it('the usage names the sheet X × Y × T and the parser reads it so', () => {
    expect(USAGE).toContain('--sheet XxYxT');
    const r = parseEstimateArgs(['a.nc', '--machine', 'm.json', '--sheet', '2440x1220x18']);
    expect(r.ok && r.args.sheet).toEqual({ widthMm: 2440, lengthMm: 1220, thicknessMm: 18 });
    const bad = parseEstimateArgs(['a.nc', '--machine', 'm.json', '--sheet', '2440x1220']);
    expect(bad.ok ? '' : bad.message).toMatch(/X×Y×T/);
  });

  it('README’s example command runs on Router 1 with a sheet that fits its travel', () => {
    const readme = read('README.md');
    const cmd = readme.match(/npm run -s estimate -- (\S+) --machine (\S+)[\s\\]+--sheet (\d+)x(\d+)x(\d+)/);
    expect(cmd).not.toBeNull();
    const [, , machinePath, x, y] = cmd!;
    const p = profile(path.basename(machinePath));
    expect(p.name).toBe('Router 1');
    expect(Number(x)).toBeLessThanOrEqual(p.travelMm.x);
    expect(Number(y)).toBeLessThanOrEqual(p.travelMm.y);
    expect(readme).toMatch(/--sheet XxYxT|X × Y × T/);
  });

  it('README says the programmer checks a program, not that the check proves it safe', () => {
    const readme = read('README.md');
    expect(readme).not.toMatch(/prove/i);
    expect(readme).toMatch(/programmer who checks a program/);
  });
});
