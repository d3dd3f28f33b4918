// GET /api/exports/estimates.csv: the shop's stored estimates as CSV (RFC 4180,
// lib/reports/csv.ts), streamed in batches, oldest first, optionally for one machineId or
// jobId; a bad filter answers 422 naming it. estimates:read; only the signed-in user's shop.
import { NextResponse } from 'next/server';
import { estimateExportBatch } from '@/db/queries/run-reports';
import { requireAction } from '@/lib/auth/require-role';
import { handle } from '@/lib/http/route';
import { logUnexpected } from '@/lib/http/log-error';
import { csvHeaders, ESTIMATE_COLUMNS } from '@/lib/reports/csv';
import { csvStream } from '@/lib/reports/csv-stream';
import { estimateExportQuerySchema } from '@/lib/reports/export-query';
import { parseOrThrow } from '@/lib/validation/form';
import { searchParamsToObject } from '@/lib/validation/jobs';

export const GET = handle(async (request) => {
  const user = await requireAction('estimates:read');
  const filters = parseOrThrow(estimateExportQuerySchema, searchParamsToObject(new URL(request.url).searchParams), 'estimates export');
  const body = await csvStream(
    ESTIMATE_COLUMNS,
    (afterId) => estimateExportBatch(user.shopId, filters, afterId),
    (error) => logUnexpected('GET /api/exports/estimates.csv (streaming)', error),
  );
  return new NextResponse(body, { status: 200, headers: csvHeaders('estimates', new Date()) });
});
