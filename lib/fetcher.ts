// The one SWR fetcher. A JSON error body from a route handler comes back as the
// same typed AppError the server threw, so components can branch on error.code
// and show error.fields; a network failure becomes an "internal:network" error.
import { AppError, appErrorFromBody, isErrorBody } from '@/lib/errors';

export async function fetcher<T>(url: string, init?: RequestInit): Promise<T> {
  let response: Response;
  try {
    response = await fetch(url, { ...init, headers: { accept: 'application/json', ...init?.headers } });
  } catch {
    throw new AppError('internal:network', 'The server could not be reached. Check the connection and try again.');
  }
  const body: unknown = await response.json().catch(() => null);
  if (!response.ok) {
    if (isErrorBody(body)) throw appErrorFromBody(body);
    const code = response.status === 401 ? 'unauthorized' : response.status === 403 ? 'forbidden' : response.status === 404 ? 'not-found' : 'internal';
    throw new AppError(code, `The server answered ${response.status}.`);
  }
  return body as T;
}
