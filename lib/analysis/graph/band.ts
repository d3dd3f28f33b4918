// Feeds the cut graph with the chords that matter for through cuts: pieces within the skin
// band above the sheet bottom, split exactly where a chord crosses the through level and the
// band's top, and the rises between two through cuts of one pass (tabs), which are held back
// until the tool comes down through again and dropped if it leaves the stock first.
import type { CutGraph } from './cut-graph';
import { grownF64 } from '../typed-arrays';

export class BandCollector {
  private armed = false;
  /** the held-back rises, 8 numbers each (x0 y0 z0 x1 y1 z1 move tool), and how many numbers */
  private pending = new Float64Array(64);
  private pendingCount = 0;
  /** [0]: their XY length so far (in an array: a double field is boxed on some stores) */
  private readonly pendingLen = new Float64Array(1);
  /** the chord for segment(): x0 y0 z0 x1 y1 z1 (numbers through an array, not boxed arguments) */
  readonly io = new Float64Array(6);
  /** the flat arc for arc(), laid out as CutGraph.arcIo (it is that array) */
  readonly arcIo: Float64Array;
  private readonly out: Float64Array;

  constructor(
    private readonly graph: CutGraph,
    private readonly throughZ: number,
    private readonly bandTopZ: number,
    private readonly stockTopZ: number,
    private readonly tabMaxLengthMm: number,
  ) {
    this.arcIo = graph.arcIo;
    this.out = graph.pieceIo;
  }

  /** a through cut was made and the tool has not left the stock since: rises may be tabs */
  get isArmed(): boolean {
    return this.armed;
  }

  breakRun(): void {
    this.armed = false;
    this.pendingCount = 0;
    this.pendingLen[0] = 0;
  }

  /** the chord in io */
  segment(move: number, tool: number): void {
    const io = this.io;
    const x0 = io[0], y0 = io[1], z0 = io[2], x1 = io[3], y1 = io[4], z1 = io[5];
    const zLo = z0 < z1 ? z0 : z1;
    if (!this.armed && zLo > this.bandTopZ) return;
    // (the crossing parameters written out: as a call, each would return a boxed double)
    const zT = this.throughZ, zB = this.bandTopZ;
    let tT = -1, tB = -1;
    if ((z0 - zT) * (z1 - zT) < 0) {
      const t = (zT - z0) / (z1 - z0);
      if (t > 1e-9 && t < 1 - 1e-9) tT = t;
    }
    if ((z0 - zB) * (z1 - zB) < 0) {
      const t = (zB - z0) / (z1 - z0);
      if (t > 1e-9 && t < 1 - 1e-9) tB = t;
    }
    const out = this.out;
    if (tT < 0 && tB < 0) {
      out[0] = x0; out[1] = y0; out[2] = z0; out[3] = x1; out[4] = y1; out[5] = z1;
      this.piece(move, tool);
      return;
    }
    let ta = tT, tb = tB;
    if (ta < 0 || (tb >= 0 && tb < ta)) { const t = ta; ta = tb; tb = t; }
    // pieces [0, ta], [ta, tb], [tb, 1] (tb may be absent)
    const dx = x1 - x0, dy = y1 - y0, dz = z1 - z0;
    const xa = x0 + dx * ta, ya = y0 + dy * ta, za = z0 + dz * ta;
    out[0] = x0; out[1] = y0; out[2] = z0; out[3] = xa; out[4] = ya; out[5] = za;
    this.piece(move, tool);
    if (tb < 0) {
      out[0] = xa; out[1] = ya; out[2] = za; out[3] = x1; out[4] = y1; out[5] = z1;
      this.piece(move, tool);
      return;
    }
    const xb = x0 + dx * tb, yb = y0 + dy * tb, zb = z0 + dz * tb;
    out[0] = xa; out[1] = ya; out[2] = za; out[3] = xb; out[4] = yb; out[5] = zb;
    this.piece(move, tool);
    out[0] = xb; out[1] = yb; out[2] = zb; out[3] = x1; out[4] = y1; out[5] = z1;
    this.piece(move, tool);
  }

  /** the flat XY arc in arcIo, at a height z within the band (z ≤ band top) */
  arc(move: number, tool: number): void {
    if (this.arcIo[4] <= this.throughZ) {
      this.flush();
      this.armed = true;
    }
    this.graph.arc(move, tool);
  }

  /** the piece in the graph's pieceIo, wholly on one side of the through and band levels */
  private piece(move: number, tool: number): void {
    const p = this.out;
    const zm = (p[2] + p[5]) * 0.5;
    if (zm <= this.bandTopZ) {
      if (zm <= this.throughZ) {
        // flush() writes its pieces through the same array: keep this one aside meanwhile
        if (this.pendingCount > 0) {
          const x0 = p[0], y0 = p[1], z0 = p[2], x1 = p[3], y1 = p[4], z1 = p[5];
          this.flush();
          p[0] = x0; p[1] = y0; p[2] = z0; p[3] = x1; p[4] = y1; p[5] = z1;
        } else {
          this.pendingLen[0] = 0;
        }
        this.armed = true;
      }
      this.graph.piece(move, tool);
      return;
    }
    if (!this.armed) return;
    if (zm >= this.stockTopZ) {
      this.breakRun();
      return;
    }
    const dx = p[3] - p[0], dy = p[4] - p[1];
    this.pendingLen[0] += Math.sqrt(dx * dx + dy * dy);
    if (this.pendingLen[0] > this.tabMaxLengthMm) {
      this.breakRun();
      return;
    }
    if (this.pendingCount + 8 > this.pending.length) this.pending = grownF64(this.pending, 2 * this.pending.length);
    const q = this.pending, at = this.pendingCount;
    q[at] = p[0]; q[at + 1] = p[1]; q[at + 2] = p[2]; q[at + 3] = p[3]; q[at + 4] = p[4]; q[at + 5] = p[5];
    q[at + 6] = move; q[at + 7] = tool;
    this.pendingCount = at + 8;
  }

  private flush(): void {
    const p = this.pending, n = this.pendingCount;
    const out = this.out;
    for (let i = 0; i < n; i += 8) {
      out[0] = p[i]; out[1] = p[i + 1]; out[2] = p[i + 2]; out[3] = p[i + 3]; out[4] = p[i + 4]; out[5] = p[i + 5];
      this.graph.piece(p[i + 6] | 0, p[i + 7] | 0);
    }
    this.pendingCount = 0;
    this.pendingLen[0] = 0;
  }
}
