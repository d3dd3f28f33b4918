// Memo for the Clipper work on loops that repeat. A nested sheet cuts the same part many
// times over, and the kerf offsets and areas of a loop (with its holes and tool radii) do not
// change when the loop is only moved, so they are kept under a key made of the radii and the
// loops' integer vertices relative to the first loop's lowest-leftmost vertex. The key is
// hashed, and a hit is compared in full, so a hit is always the same shape (Clipper's answer
// for it at the new place could differ only in its 1 µm rounding); a copy whose vertices round
// differently only misses and is computed afresh.
import type { Path } from './geometry';

export interface ShapeKey {
  hash: number;
  /** radii, then per path its length and its vertices relative to the origin */
  data: Float64Array;
  /** the vertex the key is relative to, in Clipper units */
  ox: number;
  oy: number;
}

/** index of the path's lowest-leftmost vertex, where its key starts */
export function lowest(path: Path): number {
  let s = 0;
  for (let i = 1; i < path.length; i++) {
    const p = path[i], q = path[s];
    if (p.Y < q.Y || (p.Y === q.Y && p.X < q.X)) s = i;
  }
  return s;
}

/**
 * translation-invariant key of `paths` (the first one sets the origin) and the numbers in
 * `extra`; `starts` may give each path's lowest() when the caller keeps it
 */
export function shapeKey(paths: Path[], extra: number[], starts?: number[]): ShapeKey {
  const s0 = starts ? starts[0] : lowest(paths[0]);
  const ox = paths[0][s0].X, oy = paths[0][s0].Y;
  let size = extra.length;
  for (const p of paths) size += 1 + 2 * p.length;
  const data = new Float64Array(size);
  let o = 0;
  for (const v of extra) data[o++] = v;
  let h = 0x811c9dc5 ^ size;
  for (let k = 0; k < paths.length; k++) {
    // each path starts at its own lowest vertex, so where a loop was entered does not matter
    const path = paths[k];
    const n = path.length, start = k === 0 ? s0 : starts ? starts[k] : lowest(path);
    data[o++] = n;
    for (let j = start, c = 0; c < n; c++, j = j + 1 === n ? 0 : j + 1) {
      const p = path[j];
      const dx = p.X - ox, dy = p.Y - oy;
      data[o] = dx;
      data[o + 1] = dy;
      o += 2;
      h = Math.imul(h ^ dx, 0x01000193) ^ dy;
    }
  }
  for (const v of extra) h = Math.imul(h ^ Math.round(v * 1e6), 0x01000193);
  return { hash: h >>> 0, data, ox, oy };
}

export function translatePath(path: Path, dx: number, dy: number): Path {
  const out: Path = new Array(path.length);
  for (let i = 0; i < path.length; i++) out[i] = { X: path[i].X + dx, Y: path[i].Y + dy };
  return out;
}

function same(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

export class ShapeCache<T> {
  private readonly map = new Map<number, Array<{ data: Float64Array; value: T }>>();
  hits = 0;
  misses = 0;

  /** the cached value for `key`, or `compute()` stored under it */
  get(key: ShapeKey, compute: () => T): T {
    const list = this.map.get(key.hash);
    if (list) {
      for (const e of list) {
        if (same(e.data, key.data)) {
          this.hits++;
          return e.value;
        }
      }
    }
    this.misses++;
    const value = compute();
    if (list) list.push({ data: key.data, value });
    else this.map.set(key.hash, [{ data: key.data, value }]);
    return value;
  }
}
