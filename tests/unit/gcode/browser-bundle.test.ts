// lib/gcode must run in a Web Worker: no DOM, no Node-only API. Bundle it for the browser
// platform (esbuild, the bundler under tsx and vite) with the worker's stand-ins for the Node
// built-ins gcode-parser imports, then run the bundle in a bare V8 context that has no
// require, process or Buffer, and interpret a program there.
import { build } from 'esbuild';
import path from 'node:path';
import vm from 'node:vm';
import { describe, expect, it } from 'vitest';
import { interpret } from '@/lib/gcode';

const root = path.resolve(__dirname, '../../..');
const shim = path.join(root, 'workers/shims/node-builtins-browser.ts');
const program = 'G21 G90 G17\nT1 M6\nS18000 M3\nG0 X0 Y0 Z5\nG1 Z-3 F600\nG2 X20 Y0 I10 J0 F2400\nG1 X20 Y20\nG0 Z5\nM30\n';

async function bundle(): Promise<string> {
  const out = await build({
    entryPoints: [path.join(root, 'lib/gcode/index.ts')],
    bundle: true,
    write: false,
    platform: 'browser',
    format: 'iife',
    globalName: 'kerfcastGcode',
    alias: { events: shim, fs: shim, stream: shim, timers: shim },
    logLevel: 'silent',
  });
  return out.outputFiles[0].text;
}

describe('lib/gcode in a worker-like context', () => {
  it('bundles for the browser and interprets with no Node globals', async () => {
    const code = await bundle();
    const context = vm.createContext({ setTimeout, clearTimeout, console });
    vm.runInContext(`${code}\nthis.result = JSON.stringify((() => { const r = kerfcastGcode.interpret(${JSON.stringify(program)}); return { count: r.moves.count, arcs: r.moves.arcs.count, x: Array.from(r.moves.x.subarray(0, r.moves.count)), errors: r.diagnostics.filter((d) => d.severity === 'error').length }; })());`, context);
    expect(vm.runInContext('typeof require + typeof process + typeof Buffer', context)).toBe('undefinedundefinedundefined');
    const inWorker = JSON.parse(context.result as string);
    // the same moves as in Node
    const inNode = interpret(program);
    expect(inWorker.count).toBe(inNode.moves.count);
    expect(inWorker.arcs).toBe(1);
    expect(inWorker.x).toEqual(Array.from(inNode.moves.x.subarray(0, inNode.moves.count)));
    expect(inWorker.errors).toBe(0);
  });
});
