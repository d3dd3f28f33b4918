import 'server-only';
// Jobs of a shop, listed with their customer's and material's names. Every function
// takes the shop id; the joins repeat the shop filter so that a row of another shop
// can never leak in through a foreign key.
import { and, desc, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { customers, jobs, materials, type Job } from '@/db/schema';
import { AppError } from '@/lib/errors';
import type { JobCreateInput, JobStatusInput } from '@/lib/validation/jobs';
import { getCustomer } from './customers';
import { materialBelongsToShop } from './materials';

export type JobRow = Job & { customerName: string; materialName: string | null };

const listColumns = {
  job: jobs,
  customerName: customers.name,
  materialName: materials.name,
};

function baseQuery(shopId: number) {
  return db
    .select(listColumns)
    .from(jobs)
    .innerJoin(customers, and(eq(customers.id, jobs.customerId), eq(customers.shopId, shopId)))
    .leftJoin(materials, and(eq(materials.id, jobs.materialId), eq(materials.shopId, shopId)));
}

const flatten = (r: { job: Job; customerName: string; materialName: string | null }): JobRow => ({
  ...r.job,
  customerName: r.customerName,
  materialName: r.materialName,
});

export async function listJobs(shopId: number): Promise<JobRow[]> {
  const rows = await baseQuery(shopId).where(eq(jobs.shopId, shopId)).orderBy(desc(jobs.updatedAt), desc(jobs.id));
  return rows.map(flatten);
}

export async function getJob(shopId: number, jobId: number): Promise<JobRow | null> {
  const rows = await baseQuery(shopId).where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId))).limit(1);
  return rows[0] ? flatten(rows[0]) : null;
}

export async function createJob(shopId: number, input: JobCreateInput): Promise<JobRow> {
  // A customer or material of another shop is answered like a mistyped one.
  const fields: Record<string, string[]> = {};
  if (!(await getCustomer(shopId, input.customerId))) fields.customerId = ['Choose a customer of your shop.'];
  if (input.materialId !== undefined && !(await materialBelongsToShop(shopId, input.materialId))) {
    fields.materialId = ['Choose a material of your shop.'];
  }
  if (Object.keys(fields).length > 0) throw new AppError('invalid:job', 'Some job fields are not right.', fields);

  const [{ id }] = await db
    .insert(jobs)
    .values({
      shopId,
      title: input.title,
      customerId: input.customerId,
      materialId: input.materialId ?? null,
      sheetWidthMm: input.sheetWidthMm,
      sheetLengthMm: input.sheetLengthMm,
      sheetThicknessMm: input.sheetThicknessMm,
      zZero: input.zZero,
      holdDown: input.holdDown,
      vacuumKpa: input.holdDown === 'vacuum' ? (input.vacuumKpa ?? null) : null,
      quantity: input.quantity,
    })
    .$returningId();
  const created = await getJob(shopId, id);
  if (!created) throw new AppError('internal', 'The job was not saved.');
  return created;
}

export async function updateJobStatus(shopId: number, jobId: number, input: JobStatusInput): Promise<JobRow> {
  const existing = await getJob(shopId, jobId);
  if (!existing) throw new AppError('not-found:job', 'No such job.');
  await db.update(jobs).set({ status: input.status }).where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId)));
  return { ...existing, status: input.status };
}
