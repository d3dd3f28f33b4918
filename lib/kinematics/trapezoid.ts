// Constant-acceleration (trapezoidal) velocity profile of one block, in closed form.
//
// Source: L. Biagiotti, C. Melchiorri, Trajectory Planning for Automatic Machines and Robots,
// Springer 2008, §3.2.2 (from memory). A block of length d with cruise limit v, acceleration
// limit a, entry speed v0 and exit speed v1 (both ≤ v):
//   cruise reached when d ≥ (2v² − v0² − v1²)/(2a):
//     T = d/v + (v/2a)(1 − v0/v)² + (v/2a)(1 − v1/v)²
//   otherwise the peak is v_peak = √(a·d + (v0² + v1²)/2) and
//     T = (v_peak − v0)/a + (v_peak − v1)/a
//   feasible only when a·d ≥ |v0² − v1²|/2; the planner guarantees that, and rounding error
//   beyond it falls back to constant acceleration from v0 to v1 (T = 2d/(v0 + v1)).

/** Duration in s of a block of `lengthMm` from entry `v0` to exit `v1` (mm/s). */
export function blockDurationS(lengthMm: number, vMaxMmPerS: number, accelMmPerS2: number, v0: number, v1: number): number {
  const d = lengthMm;
  if (d <= 0) return 0;
  const v = vMaxMmPerS;
  const a = accelMmPerS2;
  const v0s = v0 * v0;
  const v1s = v1 * v1;
  const twoAd = 2 * a * d;
  if (twoAd >= 2 * v * v - v0s - v1s) {
    // d/v + (v/2a)(1 − v0/v)² + (v/2a)(1 − v1/v)², over one common denominator
    const r0 = v - v0;
    const r1 = v - v1;
    return (twoAd + r0 * r0 + r1 * r1) / (2 * a * v);
  }
  const peakSq = a * d + (v0s + v1s) / 2;
  const peak = Math.sqrt(peakSq);
  if (peak <= v0 || peak <= v1) {
    // a·d < |v0² − v1²|/2 (only by rounding): a single ramp between the two speeds.
    const sum = v0 + v1;
    return sum > 0 ? (2 * d) / sum : 2 * Math.sqrt(d / a);
  }
  return (2 * peak - v0 - v1) / a;
}

/** Rest-to-rest duration: d/v + v/a when d ≥ v²/a, else 2√(d/a). */
export function restToRestDurationS(lengthMm: number, vMaxMmPerS: number, accelMmPerS2: number): number {
  return blockDurationS(lengthMm, vMaxMmPerS, accelMmPerS2, 0, 0);
}
