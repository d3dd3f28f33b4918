// PATCH /api/shop { lengthUnit: 'mm' | 'inch' }: how the shop's forms and pages show
// lengths (stored values stay mm). Admins only.
import { setLengthUnit } from '@/db/queries/shops';
import { requireAction } from '@/lib/auth/require-role';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { shopSettingsSchema } from '@/lib/validation/machines';

export const PATCH = handle(async (request) => {
  const user = await requireAction('shop:write');
  const { lengthUnit } = parseOrThrow(shopSettingsSchema, await readJson(request), 'shop');
  return json({ shop: await setLengthUnit(user.shopId, lengthUnit) });
});
