// Shop settings of the through-cut analysis and their defaults. The defaults are common
// practice of router shops, not published limits; each shop can override them.
import { PA_PER_INHG } from './units';

export interface AnalysisSettings {
  /** friction coefficient between part and table or spoilboard; wood on wood ≈ 0.45 (engineering forums, common practice; published tables vary with the surfaces, docs/references.md) */
  frictionMu: number;
  /**
   * lateral cutting force a held part must resist, N, for any tool without its own value.
   * 45 N (≈ 10 lbf) is a shop rule of thumb for a 6 mm router bit at ordinary chip loads
   * (common practice, no published source); it makes a part of about 1.3 in² under an 18 inHg
   * table (≈ 22 N of lateral hold) come out unheld, as practitioners report.
   */
  cuttingForceN: number;
  /** per-tool overrides of cuttingForceN, keyed by tool number */
  cuttingForceByToolN: Record<number, number>;
  /** vacuum level used when the job gives none, kPa below atmosphere: 18 inHg, mid of the 14–22 inHg typical of router tables (common practice) */
  defaultVacuumKpa: number;
  /** a cut at or below bottom + this is through, mm */
  bottomToleranceMm: number;
  /** a loop whose deepest pass stops at most this far above the bottom leaves an onion skin, mm (skins are 0.2–0.5 mm, common practice) */
  skinMaxMm: number;
  /** a rise above the bottom on a final pass that comes back down within this XY length is a tab, mm */
  tabMaxLengthMm: number;
  /** sheets this thin or thinner can lift under an up-cut tool when held only at the edges, mm (1/4 in, common practice; no published threshold) */
  thinSheetMm: number;
  /**
   * cutting deeper than this below the sheet bottom is a spoilboard-depth warning, mm. 1 mm is our
   * own default, neither sourced nor computed: through-cuts commonly go a few tenths of a
   * millimetre into the spoilboard (common practice), so only deeper cuts are flagged.
   */
  spoilboardAllowanceMm: number;
  /** end points closer than this in XY are the same point when loops are chained, mm */
  chainToleranceMm: number;
  /** largest distance between an arc and its chords, mm */
  chordToleranceMm: number;
  /** findings kept per kind; the rest are counted in the summary */
  maxFindingsPerKind: number;
}

export const DEFAULT_SETTINGS: Readonly<AnalysisSettings> = Object.freeze({
  frictionMu: 0.45,
  cuttingForceN: 45,
  cuttingForceByToolN: {},
  defaultVacuumKpa: (18 * PA_PER_INHG) / 1000,
  bottomToleranceMm: 0.05,
  skinMaxMm: 1.0,
  tabMaxLengthMm: 50,
  thinSheetMm: 6.35,
  spoilboardAllowanceMm: 1.0,
  chainToleranceMm: 0.01,
  chordToleranceMm: 0.01,
  maxFindingsPerKind: 25,
});

export function resolveSettings(partial?: Partial<AnalysisSettings>): AnalysisSettings {
  const s = { ...DEFAULT_SETTINGS, ...(partial ?? {}) };
  s.cuttingForceByToolN = { ...(partial?.cuttingForceByToolN ?? {}) };
  return s;
}
