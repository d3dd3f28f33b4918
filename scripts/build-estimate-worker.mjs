// Bundles the estimate worker thread (workers/estimate-worker.ts and the lib/ code it runs)
// into .next/kerfcast/estimate-worker.cjs, the file the server's piscina pool loads. Run
// after `next build` (which empties .next): npm start, npm test and npm run build do.
// Packages stay outside the bundle and load from node_modules as in the CLI, so the polygon
// library finds its WebAssembly file next to its own code.
import { build } from 'esbuild';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const outfile = path.join(root, '.next', 'kerfcast', 'estimate-worker.cjs');

await build({
  absWorkingDir: root,
  entryPoints: ['workers/estimate-worker.ts'],
  outfile,
  bundle: true,
  platform: 'node',
  target: 'node20',
  format: 'cjs',
  packages: 'external',
  tsconfig: 'tsconfig.json',
  sourcemap: true,
  logLevel: 'warning',
});
console.log(`[kerfcast] estimate worker bundled: ${path.relative(root, outfile)}`);
