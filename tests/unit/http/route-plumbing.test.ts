// The three pieces every route handler's input and errors pass through: parseOrThrow
// (lib/validation/form.ts: zod issues → the typed 422 with { field: [messages] }), readJson
// (lib/http/route.ts: the body as JSON, or 422 invalid:body; its size limit is in
// read-json.test.ts) and errorResponse (lib/http/route.ts: AppError → its status and the one
// error shape; anything else → a plain 500 and one log line with the code only: OWASP ASVS
// 4.0.3 V7.4.1 "a generic message is shown when an unexpected error occurs", V7.1.1 no
// sensitive data in logs). Statuses: RFC 9110 §15.5 (401, 403, 404, 409, 413, 415, 422).
import { afterEach, describe, expect, it, vi } from 'vitest';

vi.mock('server-only', () => ({}));

const { errorResponse, handle, readJson } = await import('@/lib/http/route');
const { parseOrThrow, fieldErrors } = await import('@/lib/validation/form');
const { AppError } = await import('@/lib/errors');
const { z } = await import('@/lib/validation/zod');

afterEach(() => vi.restoreAllMocks());

function caught(f: () => unknown): InstanceType<typeof AppError> {
  try {
    f();
  } catch (error) {
    if (error instanceof AppError) return error;
    throw error;
  }
  throw new Error('expected an AppError');
}

const bracket = z.object({
  title: z.string().trim().min(1, 'Enter a title.').max(160, 'Title is too long (160 characters at most).'),
  quantity: z.coerce.number().int('Enter a whole number.').min(1, 'Enter 1 or more.'),
  sheet: z.object({ widthMm: z.number().positive('must be greater than 0') }),
  holes: z.array(z.object({ diameterMm: z.number().positive('must be greater than 0') })).default([]),
});

describe('parseOrThrow', () => {
  it('returns the parsed value: trimmed, coerced, defaults filled in', () => {
    expect(parseOrThrow(bracket, { title: '  Shelf bracket ', quantity: '40', sheet: { widthMm: 1220 } }, 'job')).toEqual({
      title: 'Shelf bracket',
      quantity: 40,
      sheet: { widthMm: 1220 },
      holes: [],
    });
  });

  it('throws invalid:<what> (422) naming every bad field, nested ones by their dotted path', () => {
    const error = caught(() => parseOrThrow(bracket, { title: '', quantity: 2.5, sheet: { widthMm: 0 }, holes: [{ diameterMm: 6 }, { diameterMm: -1 }] }, 'job'));
    expect(error.code).toBe('invalid:job');
    expect(error.status).toBe(422);
    expect(error.message).toBe('Some of the job details need fixing: each one is named at its field.');
    expect(error.fields).toEqual({
      title: ['Enter a title.'],
      quantity: ['Enter a whole number.'],
      'sheet.widthMm': ['must be greater than 0'],
      'holes.1.diameterMm': ['must be greater than 0'],
    });
  });

  it('keeps every message of a field that fails twice', () => {
    const twice = z.object({ code: z.string().min(3, 'At least 3 characters.').regex(/^[a-z]+$/, 'Letters a to z only.') });
    expect(caught(() => parseOrThrow(twice, { code: '7' }, 'tool')).fields).toEqual({ code: ['At least 3 characters.', 'Letters a to z only.'] });
  });

  it('puts an issue of the whole input (not an object, or a refine without a path) under _form', () => {
    expect(Object.keys(caught(() => parseOrThrow(bracket, null, 'job')).fields ?? {})).toEqual(['_form']);
    expect(Object.keys(caught(() => parseOrThrow(bracket, [], 'job')).fields ?? {})).toEqual(['_form']);
    const something = z.object({ a: z.string().optional() }).refine((v) => v.a !== undefined, 'Nothing to change.');
    expect(caught(() => parseOrThrow(something, {}, 'customer')).fields).toEqual({ _form: ['Nothing to change.'] });
  });

  it('refuses Infinity and NaN where a number is asked (zod 4 numbers are finite)', () => {
    const n = z.object({ lengthMm: z.number() });
    expect(caught(() => parseOrThrow(n, { lengthMm: Infinity }, 'job')).fields).toHaveProperty('lengthMm');
    expect(caught(() => parseOrThrow(n, { lengthMm: Number.NaN }, 'job')).fields).toHaveProperty('lengthMm');
  });

  it('fieldErrors is the same mapping for a ZodError from elsewhere', () => {
    const result = bracket.safeParse({});
    expect(result.success).toBe(false);
    if (!result.success) expect(Object.keys(fieldErrors(result.error)).sort()).toEqual(['quantity', 'sheet', 'title']);
  });
});

function post(body: BodyInit | null, headers: Record<string, string> = { 'content-type': 'application/json' }): Request {
  return new Request('http://127.0.0.1:3000/api/jobs', { method: 'POST', headers, body });
}

async function readError(request: Request): Promise<InstanceType<typeof AppError>> {
  try {
    await readJson(request);
  } catch (error) {
    if (error instanceof AppError) return error;
    throw error;
  }
  throw new Error('expected readJson to throw');
}

describe('readJson', () => {
  it('gives any JSON value back as parsed (RFC 8259 §2: a JSON text is any value); the schema judges the shape', async () => {
    expect(await readJson(post('{"title":"Sign letters","quantity":12}'))).toEqual({ title: 'Sign letters', quantity: 12 });
    expect(await readJson(post('null'))).toBeNull();
    expect(await readJson(post('[1,2]'))).toEqual([1, 2]);
    expect(await readJson(post(' "text" '))).toBe('text');
  });

  it('reads 1e400 as Infinity (ECMA-262 JSON.parse), which is why the schemas refuse non-finite numbers', async () => {
    expect(await readJson(post('{"quantity":1e400}'))).toEqual({ quantity: Infinity });
  });

  it('takes the last of two equal keys (ECMA-262 JSON.parse; RFC 8259 §4 leaves it open)', async () => {
    expect(await readJson(post('{"role":"operator","role":"admin"}'))).toEqual({ role: 'admin' });
  });

  it('ignores a UTF-8 byte order mark (RFC 8259 §8.1 allows a parser to)', async () => {
    expect(await readJson(post(new Uint8Array([0xef, 0xbb, 0xbf, ...new TextEncoder().encode('{"a":1}')])))).toEqual({ a: 1 });
  });

  it.each([
    ['no body at all', null],
    ['an empty body', ''],
    ['a truncated object', '{"title": "Shelf'],
    ['single quotes', "{'title': 'Shelf'}"],
    ['a trailing comma', '{"title": "Shelf",}'],
    ['a bare word', 'Infinity'],
    ['NaN', 'NaN'],
    ['a comment', '{"a": 1 /* one */}'],
    ['two values', '{} {}'],
  ])('refuses %s as 422 invalid:body', async (_label, body) => {
    const error = await readError(post(body));
    expect([error.code, error.status, error.message]).toEqual(['invalid:body', 422, 'The request body is not valid JSON.']);
  });

  it('does not trust a Content-Length that is not a number, and still reads the body', async () => {
    expect(await readJson(new Request('http://127.0.0.1:3000/api/jobs', { method: 'POST', body: '{"a":2}', headers: { 'x-length': 'lots' } }))).toEqual({ a: 2 });
  });
});

async function bodyOf(response: Response) {
  return (await response.json()) as { error: { code: string; message: string; fields?: Record<string, string[]> } };
}

describe('errorResponse', () => {
  it.each([
    ['unauthorized', 401],
    ['forbidden:job', 403],
    ['not-found:customer', 404],
    ['conflict:job-status', 409],
    ['too-large:body', 413],
    ['unsupported:content-type', 415],
    ['invalid:job', 422],
    ['rate-limited', 429],
  ] as const)('%s answers %i in the error shape', async (code, status) => {
    const response = errorResponse(new AppError(code, 'What went wrong, in words.'));
    expect(response.status).toBe(status);
    expect(response.headers.get('content-type')).toMatch(/^application\/json/);
    expect(response.headers.get('cache-control')).toBe('no-store');
    expect(await bodyOf(response)).toEqual({ error: { code, message: 'What went wrong, in words.' } });
  });

  it('carries the field issues of a 422', async () => {
    const response = errorResponse(new AppError('invalid:job', 'Some of the job details need fixing.', { quantity: ['Enter 1 or more.'] }));
    expect(await bodyOf(response)).toEqual({ error: { code: 'invalid:job', message: 'Some of the job details need fixing.', fields: { quantity: ['Enter 1 or more.'] } } });
  });

  it('closes the connection after a 413 (RFC 9112 §9.6: the unread body is left on the socket), and only then', () => {
    expect(errorResponse(new AppError('too-large:body', 'Too large.')).headers.get('connection')).toBe('close');
    expect(errorResponse(new AppError('invalid:body', 'Not JSON.')).headers.get('connection')).toBeNull();
  });

  it('an AppError of an unknown kind is a 500, its own words kept', async () => {
    const response = errorResponse(new AppError('strange:thing' as never, 'Something odd.'));
    expect(response.status).toBe(500);
    expect((await bodyOf(response)).error.code).toBe('strange:thing');
  });

  it.each([
    ['an Error with a stack', Object.assign(new Error("Duplicate entry 'ada@alder-finch.example' at SELECT password_hash"), { code: 'ER_DUP_ENTRY' })],
    ['a TypeError', new TypeError("Cannot read properties of undefined (reading 'password_hash')")],
    ['a thrown string', 'password_hash leaked'],
    ['undefined', undefined],
  ])('anything else (%s): 500 internal, generic words, no stack; one log line with the code only', async (_label, thrown) => {
    const lines: string[] = [];
    vi.spyOn(console, 'error').mockImplementation((...args: unknown[]) => void lines.push(args.map(String).join(' ')));
    const response = errorResponse(thrown, 'POST /api/users');
    expect(response.status).toBe(500);
    const text = await response.text();
    expect(JSON.parse(text)).toEqual({ error: { code: 'internal', message: 'Something went wrong on the server.' } });
    expect(text).not.toContain('password_hash');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/^\[kerfcast\] unexpected error in POST \/api\/users: (ER_DUP_ENTRY|TypeError|unknown)$/);
  });
});

describe('handle()', () => {
  it('turns a throw inside the handler into errorResponse, naming the method and path in the log', async () => {
    const lines: string[] = [];
    vi.spyOn(console, 'error').mockImplementation((...args: unknown[]) => void lines.push(args.map(String).join(' ')));
    const handler = handle(async () => {
      throw new RangeError('offset 9 out of range');
    });
    const response = await handler(new Request('http://127.0.0.1:3000/api/jobs/9', { method: 'GET' }), {});
    expect(response.status).toBe(500);
    expect(lines).toEqual(['[kerfcast] unexpected error in GET /api/jobs/9: RangeError']);
  });

  it('answers a bad body before the handler body runs past readJson', async () => {
    let reached = false;
    const handler = handle(async (request: Request) => {
      await readJson(request);
      reached = true;
      throw new Error('not reached');
    });
    const response = await handler(post('{oops'), {});
    expect([response.status, (await bodyOf(response)).error.code, reached]).toEqual([422, 'invalid:body', false]);
  });
});
