// Setup for the unit project: every fast-check property of a run draws from one seed, taken
// from FC_SEED when set (to replay a red run) or drawn here, and printed when a test fails,
// so any failure can be reproduced with `FC_SEED=<seed> npm test -- --project unit`.
import fc from 'fast-check';
import { beforeEach } from 'vitest';

const fromEnv = process.env.FC_SEED;
if (fromEnv !== undefined && !/^-?\d+$/.test(fromEnv.trim())) {
  throw new Error(`FC_SEED must be a whole number (the seed a failed run printed), not "${fromEnv}".`);
}
const seed = fromEnv !== undefined ? Number(fromEnv) : (Math.random() * 0x7fffffff) | 0;
fc.configureGlobal({ seed });

beforeEach((context) => {
  context.onTestFailed(() => {
    console.error(`[fast-check] "${context.task.name}" failed: replay this run with FC_SEED=${seed}`);
  });
});
