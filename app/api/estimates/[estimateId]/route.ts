// GET /api/estimates/:estimateId: one stored estimate with its status and figures and, when
// done, `report` inside it: the stored report, byte for byte the CLI's --json output for the
// same file, profile and settings. The report (tens of MB for a large program) is streamed
// from object storage between the estimate's own fields and the closing braces, never read
// whole, parsed or written again. Another shop's estimate answers 404.
import { NextResponse } from 'next/server';
import { estimateView, getEstimate, openEstimateReport } from '@/db/queries/estimates';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle } from '@/lib/http/route';
import { parseId } from '@/lib/validation/ids';

type Context = { params: Promise<{ estimateId: string }> };

const HEADERS = { 'content-type': 'application/json', 'cache-control': 'no-store' };

/** prefix, then every chunk of the object, then suffix */
function framed(prefix: Uint8Array, object: ReadableStream<Uint8Array>, suffix: Uint8Array): ReadableStream<Uint8Array> {
  const reader = object.getReader();
  let stage: 'prefix' | 'object' | 'suffix' = 'prefix';
  return new ReadableStream<Uint8Array>({
    async pull(controller) {
      if (stage === 'prefix') {
        stage = 'object';
        controller.enqueue(prefix);
        return;
      }
      if (stage === 'object') {
        const { done, value } = await reader.read();
        if (!done) {
          controller.enqueue(value);
          return;
        }
        stage = 'suffix';
      }
      controller.enqueue(suffix);
      controller.close();
    },
    cancel(reason) {
      return reader.cancel(reason);
    },
  });
}

export const GET = handle(async (_request, { params }: Context) => {
  const user = await requireAction('estimates:read');
  const estimateId = parseId((await params).estimateId, 'estimate');
  const row = await getEstimate(user.shopId, estimateId);
  if (!row) throw new AppError('not-found:estimate', 'No such estimate.');
  const view = JSON.stringify(estimateView(row));
  if (row.status !== 'done') return new NextResponse(`{"estimate":${view}}`, { status: 200, headers: HEADERS });
  const report = await openEstimateReport(row);
  if (!report) throw new AppError('internal', `The report of estimate ${row.id} is missing from storage.`);
  const encoder = new TextEncoder();
  const prefix = encoder.encode(`{"estimate":${view.slice(0, -1)},"report":`);
  const suffix = encoder.encode('}}');
  const headers: Record<string, string> = { ...HEADERS };
  if (report.bytes !== undefined) headers['content-length'] = String(prefix.byteLength + report.bytes + suffix.byteLength);
  return new NextResponse(framed(prefix, report.body, suffix), { status: 200, headers });
});
