// The identity of an estimate: SHA-256 of everything that decides its result. Same program
// bytes, same machine version's profile, same job settings, same engine version → same key,
// so a second request finds the stored row instead of computing again. The JSON is written
// with its object keys sorted, so a snapshot read back from the database in another key
// order gives the same key.
import { createHash } from 'node:crypto';
import type { EstimateSettingsDoc } from '@/db/schema';

export interface EstimateInputs {
  /** SHA-256 (hex) of the program version's bytes */
  sha256: string;
  machineId: number;
  machineVersion: number;
  /** the machine version's profile snapshot (machine_versions.profile) */
  profile: unknown;
  settings: EstimateSettingsDoc;
  engineVersion: string;
}

/** JSON with object keys in code-point order; arrays keep their order (tool order matters). */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') {
    if (typeof value === 'number' && !Number.isFinite(value)) throw new Error(`canonicalJson: ${value} has no JSON form`);
    return JSON.stringify(value ?? null);
  }
  if (Array.isArray(value)) return `[${value.map((v) => canonicalJson(v === undefined ? null : v)).join(',')}]`;
  const entries = Object.entries(value as Record<string, unknown>)
    .filter(([, v]) => v !== undefined)
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
}

export function inputKey(inputs: EstimateInputs): string {
  const doc = {
    sha256: inputs.sha256.toLowerCase(),
    machineId: inputs.machineId,
    machineVersion: inputs.machineVersion,
    profile: inputs.profile,
    settings: inputs.settings,
    engineVersion: inputs.engineVersion,
  };
  return createHash('sha256').update(canonicalJson(doc)).digest('hex');
}
