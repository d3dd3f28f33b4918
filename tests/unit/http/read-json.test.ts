// readJson's body limit: a JSON body is read as a stream and given up as soon as its
// byte count passes the limit (413, the usual error shape), or at once when the
// declared Content-Length is over it. Bodies are built from ReadableStreams so the
// test can count how much of the body was pulled.
import { describe, expect, it, vi } from 'vitest';

// lib/http/route.ts is marked server-only; the marker package throws outside the
// react-server build condition, which vitest does not use.
vi.mock('server-only', () => ({}));

const { errorResponse, readJson } = await import('@/lib/http/route');
const { AppError } = await import('@/lib/errors');

const encoder = new TextEncoder();

/** A stream giving the chunks in turn, recording how many were pulled and whether it was cancelled. */
function countedStream(chunks: Uint8Array[] | ((index: number) => Uint8Array)) {
  const seen = { pulled: 0, cancelled: false };
  const next = typeof chunks === 'function' ? chunks : (i: number) => chunks[i];
  const count = typeof chunks === 'function' ? Infinity : chunks.length;
  const stream = new ReadableStream<Uint8Array>(
    {
      pull(controller) {
        if (seen.pulled >= count) return controller.close();
        controller.enqueue(next(seen.pulled));
        seen.pulled += 1;
      },
      cancel() {
        seen.cancelled = true;
      },
    },
    { highWaterMark: 0 },
  );
  return { stream, seen };
}

function post(body: ReadableStream<Uint8Array>, headers: Record<string, string> = {}): Request {
  return new Request('http://127.0.0.1/api/customers', {
    method: 'POST',
    headers: { 'content-type': 'application/json', ...headers },
    body,
    duplex: 'half',
  } as RequestInit & { duplex: 'half' });
}

async function thrown(promise: Promise<unknown>): Promise<InstanceType<typeof AppError>> {
  try {
    await promise;
  } catch (error) {
    if (error instanceof AppError) return error;
    throw error;
  }
  throw new Error('expected readJson to throw');
}

describe('readJson', () => {
  it('parses a small body given in several chunks', async () => {
    const text = JSON.stringify({ name: 'Marlow Street Bakery', notes: 'delivery at the back door' });
    const bytes = encoder.encode(text);
    const { stream } = countedStream([bytes.slice(0, 7), bytes.slice(7, 20), bytes.slice(20)]);
    expect(await readJson(post(stream), 1024)).toEqual({ name: 'Marlow Street Bakery', notes: 'delivery at the back door' });
  });

  it('accepts a body of exactly the limit and refuses one byte more', async () => {
    const limit = 2048;
    const exact = `"${'a'.repeat(limit - 2)}"`; // a JSON string: the quotes are two of the bytes
    expect(encoder.encode(exact).byteLength).toBe(limit);
    expect(await readJson(post(countedStream([encoder.encode(exact)]).stream), limit)).toBe('a'.repeat(limit - 2));

    const over = `"${'a'.repeat(limit - 1)}"`;
    const error = await thrown(readJson(post(countedStream([encoder.encode(over)]).stream), limit));
    expect([error.code, error.status]).toEqual(['too-large:body', 413]);
  });

  it('counts bytes, not characters (é is two bytes in UTF-8, RFC 3629 §3)', async () => {
    const text = `"${'é'.repeat(700)}"`; // 702 characters, 1402 bytes
    expect(text.length).toBeLessThan(1024);
    const error = await thrown(readJson(post(countedStream([encoder.encode(text)]).stream), 1024));
    expect(error.status).toBe(413);
  });

  it('stops reading an endless body soon after the limit and cancels the stream', async () => {
    const chunk = encoder.encode(' '.repeat(16 * 1024));
    const { stream, seen } = countedStream(() => chunk);
    const limit = 1024 * 1024;
    const error = await thrown(readJson(post(stream), limit));
    expect(error.status).toBe(413);
    // 64 chunks of 16 KiB make the limit; the 65th passes it. A few more may sit in
    // the Request's own queue, but nowhere near the whole (endless) body.
    expect(seen.pulled).toBeGreaterThanOrEqual(65);
    expect(seen.pulled).toBeLessThanOrEqual(70);
    await vi.waitFor(() => expect(seen.cancelled).toBe(true));
  });

  it('refuses a declared Content-Length over the limit before reading anything', async () => {
    const { stream, seen } = countedStream(() => encoder.encode('{}'));
    const error = await thrown(readJson(post(stream, { 'content-length': String(2 * 1024 * 1024) }), 1024 * 1024));
    expect(error.status).toBe(413);
    expect(seen.pulled).toBe(0);
  });

  it('answers 413 with the error shape { error: { code, message } }', async () => {
    const error = await thrown(readJson(post(countedStream([encoder.encode('"' + 'x'.repeat(5000) + '"')]).stream), 1024));
    const response = errorResponse(error);
    expect(response.status).toBe(413);
    const body = (await response.json()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe('too-large:body');
    expect(body.error.message).toMatch(/1,024 bytes/);
  });

  it('refuses bytes that are not UTF-8 (RFC 8259 §8.1) and text that is not JSON, as 422', async () => {
    const latin1 = new Uint8Array([0x22, 0xe9, 0x22]); // "é" in ISO 8859-1: 0xE9 alone is not UTF-8
    const notUtf8 = await thrown(readJson(post(countedStream([latin1]).stream), 1024));
    expect([notUtf8.code, notUtf8.status]).toEqual(['invalid:body', 422]);
    const notJson = await thrown(readJson(post(countedStream([encoder.encode('{"name": ')]).stream), 1024));
    expect([notJson.code, notJson.status]).toEqual(['invalid:body', 422]);
    const empty = await thrown(readJson(post(countedStream([]).stream), 1024));
    expect(empty.code).toBe('invalid:body');
  });
});
