// GET /api/machines/:machineId/calibration → { calibration: { suggestedFactor | null, runs,
// iqr, minimumRuns, message, … } }: the median actual ÷ uncalibrated estimate of the machine's
// last N uninterrupted runs (lib/runs/calibration.ts). POST { suggestedFactor } (admin,
// calibration:apply) applies it: a new machine version with that time factor → 201
// { applied, calibration }; 409 when the suggestion has moved since it was seen, is missing,
// or is already the machine's factor. Another shop's machine 404.
import { applyCalibration, machineCalibration } from '@/db/queries/runs';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle, json, readJson } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { parseId } from '@/lib/validation/ids';
import { calibrationApplySchema } from '@/lib/validation/runs';

type Context = { params: Promise<{ machineId: string }> };

export const GET = handle(async (_request, { params }: Context) => {
  const user = await requireAction('runs:read');
  const machineId = parseId((await params).machineId, 'machine');
  const calibration = await machineCalibration(user.shopId, machineId);
  if (!calibration) throw new AppError('not-found:machine', 'No such machine.');
  return json({ calibration });
});

export const POST = handle(async (request, { params }: Context) => {
  const user = await requireAction('calibration:apply');
  const machineId = parseId((await params).machineId, 'machine');
  const input = parseOrThrow(calibrationApplySchema, await readJson(request), 'calibration');
  const applied = await applyCalibration(user.shopId, machineId, input.suggestedFactor);
  return json({ applied, calibration: await machineCalibration(user.shopId, machineId) }, 201);
});
