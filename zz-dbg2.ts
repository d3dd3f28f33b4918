import { readFileSync } from 'node:fs';
import { interpret } from '@/lib/gcode';
import { analyze } from '@/lib/analysis';
import { generateNestSheet } from '@/fixtures/nest-sheet';
const tools = [{ number: 1, diameter: 6.35, flutes: 2, kind: 'compression' }, { number: 2, diameter: 3.175, flutes: 1, kind: 'upcut' }];
for (const [f, sheet] of [['plate-with-hole-tabs', 18], ['plate-with-hole-through', 18], ['hole-after-profile', 18], ['onion-skin', 3], ['rapid-through-stock', 12], ['inch-plate', 19.05]] as const) {
  const res = interpret(readFileSync(`fixtures/programs/checks/${f}.nc`, 'utf8'));
  if (res.diagnostics.length) console.log(res.diagnostics);
  const out = analyze(res.moves, { sheet: { widthMm: 300, lengthMm: 200, thicknessMm: sheet }, zZero: 'top', holdDown: 'clamps', tools });
  console.log(f, JSON.stringify(out.parts.map(p => [p.areaMm2.toFixed(1), p.holes, p.tabs, p.skinMm, p.holdBy, p.freedAtLine])), out.findings.map(x => x.kind + '@' + x.line).join(' '));
}
const n = generateNestSheet();
const res = interpret(n.text);
const out = analyze(res.moves, { sheet: n.sheet, zZero: 'top', holdDown: 'vacuum', tools: [{ number: 1, diameter: 3.175, flutes: 2, kind: 'upcut' }] });
console.log(out.parts.length, out.parts.slice(0, 3).map(p => p.areaMm2), n.parts[0].areaMm2, out.summary.partsUnheld, out.summary.looseSlugs, out.findings.length);
