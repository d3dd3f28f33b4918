// Starts this server process's estimate queue; instrumentation.ts calls it once, in the
// Node.js runtime, when `next start` (or `next dev`) boots. The worker thread runs a bundle
// made at build time (scripts/build-estimate-worker.mjs, run after `next build` by npm start,
// npm test and npm run build): Next's own server bundles do not include a file for
// piscina to load. `next dev`, or a start that finds the bundle missing, builds it first.
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { db } from '@/db/client';
import { env } from '@/lib/env';
import { EstimateQueue } from './runner';
import { registerEstimateQueue, runningEstimateQueue } from './wake';

/** Where the bundled worker is, relative to the app's directory. */
export const ESTIMATE_WORKER_BUNDLE = path.join('.next', 'kerfcast', 'estimate-worker.cjs');

/** ESTIMATE_POOL_SIZE, or the number of cores minus one (the request threads keep one), at least one. */
export function estimatePoolSize(configured: number | undefined = env.ESTIMATE_POOL_SIZE): number {
  const cores = typeof os.availableParallelism === 'function' ? os.availableParallelism() : os.cpus().length;
  return configured ?? Math.max(1, cores - 1);
}

export async function startEstimateQueue(root: string = process.cwd()): Promise<EstimateQueue | undefined> {
  const existing = runningEstimateQueue();
  if (existing instanceof EstimateQueue) return existing;
  // `next build` loads server code to collect pages; it serves nothing and must not claim work
  if (process.env.NEXT_PHASE === 'phase-production-build') return undefined;

  const workerFile = path.join(root, ESTIMATE_WORKER_BUNDLE);
  // `next dev` follows the sources; a later `next build` empties .next, so a bundle gone
  // missing is made again where esbuild is installed (a checkout with its dev packages)
  const buildScript = path.join(root, 'scripts', 'build-estimate-worker.mjs');
  if ((env.NODE_ENV === 'development' || !existsSync(workerFile)) && existsSync(buildScript)) {
    const built = spawnSync(process.execPath, [buildScript], { cwd: root, stdio: 'inherit' });
    if (built.status !== 0) console.error('[kerfcast] estimate queue: building the worker bundle failed');
  }
  if (!existsSync(workerFile)) {
    console.error(
      `[kerfcast] estimate queue not started: ${ESTIMATE_WORKER_BUNDLE} is missing. Run \`node scripts/build-estimate-worker.mjs\` after \`next build\` (npm start and npm test do). Estimates stay pending until a server with the bundle runs.`,
    );
    return undefined;
  }
  const queue = new EstimateQueue({ db, workerFile, poolSize: estimatePoolSize(), leaseMs: env.ESTIMATE_LEASE_SECONDS * 1000 });
  registerEstimateQueue(queue);
  await queue.start();
  return queue;
}
