// GET /api/materials/:materialId, PATCH to change it, DELETE to remove one no job names
// (409 when jobs do). Another shop's material is 404.
import { deleteMaterial, getMaterial, updateMaterial } from '@/db/queries/materials';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { parseId } from '@/lib/validation/ids';
import { materialUpdateSchema } from '@/lib/validation/materials';

type Context = { params: Promise<{ materialId: string }> };

export const GET = handle(async (_request, { params }: Context) => {
  const user = await requireAction('materials:read');
  const materialId = parseId((await params).materialId, 'material');
  const material = await getMaterial(user.shopId, materialId);
  if (!material) throw new AppError('not-found:material', 'No such material.');
  return json({ material });
});

export const PATCH = handle(async (request, { params }: Context) => {
  const user = await requireAction('materials:write');
  const materialId = parseId((await params).materialId, 'material');
  const input = parseOrThrow(materialUpdateSchema, await readJson(request), 'material');
  return json({ material: await updateMaterial(user.shopId, materialId, input) });
});

export const DELETE = handle(async (_request, { params }: Context) => {
  const user = await requireAction('materials:write');
  const materialId = parseId((await params).materialId, 'material');
  await deleteMaterial(user.shopId, materialId);
  return json({ result: 'deleted' });
});
