// Playback on the planner's clock: the move running at a time (lib/kinematics moveAtTime), where
// the tool is within it, the draw ranges that split the path already cut from the path to come
// (vertex ranges of the one line strip, so playback never rebuilds geometry), and the
// move a source line starts. Pure, unit-tested.
import { arcIndexOfMove, arcPoint, type MoveList, type Xyz } from '@/lib/gcode';
import { moveAtTime } from '@/lib/kinematics/move-at-time';

export { moveAtTime };

/** the clock at the start of move i */
export function moveStartS(cumulativeS: Float64Array, i: number): number {
  return i <= 0 ? 0 : cumulativeS[i - 1];
}

/** share of move i done at time t, 0–1 (1 for a move that takes no time) */
export function fractionAt(cumulativeS: Float64Array, i: number, t: number): number {
  const start = moveStartS(cumulativeS, i);
  const end = cumulativeS[i];
  if (!(end > start)) return 1;
  return Math.min(1, Math.max(0, (t - start) / (end - start)));
}

/**
 * Segments to draw as already cut when move i is a share f done: every segment of the moves
 * before it and the whole segments of move i that f covers (a partly cut chord counts once done).
 */
export function doneSegmentCount(moveSegStart: Uint32Array, i: number, f: number): number {
  if (i < 0) return 0;
  const from = moveSegStart[i];
  const segs = moveSegStart[i + 1] - from;
  return from + Math.floor(segs * Math.min(1, Math.max(0, f)) + 1e-9);
}

/**
 * The two draw ranges of the strip (segment s runs from vertex s to s + 1) for `done` segments
 * done out of `total`: the path already cut, vertices 0…done, and the path to come, vertices
 * done…total; a range of fewer than two vertices draws nothing, so it is given as empty.
 */
export function stripRanges(done: number, total: number): { done: [number, number]; ahead: [number, number] } {
  const d = Math.min(Math.max(0, done), total);
  return { done: [0, d > 0 ? d + 1 : 0], ahead: d < total ? [d, total - d + 1] : [0, 0] };
}

/** the tool's position at share f of move i: along the chord for a straight move, on the arc for an arc */
export function toolPositionAt(moves: MoveList, i: number, f: number, out: Xyz): Xyz {
  if (i < 0 || moves.count === 0) {
    out.x = moves.startX;
    out.y = moves.startY;
    out.z = moves.startZ;
    return out;
  }
  const sx = i > 0 ? moves.x[i - 1] : moves.startX;
  const sy = i > 0 ? moves.y[i - 1] : moves.startY;
  const sz = i > 0 ? moves.z[i - 1] : moves.startZ;
  if (moves.kind[i] === 2) return arcPoint(moves, arcIndexOfMove(moves, i), f, out);
  if (moves.kind[i] > 2) f = 1;
  out.x = sx + (moves.x[i] - sx) * f;
  out.y = sy + (moves.y[i] - sy) * f;
  out.z = sz + (moves.z[i] - sz) * f;
  return out;
}

/** the first move at or after a source line (lines are non-decreasing along the move list); −1 when none */
export function moveAtLine(lines: Uint32Array, line: number): number {
  let lo = 0;
  let hi = lines.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (lines[mid] < line) lo = mid + 1;
    else hi = mid;
  }
  return lo < lines.length ? lo : lines.length - 1;
}
