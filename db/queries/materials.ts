import 'server-only';
// Sheet materials of a shop. Every function takes the shop id.
import { and, asc, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { materials, type Material } from '@/db/schema';

export async function listMaterials(shopId: number): Promise<Material[]> {
  return db.select().from(materials).where(eq(materials.shopId, shopId)).orderBy(asc(materials.name));
}

export async function materialBelongsToShop(shopId: number, materialId: number): Promise<boolean> {
  const rows = await db
    .select({ id: materials.id })
    .from(materials)
    .where(and(eq(materials.shopId, shopId), eq(materials.id, materialId)))
    .limit(1);
  return rows.length > 0;
}
