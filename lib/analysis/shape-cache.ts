// Memo for the Clipper work on loops that repeat. A nested sheet cuts the same part many
// times over, and the kerf offsets and areas of a loop (with its holes and tool radii) do not
// change when the loop is only moved, so they are kept under a key made of the radii and the
// loops' integer vertices relative to the first loop's lowest-leftmost vertex. The key is
// hashed, and a hit is compared in full, so a hit is always the same shape (Clipper's answer
// for it at the new place could differ only in its 1 µm rounding); a copy whose vertices round
// differently only misses and is computed afresh.
import type { Path, Ring } from './geometry';

export interface ShapeKey {
  hash: number;
  /** radii, then per path its length and its vertices relative to the origin */
  data: Float64Array;
  /** the vertex the key is relative to, in Clipper units */
  ox: number;
  oy: number;
}

/** index of the ring's lowest-leftmost vertex, where its key starts */
export function lowest(ring: Ring): number {
  const { x, y } = ring;
  let s = 0;
  for (let i = 1; i < x.length; i++) {
    if (y[i] < y[s] || (y[i] === y[s] && x[i] < x[s])) s = i;
  }
  return s;
}

/**
 * translation-invariant key of `rings` (the first one sets the origin) and the numbers in
 * `extra`; `starts` may give each ring's lowest() when the caller keeps it
 */
export function shapeKey(rings: Ring[], extra: number[], starts?: number[]): ShapeKey {
  const s0 = starts ? starts[0] : lowest(rings[0]);
  const ox = rings[0].x[s0], oy = rings[0].y[s0];
  let size = extra.length;
  for (const r of rings) size += 1 + 2 * r.x.length;
  const data = new Float64Array(size);
  let o = 0;
  for (const v of extra) data[o++] = v;
  let h = 0x811c9dc5 ^ size;
  for (let k = 0; k < rings.length; k++) {
    // each ring starts at its own lowest vertex, so where a loop was entered does not matter
    const ring = rings[k];
    const xs = ring.x, ys = ring.y;
    const n = xs.length, start = k === 0 ? s0 : starts ? starts[k] : lowest(ring);
    data[o++] = n;
    for (let j = start, c = 0; c < n; c++, j = j + 1 === n ? 0 : j + 1) {
      const dx = xs[j] - ox, dy = ys[j] - oy;
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
