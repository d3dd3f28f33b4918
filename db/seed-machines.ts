// Machine profiles ↔ rows: the profile JSON of lib/validation/machine-profile (fixtures,
// CLI, machine_versions snapshots) and the flat columns of `machines` + `tools`.
import fs from 'node:fs';
import path from 'node:path';
import { parseMachineProfile, type MachineProfile } from '@/lib/validation/machine-profile';
import type { Machine, Tool } from './schema';
import { machines } from './schema';

/** Reads and validates a fixture profile; the error names the file and the bad field. */
export function readProfileFile(file: string): MachineProfile {
  let raw: unknown;
  try {
    raw = JSON.parse(fs.readFileSync(file, 'utf8'));
  } catch (err) {
    throw new Error(`${path.relative(process.cwd(), file)}: not readable JSON (${(err as Error).message})`);
  }
  const parsed = parseMachineProfile(raw);
  if (!parsed.ok) throw new Error(`${path.relative(process.cwd(), file)}: ${parsed.message}`);
  return parsed.profile;
}

export function profileToMachineColumns(p: MachineProfile) {
  return {
    name: p.name,
    travelXMm: p.travelMm.x,
    travelYMm: p.travelMm.y,
    travelZMm: p.travelMm.z,
    homeXMm: p.homeMm.x,
    homeYMm: p.homeMm.y,
    homeZMm: p.homeMm.z,
    maxFeedXMmPerMin: p.maxFeedMmPerMin.x,
    maxFeedYMmPerMin: p.maxFeedMmPerMin.y,
    maxFeedZMmPerMin: p.maxFeedMmPerMin.z,
    rapidXMmPerMin: p.rapidMmPerMin.x,
    rapidYMmPerMin: p.rapidMmPerMin.y,
    rapidZMmPerMin: p.rapidMmPerMin.z,
    accelXMmPerS2: p.accelMmPerS2.x,
    accelYMmPerS2: p.accelMmPerS2.y,
    accelZMmPerS2: p.accelMmPerS2.z,
    cornerToleranceMm: p.cornerToleranceMm,
    lookaheadBlocks: p.lookaheadBlocks,
    maxBlocksPerS: p.maxBlocksPerS,
    chordToleranceMm: p.chordToleranceMm,
    toolChangeS: p.toolChangeSeconds,
    spindleSpinUpS: p.spindleSpinUpSeconds,
    timeFactor: p.timeFactor,
  } satisfies Partial<typeof machines.$inferInsert>;
}

/** The profile as the estimator reads it, rebuilt from a machine row and its tools. */
export function machineRowToProfile(m: Machine, machineTools: Tool[]): MachineProfile {
  return {
    name: m.name,
    travelMm: { x: m.travelXMm, y: m.travelYMm, z: m.travelZMm },
    homeMm: { x: m.homeXMm, y: m.homeYMm, z: m.homeZMm },
    maxFeedMmPerMin: { x: m.maxFeedXMmPerMin, y: m.maxFeedYMmPerMin, z: m.maxFeedZMmPerMin },
    rapidMmPerMin: { x: m.rapidXMmPerMin, y: m.rapidYMmPerMin, z: m.rapidZMmPerMin },
    accelMmPerS2: { x: m.accelXMmPerS2, y: m.accelYMmPerS2, z: m.accelZMmPerS2 },
    cornerToleranceMm: m.cornerToleranceMm,
    lookaheadBlocks: m.lookaheadBlocks,
    maxBlocksPerS: m.maxBlocksPerS,
    chordToleranceMm: m.chordToleranceMm,
    toolChangeSeconds: m.toolChangeS,
    spindleSpinUpSeconds: m.spindleSpinUpS,
    timeFactor: m.timeFactor,
    tools: [...machineTools]
      .sort((a, b) => a.number - b.number)
      .map((t) => ({ number: t.number, diameterMm: t.diameterMm, flutes: t.flutes, kind: t.kind })),
  };
}
