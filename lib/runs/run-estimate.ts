// The estimate a run is measured against, for the whole run. A stored estimate is the machine
// time of one pass of the program, that is one sheet; a run that cut n sheets of the same
// program is measured against n times it (common practice: a nested program is cut once per
// sheet, PRODUCT.md "parts per sheet decides how many sheets a quantity needs"). The sheets'
// loading and unloading are not in the estimate, so the operator's timer is paused for them
// or the ratio shows them. A run that cut no sheets (interrupted early) has no figure.
// Pure; the calibration, the runs table and the exports read the same figure.

/** The uncalibrated estimate for a run: one sheet's seconds × sheets cut; null without both. */
export function runEstimateSeconds(estimateSecondsPerSheet: number | null, sheetsCut: number | null): number | null {
  if (estimateSecondsPerSheet === null || !Number.isFinite(estimateSecondsPerSheet) || estimateSecondsPerSheet <= 0) return null;
  if (sheetsCut === null || !Number.isInteger(sheetsCut) || sheetsCut < 1) return null;
  return estimateSecondsPerSheet * sheetsCut;
}
