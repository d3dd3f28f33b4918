// The Drizzle handle the estimate server's functions take: the app's pool or an open
// transaction, so a caller can request an estimate inside its own transaction (an upload's).
import type { Db } from '@/db/client';

export type DbTx = Parameters<Parameters<Db['transaction']>[0]>[0];
export type DbHandle = Db | DbTx;
