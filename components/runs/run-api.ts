// What the run components share: posting to a run route through the one fetcher (so the
// server's typed error comes back as it was thrown), and the props they pass around.
import { fetcher } from '@/lib/fetcher';
import type { Role } from '@/lib/validation/enums';

export interface RunsMe {
  id: number;
  role: Role;
  mayRun: boolean;
  mayCorrectAny: boolean;
}

export interface MachineChoice {
  id: number;
  name: string;
}

/** Sends JSON to a run route (POST unless told); throws the server's AppError. */
export async function postRun<T>(url: string, body?: unknown, method = 'POST'): Promise<T> {
  return fetcher<T>(url, { method, headers: { 'content-type': 'application/json' }, body: JSON.stringify(body ?? {}) });
}
