// Hold-down model. Vacuum: normal force F = ΔP·A (pressure difference times the area in
// contact), lateral resistance μ·F, which must be at least the tool's side force
// (docs/references.md, Hold-down; units NIST SP 811). μ, the side force and the vacuum level
// are shop settings whose defaults are common practice, not published values (settings.ts).
// Tape and glue hold any part; clamps or screws hold the sheet, not what is cut free of it;
// "tabs" and "skin" hold only through what the program leaves.
import { fmt } from './findings';
import type { AnalysisSettings } from '../settings';
import { MM2_PER_M2 } from '../units';
import type { HoldBy, HoldDownMethod } from '../types';

/** normal force of a vacuum table on a part, N: ΔP [kPa] × A [mm²] */
export function vacuumNormalForceN(vacuumKpa: number, areaMm2: number): number {
  return vacuumKpa * 1000 * (areaMm2 / MM2_PER_M2);
}

export function vacuumLateralHoldN(vacuumKpa: number, areaMm2: number, frictionMu: number): number {
  return frictionMu * vacuumNormalForceN(vacuumKpa, areaMm2);
}

export function cuttingForceFor(tool: number, s: AnalysisSettings): number {
  return s.cuttingForceByToolN[tool] ?? s.cuttingForceN;
}

export interface HoldVerdict {
  held: boolean;
  holdBy: HoldBy;
  /** why it is not held; empty when held */
  reason: string;
}

/** whether the hold-down holds a freed piece, without the verdict's wording (null: none named) */
export function freedPieceHeld(method: HoldDownMethod | null, areaMm2: number, tool: number, vacuumKpa: number, s: AnalysisSettings): boolean {
  if (method === 'tape-glue') return true;
  if (method === 'vacuum') return vacuumLateralHoldN(vacuumKpa, areaMm2, s.frictionMu) >= cuttingForceFor(tool, s);
  return false;
}

/** the hold of a piece freed by the program (no tabs or skin left); null: no hold-down was named */
export function freedPieceHold(method: HoldDownMethod | null, areaMm2: number, tool: number, vacuumKpa: number, s: AnalysisSettings): HoldVerdict {
  switch (method) {
    case 'tape-glue':
      return { held: true, holdBy: 'tape-glue', reason: '' };
    case 'vacuum': {
      const hold = vacuumLateralHoldN(vacuumKpa, areaMm2, s.frictionMu);
      const force = cuttingForceFor(tool, s);
      if (hold >= force) return { held: true, holdBy: 'vacuum', reason: '' };
      return {
        held: false,
        holdBy: 'none',
        reason: `its area is too small for the vacuum: μ·ΔP·A = ${fmt(s.frictionMu, 2)} × ${fmt(vacuumKpa, 1)} kPa × ${fmt(areaMm2, 0)} mm² = ${fmt(hold, 1)} N of lateral hold, less than the ${fmt(force, 0)} N side force set for tool T${tool}`,
      };
    }
    case 'clamps':
      return { held: false, holdBy: 'none', reason: 'clamps or screws hold the sheet, not a part cut free of it, and the program leaves no tabs or skin on it' };
    case 'tabs':
      return { held: false, holdBy: 'none', reason: 'the hold-down is tabs only, and the program leaves no tabs on this profile' };
    case null:
      return { held: false, holdBy: 'none', reason: 'no hold-down was given, so only tabs or onion skin left by the program count, and it leaves none on this profile' };
    case 'skin':
      return { held: false, holdBy: 'none', reason: 'the hold-down is an onion skin, and the program cuts this profile through without leaving one' };
  }
}
