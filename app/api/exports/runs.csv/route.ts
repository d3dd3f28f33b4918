// GET /api/exports/runs.csv: the shop's runs as CSV (RFC 4180, lib/reports/csv.ts), streamed in
// batches, oldest first, with the runs list's filters (machineId, operatorId, jobId, programId,
// version, status, from, to; page and perPage are ignored); a bad filter answers 422 naming it.
// Every run is in the file, voided and interrupted ones too, with a column saying whether it
// counts in the statistics. runs:read; only the signed-in user's shop.
import { NextResponse } from 'next/server';
import { runExportBatch } from '@/db/queries/run-reports';
import { requireAction } from '@/lib/auth/require-role';
import { handle } from '@/lib/http/route';
import { logUnexpected } from '@/lib/http/log-error';
import { csvHeaders, RUN_COLUMNS } from '@/lib/reports/csv';
import { csvStream } from '@/lib/reports/csv-stream';
import { parseOrThrow } from '@/lib/validation/form';
import { searchParamsToObject } from '@/lib/validation/jobs';
import { runListQuerySchema } from '@/lib/validation/runs';

export const GET = handle(async (request) => {
  const user = await requireAction('runs:read');
  const { page: _page, perPage: _perPage, ...filters } = parseOrThrow(runListQuerySchema, searchParamsToObject(new URL(request.url).searchParams), 'runs export');
  const body = await csvStream(
    RUN_COLUMNS,
    (afterId) => runExportBatch(user.shopId, filters, afterId),
    (error) => logUnexpected('GET /api/exports/runs.csv (streaming)', error),
  );
  return new NextResponse(body, { status: 200, headers: csvHeaders('runs', new Date()) });
});
