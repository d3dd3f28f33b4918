// POST /api/runs/manual: a run entered afterwards by hand: { programId, version, machineId,
// startedAt, finishedAt | durationSeconds, sheetsCut, interrupted, notes? } → 201 { run }
// (status "finished", manual). Bad input 422 with fields; another shop's program or machine 404.
import { recordManualRun } from '@/db/queries/runs';
import { requireAction } from '@/lib/auth/require-role';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { runManualSchema } from '@/lib/validation/runs';

export const POST = handle(async (request) => {
  const user = await requireAction('runs:write');
  const input = parseOrThrow(runManualSchema, await readJson(request), 'run');
  return json({ run: await recordManualRun(user.shopId, user, input) }, 201);
});
