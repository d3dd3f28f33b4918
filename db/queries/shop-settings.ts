import 'server-only';
// A shop's price, labour, consumable and calibration settings (db/schema.ts shopSettings).
// The row is made with the column defaults the first time a shop's settings are read, so
// every shop has one and readers never handle a missing row.
import { eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { shopSettings, type ShopSettings } from '@/db/schema';

export type ShopSettingsUpdate = Partial<Omit<ShopSettings, 'shopId' | 'updatedAt'>>;

export async function getShopSettings(shopId: number): Promise<ShopSettings> {
  const read = async () => (await db.select().from(shopSettings).where(eq(shopSettings.shopId, shopId)).limit(1))[0];
  const found = await read();
  if (found) return found;
  // Two first reads at once both insert: the second one's duplicate is ignored.
  await db.insert(shopSettings).ignore().values({ shopId });
  const made = await read();
  if (!made) throw new Error(`shop ${shopId} has no settings row after creating it`);
  return made;
}

export async function updateShopSettings(shopId: number, change: ShopSettingsUpdate): Promise<ShopSettings> {
  await getShopSettings(shopId);
  if (Object.keys(change).length > 0) await db.update(shopSettings).set(change).where(eq(shopSettings.shopId, shopId));
  return getShopSettings(shopId);
}
