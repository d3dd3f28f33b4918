// `npm run estimate` with a sheet and a hold-down: the through-cut checks' parts and findings
// reach the CLI's --json in the shape of the through-cut issue, and the verdict follows the
// hold-down method. The fixture is a 100 × 60 mm plate with a Ø20 mm hole (tool-path sizes)
// whose hole is cut after the outside profile went through.
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const root = path.resolve(__dirname, '../../..');
const program = path.join(root, 'fixtures/programs/checks/hole-after-profile.nc');
const machine = path.join(root, 'fixtures/machines/router-1.json');
const t1 = JSON.parse(readFileSync(machine, 'utf8')).tools.find((t: { number: number }) => t.number === 1);

function estimateJson(...extra: string[]) {
  const r = spawnSync('node', ['--require', 'tsx/cjs', 'scripts/estimate.ts', program, '--machine', machine, '--sheet', '600x400x18', '--json', ...extra], { cwd: root, encoding: 'utf8' });
  expect(r.stderr).toBe('');
  expect(r.status).toBe(0);
  return JSON.parse(r.stdout);
}

describe('estimate CLI with the through-cut checks', () => {
  it('reports the part, its kerf-shrunk area and the cut-order error with both lines', () => {
    const out = estimateJson('--hold', 'vacuum', '--vacuum-kpa', '60');
    expect(out.parts).toHaveLength(1);
    const part = out.parts[0];
    for (const key of ['id', 'order', 'bbox', 'areaMm2', 'perimeterMm', 'holes', 'tabs', 'skinMm', 'held', 'holdBy', 'freedAtLine']) expect(part).toHaveProperty(key);
    // closed form: the outside tool path shrunk by the tool radius, (W − d)(H − d), minus the
    // hole's tool path grown by it, π(r + d/2)²; Clipper's round joins are within 0.5 %
    const d = t1.diameterMm;
    const want = (100 - d) * (60 - d) - Math.PI * (10 + d / 2) ** 2;
    expect(Math.abs(part.areaMm2 - want) / want).toBeLessThan(0.005);
    expect(part.holes).toBe(1);
    expect(part.freedAtLine).toBe(11); // line 11 closes the outside profile at full depth
    const order = out.findings.find((f: { kind: string }) => f.kind === 'cut-order');
    expect(order).toMatchObject({ severity: 'error', line: 14, part: part.id });
    expect(order.message).toMatch(/line 11/);
    expect(out.checks.note).toMatch(/aid, not a guarantee/);
  });

  it('holds the part with tape and glue, not with clamps', () => {
    const taped = estimateJson('--hold', 'tape-glue').parts[0];
    expect(taped).toMatchObject({ held: true, holdBy: 'tape-glue' });
    const clamped = estimateJson('--hold', 'clamps');
    expect(clamped.parts[0]).toMatchObject({ held: false, holdBy: 'none' });
    expect(clamped.findings.some((f: { kind: string; severity: string }) => f.kind === 'unheld-part' && f.severity === 'error')).toBe(true);
  });

  it('without --hold nothing but the program holds a part, and says it assumed so', () => {
    const out = estimateJson();
    expect(out.checks.holdDownAssumed).toBe(true);
    expect(out.parts[0].held).toBe(false);
  });
});
