// GET /api/estimates/:estimateId: one stored estimate with its status and figures and, when
// done, `report`: the stored report, byte for byte the CLI's --json output for the same file,
// profile and settings. The report is spliced in as stored, not parsed and written again.
// Another shop's estimate answers 404.
import { NextResponse } from 'next/server';
import { estimateView, getEstimate, readEstimateReport } from '@/db/queries/estimates';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle } from '@/lib/http/route';
import { parseId } from '@/lib/validation/ids';

type Context = { params: Promise<{ estimateId: string }> };

export const GET = handle(async (_request, { params }: Context) => {
  const user = await requireAction('estimates:read');
  const estimateId = parseId((await params).estimateId, 'estimate');
  const row = await getEstimate(user.shopId, estimateId);
  if (!row) throw new AppError('not-found:estimate', 'No such estimate.');
  const view = JSON.stringify(estimateView(row));
  let body = `{"estimate":${view}}`;
  if (row.status === 'done') {
    const report = await readEstimateReport(row);
    if (report === null) throw new AppError('internal', `The report of estimate ${row.id} is missing from storage.`);
    body = `{"estimate":${view.slice(0, -1)},"report":${report}}}`;
  }
  return new NextResponse(body, { status: 200, headers: { 'content-type': 'application/json', 'cache-control': 'no-store' } });
});
