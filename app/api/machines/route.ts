// GET /api/machines: the shop's machines with their tool counts.
import { listMachines } from '@/db/queries/machines';
import { requireAction } from '@/lib/auth/require-role';
import { handle, json } from '@/lib/http/route';

export const GET = handle(async () => {
  const user = await requireAction('machines:read');
  return json({ machines: await listMachines(user.shopId) });
});
