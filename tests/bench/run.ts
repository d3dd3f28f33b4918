// `npm run bench`: runs every tests/bench/*.bench.ts in name order. Each exports a default
// async function that prints its own figures and ratios. Benchmarks are not tests: they
// never fail on a number, they report it.
//
// The benchmarks load the sources as CommonJS through tsx's require hook (`node --require
// tsx/cjs`), which runs them as the app ships them: Next.js bundles the worker and the server
// code into plain scripts, and the figures here match an esbuild bundle of the same code to a
// few per cent. Loaded through the `tsx` command, whose ESM loader evaluates every module, the
// same code ran 15–25% slower in its long loops (measured on the analysis's move pass: 155 ms
// against 131 ms, the modules compiled by esbuild with the same options either way), so
// figures taken that way would measure the loader rather than the code.
import { readdirSync } from 'node:fs';
import path from 'node:path';

async function main() {
  const dir = __dirname;
  const only = process.argv[2];
  const files = readdirSync(dir)
    .filter((f) => f.endsWith('.bench.ts'))
    .filter((f) => !only || f.includes(only))
    .sort();
  if (files.length === 0) {
    console.error('no benchmark files found');
    process.exit(1);
  }
  for (const f of files) {
    console.log(`\n== ${f} ==`);
    // eslint-disable-next-line @typescript-eslint/no-require-imports -- loaded as CommonJS, see the header
    const mod = require(path.join(dir, f)) as { default: () => Promise<void> };
    await mod.default();
  }
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
