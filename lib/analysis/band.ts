// Feeds the cut graph with the chords that matter for through cuts: pieces within the skin
// band above the sheet bottom, split exactly where a chord crosses the through level and the
// band's top, and the rises between two through cuts of one pass (tabs), which are held back
// until the tool comes down through again and dropped if it leaves the stock first.
import type { CutGraph } from './cut-graph';
import { len2 } from './vec';

export class BandCollector {
  private armed = false;
  private pending: number[] = [];
  private pendingLenMm = 0;

  constructor(
    private readonly graph: CutGraph,
    private readonly throughZ: number,
    private readonly bandTopZ: number,
    private readonly stockTopZ: number,
    private readonly tabMaxLengthMm: number,
  ) {}

  /** a through cut was made and the tool has not left the stock since: rises may be tabs */
  get isArmed(): boolean {
    return this.armed;
  }

  breakRun(): void {
    this.armed = false;
    if (this.pending.length > 0) this.pending.length = 0;
    this.pendingLenMm = 0;
  }

  segment(x0: number, y0: number, z0: number, x1: number, y1: number, z1: number, move: number, tool: number): void {
    const zLo = z0 < z1 ? z0 : z1;
    if (!this.armed && zLo > this.bandTopZ) return;
    const tT = crossing(z0, z1, this.throughZ);
    const tB = crossing(z0, z1, this.bandTopZ);
    if (tT < 0 && tB < 0) {
      this.piece(x0, y0, z0, x1, y1, z1, move, tool);
      return;
    }
    let ta = tT, tb = tB;
    if (ta < 0 || (tb >= 0 && tb < ta)) { const t = ta; ta = tb; tb = t; }
    // pieces [0, ta], [ta, tb], [tb, 1] (tb may be absent)
    const dx = x1 - x0, dy = y1 - y0, dz = z1 - z0;
    const xa = x0 + dx * ta, ya = y0 + dy * ta, za = z0 + dz * ta;
    this.piece(x0, y0, z0, xa, ya, za, move, tool);
    if (tb < 0) {
      this.piece(xa, ya, za, x1, y1, z1, move, tool);
      return;
    }
    const xb = x0 + dx * tb, yb = y0 + dy * tb, zb = z0 + dz * tb;
    this.piece(xa, ya, za, xb, yb, zb, move, tool);
    this.piece(xb, yb, zb, x1, y1, z1, move, tool);
  }

  /** a flat XY arc at height z within the band (z ≤ band top) */
  arc(x0: number, y0: number, x1: number, y1: number, z: number, cx: number, cy: number, r: number, a0: number, sweep: number, move: number, tool: number): void {
    if (z <= this.throughZ) {
      this.flush();
      this.armed = true;
    }
    this.graph.addArc(x0, y0, x1, y1, z, cx, cy, r, a0, sweep, move, tool);
  }

  private piece(x0: number, y0: number, z0: number, x1: number, y1: number, z1: number, move: number, tool: number): void {
    const zm = (z0 + z1) * 0.5;
    if (zm <= this.bandTopZ) {
      if (zm <= this.throughZ) {
        this.flush();
        this.armed = true;
      }
      this.graph.addPiece(x0, y0, z0, x1, y1, z1, move, tool);
      return;
    }
    if (!this.armed) return;
    if (zm >= this.stockTopZ) {
      this.breakRun();
      return;
    }
    this.pendingLenMm += len2(x1 - x0, y1 - y0);
    if (this.pendingLenMm > this.tabMaxLengthMm) {
      this.breakRun();
      return;
    }
    this.pending.push(x0, y0, z0, x1, y1, z1, move, tool);
  }

  private flush(): void {
    const p = this.pending;
    for (let i = 0; i < p.length; i += 8) this.graph.addPiece(p[i], p[i + 1], p[i + 2], p[i + 3], p[i + 4], p[i + 5], p[i + 6], p[i + 7]);
    p.length = 0;
    this.pendingLenMm = 0;
  }
}

/** parameter in (0, 1) where the chord crosses level z, or −1 */
function crossing(z0: number, z1: number, z: number): number {
  if ((z0 - z) * (z1 - z) >= 0) return -1;
  const t = (z - z0) / (z1 - z0);
  return t > 1e-9 && t < 1 - 1e-9 ? t : -1;
}
