import 'server-only';
// The frame of a thin route handler: run the body, answer JSON, and turn a thrown
// AppError into { error: { code, message, fields? } } with its status. Anything
// else is logged and answered as a plain 500, never as a stack trace.
import { NextResponse } from 'next/server';
import { AppError, isAppError } from '@/lib/errors';

export function json<T>(data: T, status = 200): NextResponse {
  return NextResponse.json(data, { status, headers: { 'cache-control': 'no-store' } });
}

export function errorResponse(error: unknown): NextResponse {
  if (isAppError(error)) return json(error.toBody(), error.status);
  console.error('[kerfcast] unexpected error in a route handler', error);
  return json(new AppError('internal', 'Something went wrong on the server.').toBody(), 500);
}

export function handle<C>(body: (request: Request, context: C) => Promise<NextResponse>) {
  return async (request: Request, context: C): Promise<NextResponse> => {
    try {
      return await body(request, context);
    } catch (error) {
      return errorResponse(error);
    }
  };
}

export async function readJson(request: Request): Promise<unknown> {
  try {
    return await request.json();
  } catch {
    throw new AppError('invalid:body', 'The request body is not valid JSON.');
  }
}
