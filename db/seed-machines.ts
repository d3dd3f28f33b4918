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
    travelXMm: p.travel.x,
    travelYMm: p.travel.y,
    travelZMm: p.travel.z,
    homeXMm: p.home.x,
    homeYMm: p.home.y,
    homeZMm: p.home.z,
    maxFeedXMmPerMin: p.maxFeed.x,
    maxFeedYMmPerMin: p.maxFeed.y,
    maxFeedZMmPerMin: p.maxFeed.z,
    rapidXMmPerMin: p.rapid.x,
    rapidYMmPerMin: p.rapid.y,
    rapidZMmPerMin: p.rapid.z,
    accelXMmPerS2: p.accel.x,
    accelYMmPerS2: p.accel.y,
    accelZMmPerS2: p.accel.z,
    cornerToleranceMm: p.junctionDeviation,
    lookaheadBlocks: p.lookahead,
    maxBlocksPerS: p.maxBlockRate,
    chordToleranceMm: p.arcTolerance,
    toolChangeS: p.toolChangeSeconds,
    spindleSpinUpS: p.spindleSpinUpSeconds,
    timeFactor: p.timeFactor,
  } satisfies Partial<typeof machines.$inferInsert>;
}

/** The profile as the estimator reads it, rebuilt from a machine row and its tools. */
export function machineRowToProfile(m: Machine, machineTools: Tool[]): MachineProfile {
  return {
    name: m.name,
    travel: { x: m.travelXMm, y: m.travelYMm, z: m.travelZMm },
    home: { x: m.homeXMm, y: m.homeYMm, z: m.homeZMm },
    maxFeed: { x: m.maxFeedXMmPerMin, y: m.maxFeedYMmPerMin, z: m.maxFeedZMmPerMin },
    rapid: { x: m.rapidXMmPerMin, y: m.rapidYMmPerMin, z: m.rapidZMmPerMin },
    accel: { x: m.accelXMmPerS2, y: m.accelYMmPerS2, z: m.accelZMmPerS2 },
    junctionDeviation: m.cornerToleranceMm,
    lookahead: m.lookaheadBlocks,
    maxBlockRate: m.maxBlocksPerS,
    arcTolerance: m.chordToleranceMm,
    toolChangeSeconds: m.toolChangeS,
    spindleSpinUpSeconds: m.spindleSpinUpS,
    timeFactor: m.timeFactor,
    tools: [...machineTools]
      .sort((a, b) => a.number - b.number)
      .map((t) => ({ number: t.number, diameter: t.diameterMm, flutes: t.flutes, kind: t.kind })),
  };
}
