// Cornering speed at the vertex between two straight blocks, from the machine's corner
// tolerance δ (mm): how far inside the sharp corner the path may pass.
//
// Model (our own, from two textbook facts):
// - Plane geometry: a circle of radius R tangent to both sides of an angle θ has its centre on
//   the bisector, R/sin(θ/2) from the vertex, so its nearest point lies R/sin(θ/2) − R from the
//   vertex. Setting that distance to δ gives R = δ·sin(θ/2)/(1 − sin(θ/2)).
// - Uniform circular motion: speed v on radius R needs the centripetal acceleration a = v²/R
//   (any physics textbook, e.g. Halliday, Resnick & Walker, Fundamentals of Physics, ch. 4, from
//   memory), so the corner is taken at v = √(a·R).
// θ is the angle between the two blocks at the vertex (cos θ = −u_in·u_out): 180° straight on,
// 0° a reversal. `a` is the acceleration limit along the unit vector (u_out − u_in), the
// direction the velocity turns in, per-axis projected (axis-limits.ts).

import { accelAlong } from './axis-limits';

const along = accelAlong;

/**
 * Corner speed limit in mm/s (not yet capped by the blocks' own limits); Infinity for a straight
 * continuation, 0 for a reversal or when the tolerance is 0 at a real corner.
 */
export function cornerSpeedLimit(
  inX: number, inY: number, inZ: number,
  outX: number, outY: number, outZ: number,
  accelX: number, accelY: number, accelZ: number,
  cornerToleranceMm: number,
): number {
  const cosTheta = -(inX * outX + inY * outY + inZ * outZ);
  if (cosTheta <= -1 + 1e-12) return Infinity; // straight on
  if (cosTheta >= 1 - 1e-12) return 0; // reversal
  // sin(θ/2) = √((1 − cos θ)/2)
  const sinHalf = Math.sqrt(0.5 * (1 - cosTheta));
  let wx = outX - inX;
  let wy = outY - inY;
  let wz = outZ - inZ;
  const wl = Math.sqrt(wx * wx + wy * wy + wz * wz);
  wx /= wl;
  wy /= wl;
  wz /= wl;
  const a = along(wx, wy, wz, accelX, accelY, accelZ);
  const radius = (cornerToleranceMm * sinHalf) / (1 - sinHalf);
  return Math.sqrt(a * radius);
}

/** The formula alone, for an angle θ in radians and acceleration a: √(a·δ·s/(1 − s)), s = sin(θ/2). */
export function cornerSpeedForAngle(thetaRad: number, accelMmPerS2: number, cornerToleranceMm: number): number {
  const s = Math.sin(thetaRad / 2);
  if (s >= 1) return Infinity;
  return Math.sqrt((accelMmPerS2 * cornerToleranceMm * s) / (1 - s));
}
