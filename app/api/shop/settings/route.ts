// GET /api/shop/settings: the shop's price, labour, consumable and calibration settings.
// PUT: the whole form (every column of shop_settings); 422 with fields for bad input. Admins only.
import { getShopSettings, updateShopSettings } from '@/db/queries/shop-settings';
import { requireAction } from '@/lib/auth/require-role';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { shopSettingsSchema } from '@/lib/validation/shop-settings';

export const GET = handle(async () => {
  const user = await requireAction('shop:write');
  return json({ settings: await getShopSettings(user.shopId) });
});

export const PUT = handle(async (request) => {
  const user = await requireAction('shop:write');
  const input = parseOrThrow(shopSettingsSchema, await readJson(request), 'settings');
  return json({ settings: await updateShopSettings(user.shopId, input) });
});
