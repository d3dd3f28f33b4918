// GET /api/programs/:programId/versions/:version/file: the stored program text, streamed from
// object storage as it arrives (never read whole), as text/plain in UTF-8 (uploads are checked
// to be UTF-8). The version's bytes never change, so its SHA-256 is the ETag.
import { NextResponse } from 'next/server';
import { getProgramVersionFile } from '@/db/queries/programs';
import { requireAction } from '@/lib/auth/require-role';
import { AppError } from '@/lib/errors';
import { handle } from '@/lib/http/route';
import { programContentDisposition } from '@/lib/programs/program-names';
import { openProgramObject, PROGRAM_CONTENT_TYPE } from '@/lib/programs/program-storage';
import { parseId } from '@/lib/validation/ids';

type Context = { params: Promise<{ programId: string; version: string }> };

export const GET = handle(async (request, { params }: Context) => {
  const user = await requireAction('programs:read');
  const raw = await params;
  const programId = parseId(raw.programId, 'program');
  const version = parseId(raw.version, 'program');
  const stored = await getProgramVersionFile(user.shopId, programId, version);
  if (!stored) throw new AppError('not-found:program', 'No such program version.');
  const etag = `"${stored.sha256}"`;
  const headers = { etag, 'cache-control': 'private, no-cache' };
  if (request.headers.get('if-none-match') === etag) return new NextResponse(null, { status: 304, headers });
  const object = await openProgramObject(stored.objectKey);
  if (!object) {
    console.error('[kerfcast] program file missing from storage', stored.objectKey);
    throw new AppError('internal:storage', 'The stored file of this program version cannot be found.');
  }
  return new NextResponse(object.body, {
    status: 200,
    headers: {
      ...headers,
      'content-type': PROGRAM_CONTENT_TYPE,
      'content-length': String(object.bytes ?? stored.bytes),
      'content-disposition': programContentDisposition(stored.name),
    },
  });
});
