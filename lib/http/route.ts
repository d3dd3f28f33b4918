import 'server-only';
// The frame of a thin route handler: run the body, answer JSON, and turn a thrown
// AppError into { error: { code, message, fields? } } with its status. Anything
// else is logged (route and error code only, lib/http/log-error.ts) and answered as a
// plain 500, never as a stack trace. JSON bodies are read with a size limit
// (JSON_BODY_LIMIT_BYTES). State-changing requests (POST, PUT, PATCH, DELETE) must come
// from the app's own pages and carry JSON or multipart/form-data (lib/http/same-origin.ts);
// a handler wrapped in handle() gets that check without doing anything.
import { NextResponse } from 'next/server';
import { env } from '@/lib/env';
import { AppError, isAppError } from '@/lib/errors';
import { logUnexpected } from './log-error';
import { crossSiteWriteError } from './same-origin';

export function json<T>(data: T, status = 200): NextResponse {
  return NextResponse.json(data, { status, headers: { 'cache-control': 'no-store' } });
}

export function errorResponse(error: unknown, route = 'a route handler'): NextResponse {
  if (isAppError(error)) {
    const response = json(error.toBody(), error.status);
    // A body refused part-way is left unread on the socket: close the connection
    // (RFC 9110 §15.5.14, RFC 9112 §9.6) so the client opens a fresh one for its next
    // request instead of reusing a socket the server is about to reset.
    if (error.status === 413) response.headers.set('connection', 'close');
    return response;
  }
  logUnexpected(route, error);
  return json(new AppError('internal', 'Something went wrong on the server.').toBody(), 500);
}

/**
 * Throws the 403/415 AppError for a cross-site or wrongly typed state-changing request.
 * handle() calls it; a handler not wrapped in handle() (a streamed upload) calls it first.
 */
export function refuseCrossSiteWrite(request: Request): void {
  const refused = crossSiteWriteError(request, env.APP_URL);
  if (refused) throw refused;
}

export function handle<C>(body: (request: Request, context: C) => Promise<NextResponse>) {
  return async (request: Request, context: C): Promise<NextResponse> => {
    try {
      refuseCrossSiteWrite(request);
      return await body(request, context);
    } catch (error) {
      return errorResponse(error, `${request.method} ${new URL(request.url).pathname}`);
    }
  };
}

/** The 413 answer; the limit is named so the caller knows what would pass. */
function bodyTooLarge(limitBytes: number): AppError {
  return new AppError('too-large:body', `The request body is larger than the ${limitBytes.toLocaleString('en')} bytes this route accepts.`);
}

/**
 * Reads a JSON request body of at most limitBytes.
 * A declared Content-Length over the limit answers 413 before anything is read; otherwise
 * the body is read chunk by chunk and given up (the stream cancelled) as soon as the
 * count passes the limit, so a large or endless body never sits in memory whole.
 * The bytes must be UTF-8 (RFC 8259 §8.1).
 */
export async function readJson(request: Request, limitBytes: number = env.JSON_BODY_LIMIT_BYTES): Promise<unknown> {
  const declared = request.headers.get('content-length');
  if (declared !== null && /^\d+$/.test(declared.trim()) && Number(declared) > limitBytes) throw bodyTooLarge(limitBytes);

  const chunks: Uint8Array[] = [];
  let totalBytes = 0;
  if (request.body) {
    const reader = request.body.getReader();
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      totalBytes += value.byteLength;
      if (totalBytes > limitBytes) {
        // Tell the sender to stop; the answer does not wait for the rest.
        reader.cancel().catch(() => {});
        throw bodyTooLarge(limitBytes);
      }
      chunks.push(value);
    }
  }

  const bytes = new Uint8Array(totalBytes);
  let at = 0;
  for (const chunk of chunks) {
    bytes.set(chunk, at);
    at += chunk.byteLength;
  }
  try {
    return JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(bytes));
  } catch {
    throw new AppError('invalid:body', 'The request body is not valid JSON.');
  }
}
