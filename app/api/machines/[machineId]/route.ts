// GET /api/machines/:machineId: one machine profile with its tools; another shop's is 404.
import { getMachine } from '@/db/queries/machines';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle, json } from '@/lib/http/route';
import { parseId } from '@/lib/validation/ids';

type Context = { params: Promise<{ machineId: string }> };

export const GET = handle(async (_request, { params }: Context) => {
  const user = await requireAction('machines:read');
  const machineId = parseId((await params).machineId, 'machine');
  const machine = await getMachine(user.shopId, machineId);
  if (!machine) throw new AppError('not-found:machine', 'No such machine.');
  return json({ machine });
});
