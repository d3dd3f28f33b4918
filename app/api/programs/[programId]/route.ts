// GET /api/programs/:programId: one program of the shop with every version (newest first),
// each with its estimates (404 for a missing program or another shop's).
import { getProgram } from '@/db/queries/programs';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle, json } from '@/lib/http/route';
import { parseId } from '@/lib/validation/ids';

type Context = { params: Promise<{ programId: string }> };

export const GET = handle(async (_request, { params }: Context) => {
  const user = await requireAction('programs:read');
  const programId = parseId((await params).programId, 'program');
  const program = await getProgram(user.shopId, programId);
  if (!program) throw new AppError('not-found:program', 'No such program.');
  return json({ program });
});
