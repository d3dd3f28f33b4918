// Arcs and helices flattened to chords for the planner.
//
// Arcs as chords: how many a controller needs. A controller runs an arc as short straight blocks whose sagitta stays within the arc
// tolerance e: a chord spanning φ of a circle of radius r has sagitta r(1 − cos(φ/2)), so the
// widest chord allowed spans 2·acos(1 − e/r) and a sweep θ needs n = ⌈θ / (2·acos(1 − e/r))⌉
// chords (the arc geometry of any geometry text; checks in docs/references.md: r=10, e=0.01, full
// circle → 71; r=50, e=0.01, 90° → 40). A helix rises linearly with the swept angle.
// The chords themselves are walked in block-feed.ts.

/** Number of chords for a sweep of |sweepRad| on radius r within tolerance e (at least 1). */
export function chordCount(radiusMm: number, sweepRad: number, toleranceMm: number): number {
  const sweep = Math.abs(sweepRad);
  if (!(radiusMm > 0) || sweep === 0) return 1;
  const c = 1 - toleranceMm / radiusMm;
  const step = 2 * Math.acos(c < -1 ? -1 : c > 1 ? 1 : c);
  if (!(step > 0)) return 1;
  return Math.max(1, Math.ceil(sweep / step - 1e-9));
}

