// `npm run bench`: runs every tests/bench/*.bench.ts in name order. Each exports a default
// async function that prints its own figures and ratios. Benchmarks are not tests: they
// never fail on a number, they report it.
import { readdirSync } from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';

async function main() {
  const dir = path.dirname(new URL(import.meta.url).pathname);
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
    const mod = await import(pathToFileURL(path.join(dir, f)).href);
    await mod.default();
  }
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
