// The shared SWR fetcher turns a route handler's error JSON back into the typed
// AppError (same code, status, fields), with a stand-in for the network.
import { afterEach, describe, expect, it, vi } from 'vitest';
import { AppError } from '@/lib/errors';
import { fetcher } from '@/lib/fetcher';

afterEach(() => vi.unstubAllGlobals());

function answer(status: number, body: unknown) {
  vi.stubGlobal('fetch', vi.fn(async () => new Response(typeof body === 'string' ? body : JSON.stringify(body), { status })));
}

describe('fetcher', () => {
  it('returns the JSON of a 200', async () => {
    answer(200, { jobs: [{ id: 1 }] });
    await expect(fetcher('/api/jobs')).resolves.toEqual({ jobs: [{ id: 1 }] });
  });

  it('rebuilds the typed error from the error body', async () => {
    answer(422, { error: { code: 'invalid:customer', message: 'Some of the customer details need fixing: each one is named at its field.', fields: { email: ['Enter an e-mail.'] } } });
    const error = await fetcher('/api/customers').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(AppError);
    expect(error).toMatchObject({ code: 'invalid:customer', status: 422, fields: { email: ['Enter an e-mail.'] } });
  });

  it('maps a bare 403 or an HTML 500 to a typed error too', async () => {
    answer(403, '<html>no</html>');
    await expect(fetcher('/api/users')).rejects.toMatchObject({ code: 'forbidden', status: 403 });
    answer(502, 'Bad gateway');
    await expect(fetcher('/api/users')).rejects.toMatchObject({ code: 'internal', status: 500 });
  });

  it('reports a network failure in words', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => Promise.reject(new TypeError('fetch failed'))));
    await expect(fetcher('/api/jobs')).rejects.toMatchObject({ code: 'internal:network' });
  });
});
