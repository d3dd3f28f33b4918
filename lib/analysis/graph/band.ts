// Feeds the cut graph with the chords that matter for through cuts: pieces within the skin
// band above the sheet bottom, split exactly where a chord crosses the through level and the
// band's top, and the rises between two through cuts of one pass (tabs), which are held back
// until the tool comes down through again and dropped if it leaves the stock first.
import { ArcSlot, PieceSlot, type CutGraph } from './cut-graph';
import { grownF64 } from '../typed-arrays';

// slot copies (an imported binding is read through an accessor on every use)
const X0 = PieceSlot.x0, Y0 = PieceSlot.y0, Z0 = PieceSlot.z0, X1 = PieceSlot.x1, Y1 = PieceSlot.y1, Z1 = PieceSlot.z1;
const ARC_Z = ArcSlot.z;
/** a held-back rise in `pending`: its piece in PieceSlot order, then its move and tool */
const R_MOVE = PieceSlot.size, R_TOOL = PieceSlot.size + 1, RISE = PieceSlot.size + 2;

export class BandCollector {
  private armed = false;
  /** the held-back rises, RISE numbers each (the piece, its move and tool), and how many numbers */
  private pending = new Float64Array(64);
  private pendingCount = 0;
  /** [0]: their XY length so far (in an array: a double field is boxed on some stores) */
  private readonly pendingLen = new Float64Array(1);
  /** the chord for segment(), in the slots of PieceSlot (numbers through an array, not boxed arguments) */
  readonly io = new Float64Array(PieceSlot.size);
  /** the flat arc for arc(), in the slots of ArcSlot (the graph reads it from here) */
  readonly arcIo = new Float64Array(ArcSlot.size);
  /** the piece of the chord that segment() split off, in the slots of PieceSlot (the graph reads it from here) */
  private readonly cut = new Float64Array(PieceSlot.size);

  constructor(
    private readonly graph: CutGraph,
    private readonly throughZ: number,
    private readonly bandTopZ: number,
    private readonly stockTopZ: number,
    private readonly tabMaxLengthMm: number,
  ) {
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
    const x0 = io[X0], y0 = io[Y0], z0 = io[Z0], x1 = io[X1], y1 = io[Y1], z1 = io[Z1];
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
    const out = this.cut;
    if (tT < 0 && tB < 0) {
      out[X0] = x0; out[Y0] = y0; out[Z0] = z0; out[X1] = x1; out[Y1] = y1; out[Z1] = z1;
      this.piece(move, tool);
      return;
    }
    let ta = tT, tb = tB;
    if (ta < 0 || (tb >= 0 && tb < ta)) { const t = ta; ta = tb; tb = t; }
    // pieces [0, ta], [ta, tb], [tb, 1] (tb may be absent)
    const dx = x1 - x0, dy = y1 - y0, dz = z1 - z0;
    const xa = x0 + dx * ta, ya = y0 + dy * ta, za = z0 + dz * ta;
    out[X0] = x0; out[Y0] = y0; out[Z0] = z0; out[X1] = xa; out[Y1] = ya; out[Z1] = za;
    this.piece(move, tool);
    if (tb < 0) {
      out[X0] = xa; out[Y0] = ya; out[Z0] = za; out[X1] = x1; out[Y1] = y1; out[Z1] = z1;
      this.piece(move, tool);
      return;
    }
    const xb = x0 + dx * tb, yb = y0 + dy * tb, zb = z0 + dz * tb;
    out[X0] = xa; out[Y0] = ya; out[Z0] = za; out[X1] = xb; out[Y1] = yb; out[Z1] = zb;
    this.piece(move, tool);
    out[X0] = xb; out[Y0] = yb; out[Z0] = zb; out[X1] = x1; out[Y1] = y1; out[Z1] = z1;
    this.piece(move, tool);
  }

  /** the flat XY arc in arcIo, at a height z within the band (z ≤ band top) */
  arc(move: number, tool: number): void {
    if (this.arcIo[ARC_Z] <= this.throughZ) {
      this.flush();
      this.armed = true;
    }
    this.graph.arc(this.arcIo, move, tool);
  }

  /** the piece in `cut`, wholly on one side of the through and band levels */
  private piece(move: number, tool: number): void {
    const p = this.cut;
    const zm = (p[Z0] + p[Z1]) * 0.5;
    if (zm <= this.bandTopZ) {
      if (zm <= this.throughZ) {
        // down through again: the rises held back since the last through cut were tabs
        if (this.pendingCount > 0) this.flush();
        else this.pendingLen[0] = 0;
        this.armed = true;
      }
      this.graph.piece(p, 0, move, tool);
      return;
    }
    if (!this.armed) return;
    if (zm >= this.stockTopZ) {
      this.breakRun();
      return;
    }
    const dx = p[X1] - p[X0], dy = p[Y1] - p[Y0];
    this.pendingLen[0] += Math.sqrt(dx * dx + dy * dy);
    if (this.pendingLen[0] > this.tabMaxLengthMm) {
      this.breakRun();
      return;
    }
    if (this.pendingCount + RISE > this.pending.length) this.pending = grownF64(this.pending, 2 * this.pending.length);
    const q = this.pending, at = this.pendingCount;
    q[at + X0] = p[X0]; q[at + Y0] = p[Y0]; q[at + Z0] = p[Z0]; q[at + X1] = p[X1]; q[at + Y1] = p[Y1]; q[at + Z1] = p[Z1];
    q[at + R_MOVE] = move; q[at + R_TOOL] = tool;
    this.pendingCount = at + RISE;
  }

  /** the held-back rises into the graph, in the order they were cut */
  private flush(): void {
    const p = this.pending, n = this.pendingCount;
    for (let i = 0; i < n; i += RISE) this.graph.piece(p, i, p[i + R_MOVE] | 0, p[i + R_TOOL] | 0);
    this.pendingCount = 0;
    this.pendingLen[0] = 0;
  }
}
