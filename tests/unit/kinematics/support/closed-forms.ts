// The motion closed forms of docs/references.md §3, written out here from the formulas and
// not imported from lib/kinematics, so that a test bounding the planner with them does not
// share an error with the code under test. Use them for bounds in properties; tests of single
// cases state their expected values as literals.

/**
 * Trapezoidal profile of a block of length d, cruise limit v, acceleration a, entry v0, exit
 * v1 (L. Biagiotti, C. Melchiorri, Trajectory Planning for Automatic Machines and Robots,
 * Springer 2008, §3.2.2, from memory): T = d/v + (v/2a)(1 − v0/v)² + (v/2a)(1 − v1/v)² when
 * the cruise is reached, else v_peak = √(a·d + (v0² + v1²)/2) and T = (2·v_peak − v0 − v1)/a.
 */
export function trapezoidS(d: number, v: number, a: number, v0 = 0, v1 = 0): number {
  if (d <= 0) return 0;
  if (a * d >= v * v - (v0 * v0 + v1 * v1) / 2) return d / v + (v / (2 * a)) * (1 - v0 / v) ** 2 + (v / (2 * a)) * (1 - v1 / v) ** 2;
  const peak = Math.sqrt(a * d + (v0 * v0 + v1 * v1) / 2);
  return (2 * peak - v0 - v1) / a;
}

/** Rest to rest: d/v + v/a when d ≥ v²/a, else 2√(d/a) (same source). */
export function restToRestS(d: number, v: number, a: number): number {
  return d >= (v * v) / a ? d / v + v / a : 2 * Math.sqrt(d / a);
}

/** A per-axis limit seen along the unit vector u: min over moving axes of limit_i/|u_i| (vector decomposition). */
export function alongS(u: [number, number, number], limit: [number, number, number]): number {
  let m = Infinity;
  for (let i = 0; i < 3; i++) if (Math.abs(u[i]) > 1e-12) m = Math.min(m, limit[i] / Math.abs(u[i]));
  return m;
}
