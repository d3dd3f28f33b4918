// POST /api/jobs/:jobId/programs: upload one or more G-code programs (multipart/form-data,
// one part named "file" per program), streamed to object storage (lib/programs/upload.ts).
// All or nothing per request: one refused file (bad name, empty, blank, binary: 422; over
// PROGRAM_MAX_BYTES: 413) refuses the whole request, and nothing of it is stored, neither
// objects nor rows. A name the job already has makes a new version of that program. Each
// version gets an estimate request for the job's machine. Answers 201 { programs }.
// GET /api/jobs/:jobId/programs: the job's programs, each with its latest version and that
// version's latest estimate.
import { getJob } from '@/db/queries/jobs';
import { listJobPrograms, recordUploadedPrograms } from '@/db/queries/programs';
import { requireAction } from '@/lib/auth/require-role';
import { env } from '@/lib/env';
import { AppError } from '@/lib/errors';
import { wakeEstimateQueue } from '@/lib/estimate-server';
import { errorResponse, handle, json, refuseCrossSiteWrite } from '@/lib/http/route';
import { discardReceived, drainUnreadBody, receivePrograms, type ReceiveResult, type ReceiveState } from '@/lib/programs/upload';
import { parseId } from '@/lib/validation/ids';

type Context = { params: Promise<{ jobId: string }> };

export const GET = handle(async (_request, { params }: Context) => {
  const user = await requireAction('programs:read');
  const jobId = parseId((await params).jobId, 'job');
  const programs = await listJobPrograms(user.shopId, jobId);
  if (!programs) throw new AppError('not-found:job', 'No such job.');
  return json({ programs });
});

export async function POST(request: Request, { params }: Context) {
  const state: ReceiveState = { bodyComplete: false };
  let received: ReceiveResult | null = null;
  try {
    // not wrapped in handle() (it streams), so the cross-site write check is called here
    refuseCrossSiteWrite(request);
    const user = await requireAction('programs:write');
    const jobId = parseId((await params).jobId, 'job');
    const job = await getJob(user.shopId, jobId);
    if (!job) throw new AppError('not-found:job', 'No such job.');
    received = await receivePrograms(request, { shopId: user.shopId, jobId, maxBytes: env.PROGRAM_MAX_BYTES }, state);
    const result = await recordUploadedPrograms(user.shopId, job, user.id, received.programs);
    received = null;
    if (result.queued) wakeEstimateQueue();
    return json({ programs: result.programs }, 201);
  } catch (error) {
    // the files are in storage but their rows are not: take the files out again
    if (received) await discardReceived(received);
    // refused before the upload began (signed out, role, job): a small body is read away so
    // the client, still sending, gets this answer rather than a broken pipe
    if (!state.bodyComplete && !request.bodyUsed) state.bodyComplete = await drainUnreadBody(request);
    const response = errorResponse(error);
    // an answer before the end of the body: the rest is left unread on the socket, so the
    // connection is closed rather than reused (RFC 9112 §9.6)
    if (!state.bodyComplete) response.headers.set('connection', 'close');
    return response;
  }
}
