// Maps a time on the estimated clock to the move running at that time, for playback and
// scrubbing: binary search over the non-decreasing cumulative end times of the moves.

/**
 * Index of the first move whose end time is ≥ t: the move running at t (at a boundary, the
 * move that ends there). 0 for t ≤ the first end time, the last move for t beyond the end,
 * -1 for an empty list.
 */
export function moveAtTime(cumulativeS: Float64Array, t: number): number {
  const n = cumulativeS.length;
  if (n === 0) return -1;
  let lo = 0;
  let hi = n - 1;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (cumulativeS[mid] >= t) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}
