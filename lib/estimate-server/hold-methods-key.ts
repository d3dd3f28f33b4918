// The key of an estimate's per-hold-down-method analysis (estimates.hold_methods_key),
// written by the process that holds the row's lease just before it stores the result, so a
// done estimate always names its object (or null: made without one).
import { and, eq } from 'drizzle-orm';
import type { Db } from '@/db/client';
import { estimates } from '@/db/schema';

export async function setHoldMethodsKey(db: Db, owner: string, id: number, key: string | null): Promise<void> {
  await db
    .update(estimates)
    .set({ holdMethodsKey: key })
    .where(and(eq(estimates.id, id), eq(estimates.leaseOwner, owner), eq(estimates.status, 'running')));
}
