import 'server-only';
// The signed-in user's shop: its name, currency (money is shown in it) and length unit
// (lengths are shown and typed in it; stored values stay mm).
import { eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { shops, type Shop } from '@/db/schema';
import { AppError } from '@/lib/errors';
import type { LengthUnit } from '@/lib/units/length';

export type ShopSettings = Pick<Shop, 'id' | 'name' | 'currency' | 'lengthUnit'>;

export async function getShopSettings(shopId: number): Promise<ShopSettings> {
  const [row] = await db
    .select({ id: shops.id, name: shops.name, currency: shops.currency, lengthUnit: shops.lengthUnit })
    .from(shops)
    .where(eq(shops.id, shopId))
    .limit(1);
  if (!row) throw new AppError('not-found:shop', 'No such shop.');
  return row;
}

export async function setLengthUnit(shopId: number, lengthUnit: LengthUnit): Promise<ShopSettings> {
  await db.update(shops).set({ lengthUnit }).where(eq(shops.id, shopId));
  return getShopSettings(shopId);
}
