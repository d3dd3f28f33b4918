// Cornering speed at the vertex between two straight blocks, by junction deviation.
//
// Source: S. Jeon, "Improving Grbl: Cornering Algorithm", 2011 (the geometry only): the path
// is allowed to deviate by δ from the sharp corner, which stands for a circle of radius
// R = δ·sin(θ/2)/(1 − sin(θ/2)) tangent to both blocks, and the corner is taken at the
// centripetal limit v = √(a·R). θ is the angle between the reversed entry direction and the
// exit direction (cos θ = −u_in·u_out): 180° straight on, 0° a reversal.
// `a` is the acceleration limit along the unit vector (u_out − u_in), per-axis projected.

import { accelAlong } from './axis-limits';

const along = accelAlong;

/**
 * Junction speed in mm/s (not yet capped by the blocks' own limits); Infinity for a straight
 * continuation, 0 for a reversal or when δ is 0 at a real corner.
 */
export function junctionSpeed(
  inX: number, inY: number, inZ: number,
  outX: number, outY: number, outZ: number,
  accelX: number, accelY: number, accelZ: number,
  deviationMm: number,
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
  const radius = (deviationMm * sinHalf) / (1 - sinHalf);
  return Math.sqrt(a * radius);
}

/** The formula alone, for a given angle θ in radians and acceleration a: √(a·δ·s/(1 − s)), s = sin(θ/2). */
export function junctionSpeedForAngle(thetaRad: number, accelMmPerS2: number, deviationMm: number): number {
  const s = Math.sin(thetaRad / 2);
  if (s >= 1) return Infinity;
  return Math.sqrt((accelMmPerS2 * deviationMm * s) / (1 - s));
}
