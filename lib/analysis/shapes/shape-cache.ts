// Memo for the Clipper work on loops that repeat. A nested sheet cuts the same part many
// times over, and the kerf offsets and areas of a loop (with its holes and tool radii) do not
// change when the loop is only moved, so they are kept under a key of numbers: which shapes
// (loop-shapes.ts matches congruent loops point for point), where the holes sit relative to
// the part's origin, and the radii. The key is hashed, and a hit is compared in full, so a hit
// is always the same shape at another place (Clipper's answer there could differ only in its
// 1 µm rounding).
import type { Path } from '../geometry/polygons';

export interface ShapeKey {
  hash: number;
  /** the numbers that identify the shape, its origin left out */
  data: Float64Array;
  /** the grid point the key is relative to, in Clipper units */
  ox: number;
  oy: number;
}

/**
 * The one hash of the shape keys (FNV-1 style over whole numbers): of every `stride` numbers of
 * the key, the first `take`, each times `scale` and rounded. Loop shapes hash the vertex offsets
 * and radii of their key (take 3 of each edge's 6, scale 1: grid units already); part shapes
 * every number (radii in mm taken to the nm, scale 1e6). One loop in one call: a hash step
 * called per number from the key's own loop was not inlined and cost the analysis about 4%.
 */
export function hashKey(data: Float64Array, stride: number, take: number, scale: number): number {
  let h = 0x811c9dc5 ^ data.length;
  for (let i = 0; i < data.length; i += stride) {
    for (let j = i; j < i + take; j++) h = Math.imul(h ^ Math.round(data[j] * scale), 0x01000193);
  }
  return h & 0x3fffffff; // a small integer: Map keys stay on the fast path
}

export function translatePath(path: Path, dx: number, dy: number): Path {
  const out: Path = new Array(path.length);
  for (let i = 0; i < path.length; i++) out[i] = { x: path[i].x + dx, y: path[i].y + dy };
  return out;
}

/**
 * A key built for one lookup after another in one reused buffer: `data(size)` is a view of its
 * first `size` numbers (one view per size: a nest has few), `probe` the key object to fill and
 * look up, and `kept()` the copy to put() in a cache, made only for a key that is new.
 */
export class ScratchKey {
  private buf = new Float64Array(64);
  private readonly views = new Map<number, Float64Array>();
  readonly probe: ShapeKey = { hash: 0, data: this.buf, ox: 0, oy: 0 };

  data(size: number): Float64Array {
    if (this.buf.length < size) {
      this.buf = new Float64Array(2 * size);
      this.views.clear();
    }
    let view = this.views.get(size);
    if (!view) {
      view = this.buf.subarray(0, size);
      this.views.set(size, view);
    }
    return view;
  }

  /** the probe, filled */
  key(hash: number, data: Float64Array, ox: number, oy: number): ShapeKey {
    const k = this.probe;
    k.hash = hash; k.data = data; k.ox = ox; k.oy = oy;
    return k;
  }

  static kept(k: ShapeKey): ShapeKey {
    return { hash: k.hash, data: k.data.slice(), ox: k.ox, oy: k.oy };
  }
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

  /** the value stored under a key equal to `key`, or undefined (counted as a hit or a miss) */
  find(key: ShapeKey): T | undefined {
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
    return undefined;
  }

  /** stores value under key (after find() missed) and returns it */
  put(key: ShapeKey, value: T): T {
    const list = this.map.get(key.hash);
    if (list) list.push({ data: key.data, value });
    else this.map.set(key.hash, [{ data: key.data, value }]);
    return value;
  }
}
