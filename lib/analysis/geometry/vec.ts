// Small vector helpers for the hot loops. Math.hypot guards against overflow that millimetre
// coordinates never reach, and V8 does not inline it: in a loop over millions of edges it
// allocates a boxed number per call, where a square root of the sum does not.

/** length of (dx, dy) */
export function len2(dx: number, dy: number): number {
  return Math.sqrt(dx * dx + dy * dy);
}
