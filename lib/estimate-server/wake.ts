// The link between request handlers and the estimate queue running in the same server
// process. Next.js bundles instrumentation.ts and each route apart, so a module-level
// variable would not be shared between them: the running queue registers itself on
// globalThis. Without a queue in this process (a script, the build) waking is a no-op;
// the row waits in the database for whichever process polls next.
export interface WakeableQueue {
  wake(): void;
}

const slot = globalThis as unknown as { kerfcastEstimateQueue?: WakeableQueue };

export function registerEstimateQueue(queue: WakeableQueue | undefined): void {
  slot.kerfcastEstimateQueue = queue;
}

export function runningEstimateQueue(): WakeableQueue | undefined {
  return slot.kerfcastEstimateQueue;
}

/** Tell this process's queue to look for pending estimates now (call after the request's transaction commits). */
export function wakeEstimateQueue(): void {
  slot.kerfcastEstimateQueue?.wake();
}
