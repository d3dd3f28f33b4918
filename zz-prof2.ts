import { readFileSync } from 'node:fs';
import { generateProgram } from './fixtures/program-generator';
import { interpret } from './lib/gcode';
import { estimate } from './lib/kinematics';
import { parseMachineProfile } from './lib/validation/machine-profile';
const p = parseMachineProfile(JSON.parse(readFileSync('fixtures/machines/router-1.json', 'utf8')));
if (!p.ok) throw 1;
const r = interpret(generateProgram(200000, 1));
for (let k = 0; k < 6; k++) { const s = performance.now(); estimate(r.moves, p.profile); console.log((performance.now() - s).toFixed(0)); }
