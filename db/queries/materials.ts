import 'server-only';
// Sheet materials of a shop. Every function takes the shop id; another shop's material is
// reported exactly like a missing one. A material that jobs name is kept (the job's sheet
// came from it): removing it is refused with the count, and its rows stay as they are.
import { and, asc, count, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { jobs, materials, type Material } from '@/db/schema';
import { AppError } from '@/lib/errors';
import type { MaterialInput, MaterialUpdate } from '@/lib/validation/materials';

export type MaterialWithUse = Material & { jobCount: number };

export async function listMaterials(shopId: number): Promise<Material[]> {
  return db.select().from(materials).where(eq(materials.shopId, shopId)).orderBy(asc(materials.name));
}

/** The list with how many jobs use each material (the page says which ones can be removed). */
export async function listMaterialsWithUse(shopId: number): Promise<MaterialWithUse[]> {
  const rows = await db
    .select({ material: materials, jobCount: count(jobs.id) })
    .from(materials)
    .leftJoin(jobs, and(eq(jobs.materialId, materials.id), eq(jobs.shopId, shopId)))
    .where(eq(materials.shopId, shopId))
    .groupBy(materials.id)
    .orderBy(asc(materials.name));
  return rows.map((r) => ({ ...r.material, jobCount: Number(r.jobCount) }));
}

export async function getMaterial(shopId: number, materialId: number): Promise<Material | null> {
  const rows = await db
    .select()
    .from(materials)
    .where(and(eq(materials.shopId, shopId), eq(materials.id, materialId)))
    .limit(1);
  return rows[0] ?? null;
}

export async function materialBelongsToShop(shopId: number, materialId: number): Promise<boolean> {
  return (await getMaterial(shopId, materialId)) !== null;
}

function isDuplicateKey(err: unknown): boolean {
  for (let e: unknown = err; e; e = (e as { cause?: unknown }).cause) {
    if ((e as { code?: unknown }).code === 'ER_DUP_ENTRY') return true;
  }
  return false;
}

function nameTaken(name: string): AppError {
  return new AppError('conflict:material', `Your shop already has a material named “${name}”.`, {
    name: [`Another material is already named “${name}”. Choose a different name.`],
  });
}

export async function createMaterial(shopId: number, input: MaterialInput): Promise<Material> {
  const [{ id }] = await db
    .insert(materials)
    .values({ shopId, ...input })
    .$returningId()
    .catch((err: unknown) => {
      if (isDuplicateKey(err)) throw nameTaken(input.name);
      throw err;
    });
  const created = await getMaterial(shopId, id);
  if (!created) throw new AppError('internal', 'The material was not saved.');
  return created;
}

/** Changes a material. Jobs keep the sheet they were given: their sizes were copied when they were planned. */
export async function updateMaterial(shopId: number, materialId: number, input: MaterialUpdate): Promise<Material> {
  const existing = await getMaterial(shopId, materialId);
  if (!existing) throw new AppError('not-found:material', 'No such material.');
  const changes = Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined));
  await db
    .update(materials)
    .set(changes)
    .where(and(eq(materials.shopId, shopId), eq(materials.id, materialId)))
    .catch((err: unknown) => {
      if (isDuplicateKey(err)) throw nameTaken(String(input.name));
      throw err;
    });
  return { ...existing, ...changes };
}

/** Removes a material no job names; one that jobs name is refused (409) with the count. */
export async function deleteMaterial(shopId: number, materialId: number): Promise<void> {
  await db.transaction(async (tx) => {
    const [row] = await tx
      .select()
      .from(materials)
      .where(and(eq(materials.shopId, shopId), eq(materials.id, materialId)))
      .for('update');
    if (!row) throw new AppError('not-found:material', 'No such material.');
    const [{ n }] = await tx
      .select({ n: count() })
      .from(jobs)
      .where(and(eq(jobs.shopId, shopId), eq(jobs.materialId, materialId)));
    if (Number(n) > 0) {
      const jobsText = Number(n) === 1 ? '1 job uses it' : `${n} jobs use it`;
      throw new AppError('conflict:material-in-use', `${row.name} cannot be removed: ${jobsText}. Change those jobs' material first, or keep it.`);
    }
    await tx.delete(materials).where(and(eq(materials.shopId, shopId), eq(materials.id, materialId)));
  });
}
