// What crosses the worker-thread boundary: the task the queue hands a worker (where the
// program is, the frozen profile and settings) and the few figures the worker hands back.
// The report itself never crosses: the worker stores it in object storage and the main
// thread only writes the figures and the key.
import type { MessagePort } from 'node:worker_threads';
import type { EstimateSettingsDoc } from '@/db/schema';

export interface EstimateTask {
  estimateId: number;
  shopId: number;
  /** the program version's object */
  objectKey: string;
  /** the program's file name, as the report names it (the CLI: the file's base name) */
  fileName: string;
  sha256: string;
  /** machine_versions.profile: validated again in the worker */
  profile: unknown;
  settings: EstimateSettingsDoc;
  /** where the worker stores the report JSON */
  reportKey: string;
  /** where the worker stores the per-hold-down-method analysis (the hold-down comparison) */
  holdMethodsKey: string;
  /** receives { progress } messages (0–1) while the task runs */
  progressPort?: MessagePort;
}

export interface EstimateTaskResult {
  ok: true;
  reportKey: string;
  reportBytes: number;
  /** the per-method analysis object; null when it could not be made (the estimate itself stands) */
  holdMethodsKey?: string | null;
  /** reading the program, computing and storing the report, in the worker */
  computeMs: number;
  /** where computeMs went: reading and checking the program, the engine, storing the report */
  phasesMs: { read: number; engine: number; holdMethods?: number; store: number };
  totalSeconds: number;
  calibratedSeconds: number;
  errorCount: number;
  warningCount: number;
  infoCount: number;
  partCount: number;
}

/** A computation that could not be made, with the reason stored on the estimate. */
export interface EstimateTaskFailure {
  ok: false;
  reason: string;
}

export type EstimateTaskOutcome = EstimateTaskResult | EstimateTaskFailure;

/** Where an estimate's report lives in the bucket. */
export function reportKeyFor(shopId: number, estimateId: number): string {
  return `shops/${shopId}/estimates/${estimateId}.json`;
}

/** Where an estimate's per-hold-down-method analysis lives, beside its report. */
export function holdMethodsKeyFor(shopId: number, estimateId: number): string {
  return `shops/${shopId}/estimates/${estimateId}.hold-methods.json`;
}

/** A failure that belongs to the estimate's inputs (a missing object, changed bytes, a bad profile): its message is the reason. */
export class EstimateInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'EstimateInputError';
  }
}
