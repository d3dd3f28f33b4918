// The numbers of the cut graph's arc edges, apart from its per-edge columns: about a third of
// a nest's edges are arcs, and five columns of doubles over every edge would be mostly zeros
// (12 MB more memory on the generated 1,000,000-line nest). An edge's slot is CutGraph.eArc[e];
// slot 0 belongs to every straight edge and stays all zeros, so `r[slot] > 0` tells an arc.
import { grownF64 } from '../typed-arrays';

export class EdgeArcs {
  /** centre */
  cx: Float64Array;
  cy: Float64Array;
  /** radius, 0 in slot 0 */
  r: Float64Array;
  /** angle at the edge's end u, and the signed sweep from u to v */
  au: Float64Array;
  sweep: Float64Array;
  private count = 1;

  /** capacity: about how many arc edges to expect */
  constructor(capacity: number) {
    const n = Math.max(64, capacity + 1);
    this.cx = new Float64Array(n); this.cy = new Float64Array(n); this.r = new Float64Array(n);
    this.au = new Float64Array(n); this.sweep = new Float64Array(n);
  }

  /** a new slot, for the caller to fill */
  slot(): number {
    const k = this.count++;
    if (k === this.r.length) {
      const n = 2 * k;
      this.cx = grownF64(this.cx, n); this.cy = grownF64(this.cy, n); this.r = grownF64(this.r, n);
      this.au = grownF64(this.au, n); this.sweep = grownF64(this.sweep, n);
    }
    return k;
  }
}
