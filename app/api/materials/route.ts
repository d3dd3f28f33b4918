// GET /api/materials: the shop's sheet materials (job forms prefill the sheet from them).
// POST /api/materials: a new one (lengths mm, cost per sheet in minor units).
import { createMaterial, listMaterials } from '@/db/queries/materials';
import { requireAction } from '@/lib/auth/require-role';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { materialInputSchema } from '@/lib/validation/materials';

export const GET = handle(async () => {
  const user = await requireAction('materials:read');
  return json({ materials: await listMaterials(user.shopId) });
});

export const POST = handle(async (request) => {
  const user = await requireAction('materials:write');
  const input = parseOrThrow(materialInputSchema, await readJson(request), 'material');
  return json({ material: await createMaterial(user.shopId, input) }, 201);
});
