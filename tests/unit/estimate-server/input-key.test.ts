// The estimate's identity (lib/estimate-server/input-key.ts): the same inputs give the same key
// whatever order a stored JSON document returns its keys in, and each input that decides the
// result moves the key. The key is SHA-256 (FIPS 180-4) over the canonical JSON; the JSON's key
// order is code-point order as RFC 8785 (JSON Canonicalization Scheme) §3.2.3 sorts ASCII keys.
import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { canonicalJson, inputKey, type EstimateInputs } from '@/lib/estimate-server/input-key';
import { jobEstimateSettings } from '@/lib/estimate-server/request';

const base: EstimateInputs = {
  sha256: 'a'.repeat(64),
  machineId: 3,
  machineVersion: 2,
  profile: { name: 'Router 1', accelMmPerS2: { x: 1500, y: 1500, z: 800 }, tools: [{ number: 1, diameterMm: 6.35 }, { number: 2, diameterMm: 3.175 }] },
  settings: { sheet: { widthMm: 2440, lengthMm: 1220, thicknessMm: 18 }, zero: 'top', hold: 'vacuum', vacuumKpa: 61 },
  engineVersion: '1.0.0',
};

describe('canonicalJson', () => {
  it('sorts object keys by code point at every depth and keeps array order (RFC 8785 §3.2.3 for ASCII keys)', () => {
    expect(canonicalJson({ b: 1, a: { d: [3, 1, 2], c: null }, B: true })).toBe('{"B":true,"a":{"c":null,"d":[3,1,2]},"b":1}');
  });

  it('writes numbers as JSON.stringify does (ECMAScript Number::toString, which RFC 8785 §3.2.2.3 adopts)', () => {
    expect(canonicalJson({ x: 0.1 + 0.2, y: 1e21, z: -0 })).toBe('{"x":0.30000000000000004,"y":1e+21,"z":0}');
  });

  it('refuses a number JSON cannot hold instead of writing null for it', () => {
    expect(() => canonicalJson({ x: Number.NaN })).toThrow(/no JSON form/);
  });
});

describe('inputKey', () => {
  it('is the SHA-256 of the canonical JSON of the six inputs', () => {
    const doc = canonicalJson({ ...base });
    expect(inputKey(base)).toBe(createHash('sha256').update(doc).digest('hex'));
    expect(inputKey(base)).toMatch(/^[0-9a-f]{64}$/);
  });

  it('does not depend on the key order of a snapshot read back from the database', () => {
    const reordered: EstimateInputs = {
      engineVersion: '1.0.0',
      settings: { vacuumKpa: 61, hold: 'vacuum', zero: 'top', sheet: { thicknessMm: 18, lengthMm: 1220, widthMm: 2440 } },
      profile: { tools: [{ diameterMm: 6.35, number: 1 }, { diameterMm: 3.175, number: 2 }], accelMmPerS2: { z: 800, y: 1500, x: 1500 }, name: 'Router 1' },
      machineVersion: 2,
      machineId: 3,
      sha256: 'A'.repeat(64),
    };
    expect(inputKey(reordered)).toBe(inputKey(base));
  });

  it('changes with each input that decides the result', () => {
    const variants: EstimateInputs[] = [
      { ...base, sha256: 'b'.repeat(64) },
      { ...base, machineId: 4 },
      { ...base, machineVersion: 3 },
      { ...base, profile: { ...(base.profile as object), accelMmPerS2: { x: 1200, y: 1500, z: 800 } } },
      { ...base, settings: { ...base.settings, zero: 'table' } },
      { ...base, settings: { ...base.settings, hold: 'clamps', vacuumKpa: null } },
      { ...base, settings: { ...base.settings, sheet: { widthMm: 2440, lengthMm: 1220, thicknessMm: 12 } } },
      { ...base, settings: { ...base.settings, vacuumKpa: 50 } },
      { ...base, engineVersion: '1.1.0' },
      // tool order is part of the profile as the snapshot lists it
      { ...base, profile: { ...(base.profile as object), tools: [{ number: 2, diameterMm: 3.175 }, { number: 1, diameterMm: 6.35 }] } },
    ];
    const keys = new Set([inputKey(base), ...variants.map(inputKey)]);
    expect(keys.size).toBe(variants.length + 1);
  });
});

describe('jobEstimateSettings', () => {
  const job = { sheetWidthMm: 2440, sheetLengthMm: 1220, sheetThicknessMm: 18, zZero: 'top' as const, holdDown: 'vacuum' as const, vacuumKpa: 61 };

  it("takes the job's sheet (X × Y × T), Z zero, hold-down and vacuum level", () => {
    expect(jobEstimateSettings(job)).toEqual({ sheet: { widthMm: 2440, lengthMm: 1220, thicknessMm: 18 }, zero: 'top', hold: 'vacuum', vacuumKpa: 61 });
  });

  it('drops a vacuum level left on a job held another way, so it cannot split identical estimates', () => {
    expect(jobEstimateSettings({ ...job, holdDown: 'clamps' }).vacuumKpa).toBeNull();
    expect(jobEstimateSettings({ ...job, vacuumKpa: null }).vacuumKpa).toBeNull();
  });
});
