// The server side of stored estimates: requesting one (inside the caller's transaction),
// the queue in MariaDB that worker threads drain, and waking that queue after a commit.
export { inputKey, canonicalJson, type EstimateInputs } from './input-key';
export { requestEstimate, jobEstimateSettings, jobPartOfSettings, ensureMachineVersion, type EstimateRequest, type EstimateRequested } from './request';
export { wakeEstimateQueue } from './wake';
export type { DbHandle, DbTx } from './db-handle';
