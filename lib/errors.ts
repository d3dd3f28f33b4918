// One typed error for the whole app. A code names what went wrong and, after a colon,
// what it concerns ("forbidden:job", "not-found:customer"); the prefix decides the
// HTTP status. Route handlers send it as { error: { code, message, fields? } } and
// lib/fetcher.ts turns that JSON back into an AppError in the browser.

export type FieldErrors = Record<string, string[]>;

const STATUS_BY_KIND = {
  unauthorized: 401,
  forbidden: 403,
  'not-found': 404,
  conflict: 409,
  /** a request body over its size limit (lib/http/route.ts readJson) */
  'too-large': 413,
  /** a body of a media type the route does not take (lib/http/same-origin.ts) */
  unsupported: 415,
  invalid: 422,
  'rate-limited': 429,
  internal: 500,
} as const;

export type ErrorKind = keyof typeof STATUS_BY_KIND;
export type ErrorCode = ErrorKind | `${ErrorKind}:${string}`;

export interface ErrorBody {
  error: { code: string; message: string; fields?: FieldErrors };
}

export class AppError extends Error {
  readonly code: ErrorCode;
  readonly fields?: FieldErrors;

  constructor(code: ErrorCode, message: string, fields?: FieldErrors) {
    super(message);
    this.name = 'AppError';
    this.code = code;
    this.fields = fields;
  }

  get kind(): ErrorKind {
    return errorKind(this.code);
  }

  get status(): number {
    return STATUS_BY_KIND[this.kind];
  }

  toBody(): ErrorBody {
    return { error: { code: this.code, message: this.message, ...(this.fields ? { fields: this.fields } : {}) } };
  }
}

export function errorKind(code: string): ErrorKind {
  const kind = code.split(':')[0];
  return kind in STATUS_BY_KIND ? (kind as ErrorKind) : 'internal';
}

export function statusForCode(code: string): number {
  return STATUS_BY_KIND[errorKind(code)];
}

export function isErrorBody(value: unknown): value is ErrorBody {
  if (typeof value !== 'object' || value === null || !('error' in value)) return false;
  const inner = (value as { error: unknown }).error;
  return (
    typeof inner === 'object' &&
    inner !== null &&
    typeof (inner as { code?: unknown }).code === 'string' &&
    typeof (inner as { message?: unknown }).message === 'string'
  );
}

/** Rebuilds the typed error from a JSON body (the browser side of the contract). */
export function appErrorFromBody(body: ErrorBody): AppError {
  // An unknown kind keeps its text but maps to 500 through errorKind().
  return new AppError(body.error.code as ErrorCode, body.error.message, body.error.fields);
}

export function isAppError(value: unknown): value is AppError {
  return value instanceof AppError;
}
