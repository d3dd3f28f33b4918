// GET /api/materials: the shop's sheet materials (for job forms).
import { listMaterials } from '@/db/queries/materials';
import { requireAction } from '@/lib/auth/require-role';
import { handle, json } from '@/lib/http/route';

export const GET = handle(async () => {
  const user = await requireAction('jobs:read');
  return json({ materials: await listMaterials(user.shopId) });
});
