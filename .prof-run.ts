import { readFileSync } from 'node:fs';
import { BIRCH_18, generateProgram, nestExtentMm, sheetsIn } from '@/fixtures/program-generator';
import { analyze } from '@/lib/analysis';
import { interpret } from '@/lib/gcode';
const machine = JSON.parse(readFileSync('fixtures/machines/router-1.json', 'utf8'));
const text = generateProgram(1_000_000, 7);
const extent = nestExtentMm(sheetsIn(text));
const input: any = { sheet: { ...extent, thicknessMm: 18 }, zZero: 'top', holdDown: 'vacuum', vacuumKpa: 60, tools: machine.tools,
  machine: { travel: { x: extent.widthMm + 100, y: extent.lengthMm + 100, z: 180 }, maxFeed: machine.maxFeed } };
const moves = interpret(text).moves;
for (let i = 0; i < 2; i++) { const t0 = performance.now(); const r = analyze(moves, input); console.log('analyze', (performance.now() - t0).toFixed(0), r.parts.length, r.findings.filter(f=>f.kind==='rapid-in-stock').map(f=>f.message).join('|')); }
