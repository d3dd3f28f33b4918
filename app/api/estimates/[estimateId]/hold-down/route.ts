// GET /api/estimates/:estimateId/hold-down: every way of holding the estimate's parts side by
// side (lib/holddown/compare.ts on the per-method analysis stored with the estimate): for each
// method the parts held and not held with a reason per part, warnings, labour seconds and
// machine seconds added per sheet, cost per sheet and for the job's quantity, and the
// recommendation with its note. An estimate made before the comparison existed answers with
// availability "not-computed" and a note saying so. `?ruleOut=tape-glue,clamps` rules methods
// out for the job (lib/holddown/rule-out.ts); an unknown name is 422. Another shop's estimate 404.
import { getHoldDownComparison } from '@/db/queries/hold-down';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { ruleOutQuerySchema } from '@/lib/holddown/rule-out';
import { handle, json } from '@/lib/http/route';
import { parseOrThrow } from '@/lib/validation/form';
import { parseId } from '@/lib/validation/ids';

type Context = { params: Promise<{ estimateId: string }> };

export const GET = handle(async (request, { params }: Context) => {
  const user = await requireAction('holddown:read');
  const estimateId = parseId((await params).estimateId, 'estimate');
  const { ruleOut } = parseOrThrow(ruleOutQuerySchema, { ruleOut: new URL(request.url).searchParams.get('ruleOut') ?? undefined }, 'query');
  const answer = await getHoldDownComparison(user.shopId, estimateId, ruleOut);
  if (!answer) throw new AppError('not-found:estimate', 'No such estimate.');
  return json(answer);
});
