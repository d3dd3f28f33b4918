// Route parameters arrive as strings; a row id is a positive integer that fits in
// MariaDB's INT (2^31 − 1). Anything else is answered as not found, not as a crash.
import { z } from '@/lib/validation/zod';
import { AppError } from '@/lib/errors';

export const idSchema = z.coerce.number().int().positive().max(2_147_483_647);

export function parseId(raw: string, what: string): number {
  const parsed = idSchema.safeParse(raw);
  if (!parsed.success || !/^\d+$/.test(raw)) throw new AppError(`not-found:${what}`, `No such ${what}.`);
  return parsed.data;
}
