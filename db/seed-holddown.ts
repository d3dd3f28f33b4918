// Demo data for the hold-down comparison: the price-tag-holder job ("Shelf-edge price-tag
// holders", 240 pieces of 3 mm cast acrylic on Router 1) gets its program, a sheet of 64 small
// holders of 26.8 × 24.8 mm cut with the 3.175 mm up-cut tool T2 (fixtures/price-tag-nest.ts),
// stored the way an upload stores it, with its estimate queued for the server to compute on
// start. The estimate's per-method analysis then shows vacuum ruled out part by part (each
// part's area is too small for Router 1's 61 kPa table against the side force) and tape and
// glue suggested. Idempotent: a job that already has the program is left as it is.
import { and, eq } from 'drizzle-orm';
import { PRICE_TAG_NEST_NAME, priceTagNest } from '@/fixtures/price-tag-nest';
import { jobEstimateSettings, requestEstimate } from '@/lib/estimate-server/request';
import type { Tx } from './queries/machines';
import { storeSeedProgram } from './seed-program';
import { jobEvents, jobs, programs, users } from './schema';

export const HOLD_DOWN_DEMO_JOB = 'Shelf-edge price-tag holders';

/** Returns the estimate id queued, or null when the program was already there (or the job is missing). */
export async function seedHoldDownDemo(tx: Tx, shopId: number): Promise<number | null> {
  const [job] = await tx.select().from(jobs).where(and(eq(jobs.shopId, shopId), eq(jobs.title, HOLD_DOWN_DEMO_JOB)));
  if (!job || job.machineId === null) return null;
  const [existing] = await tx.select({ id: programs.id }).from(programs).where(and(eq(programs.jobId, job.id), eq(programs.name, PRICE_TAG_NEST_NAME)));
  if (existing) return null;
  const [priya] = await tx.select({ id: users.id }).from(users).where(and(eq(users.shopId, shopId), eq(users.role, 'programmer')));
  const bytes = Buffer.from(priceTagNest().text, 'utf8');
  const { programId, versionId, sha256 } = await storeSeedProgram(tx, { shopId, jobId: job.id, name: PRICE_TAG_NEST_NAME, bytes, uploadedBy: priya?.id ?? null });
  if (job.status === 'draft') {
    await tx.update(jobs).set({ status: 'programmed' }).where(eq(jobs.id, job.id));
    await tx.insert(jobEvents).values({ shopId, jobId: job.id, userId: priya?.id ?? null, kind: 'status', detail: 'draft>programmed' });
  }
  const requested = await requestEstimate(tx, {
    shopId,
    programId,
    programVersionId: versionId,
    programVersion: 1,
    sha256,
    machineId: job.machineId,
    requestedBy: priya?.id ?? null,
    settings: jobEstimateSettings(job),
  });
  return requested.id;
}
