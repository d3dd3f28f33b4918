// The graph of cuts near the sheet bottom, in XY. Every feed or arc chord that reaches within
// the skin band of the bottom (and every tab rise between two through cuts) becomes an edge
// between end points snapped to the chain tolerance; passes that retrace the same path land
// on the same edge, which keeps the deepest cut and the first move that cut it through.
// Each vertex keeps a list of the edges at it (a head per vertex, a next link per edge end), so
// finding whether a retracing pass lands on an existing edge walks the two or three edges at
// one end instead of hashing every edge: only the snapped points need the hash table.
// Closed loops are then read off this graph (faces.ts), whichever pass made them. A flat arc
// stays an arc: it becomes sub-arcs of at most 45° (few edges, exact chords made only for the
// loops found), and tabs, ramps and helices become straight chords.
import { vertexDegrees, vertexEdges } from './adjacency';
import { EdgeArcs } from './edge-arcs';
import { KeyTable } from './key-table';
import { len2 } from '../geometry/vec';
import { grownF64, grownI32 } from '../typed-arrays';

const KEY_OFFSET = 2 ** 24;
const KEY_LIMIT = KEY_OFFSET - 1;
/**
 * The layout of a straight piece for CutGraph.piece(): its start and end, mm. The caller keeps
 * the numbers of a piece or an arc in a buffer of its own and the graph reads them from there,
 * rather than as arguments, which a call that is not inlined boxes one by one.
 */
export const PieceSlot = { x0: 0, y0: 1, z0: 2, x1: 3, y1: 4, z1: 5, size: 6 } as const;
/**
 * The layout of a flat XY arc for CutGraph.arc(): from (x0, y0) to (x1, y1) at height
 * z, mm, about the centre (cx, cy) with radius r, mm, from the start angle a0 through the signed
 * sweep, rad (positive counter-clockwise); it ends exactly at (x1, y1).
 */
export const ArcSlot = { x0: 0, y0: 1, x1: 2, y1: 3, z: 4, cx: 5, cy: 6, r: 7, a0: 8, sweep: 9, size: 10 } as const;
const P_X0 = PieceSlot.x0, P_Z0 = PieceSlot.z0, P_X1 = PieceSlot.x1, P_Z1 = PieceSlot.z1;
const A_X0 = ArcSlot.x0, A_X1 = ArcSlot.x1, A_Z = ArcSlot.z, A_CX = ArcSlot.cx, A_CY = ArcSlot.cy, A_R = ArcSlot.r, A_A0 = ArcSlot.a0, A_SWEEP = ArcSlot.sweep;

/** the largest sweep of one arc edge in the graph (a longer flat arc is split) */
export const SUB_ARC_RAD = Math.PI / 4;

export class CutGraph {
  // typed arrays with spare room (grown by doubling): read them below edgeCount / vertexCount;
  // sized from the capacity hint so a large program does not copy them over and over
  vx: Float64Array;
  vy: Float64Array;
  eu: Int32Array;
  ev: Int32Array;
  /** lowest Z any pass cut this edge at */
  eZMin: Float64Array;
  /** highest Z of the pass that cut it lowest (the top of a tab) */
  eZTop: Float64Array;
  /** move index that first cut the edge within the band */
  eFirstNear: Int32Array;
  /** move index that first cut the edge through, −1 while never */
  eFirstThrough: Int32Array;
  eTool: Int32Array;
  /** each edge's slot in `arcs`: 0 for a straight edge, k > 0 for an arc edge */
  eArc: Int32Array;
  readonly arcs: EdgeArcs;
  /** first edge end at each vertex (2e for end u of edge e, 2e + 1 for end v), −1 for none */
  private vHead: Int32Array;
  /** the next edge end at the same vertex, −1 at the list's end */
  private hNext: Int32Array;
  private eCount = 0;
  private vCount = 0;
  private readonly vertexByKey: KeyTable;
  private readonly invQ: number;

  /**
   * capacityHint: about how many points (and edges) to expect, arcHint how many arc edges, so
   * the tables rarely need to grow
   */
  constructor(
    chainToleranceMm: number,
    private readonly throughZ: number,
    capacityHint = 1 << 14,
    arcHint = capacityHint >> 2,
  ) {
    this.invQ = 1 / chainToleranceMm;
    const n = Math.max(256, capacityHint);
    this.vx = new Float64Array(n); this.vy = new Float64Array(n);
    this.eu = new Int32Array(n); this.ev = new Int32Array(n);
    this.eZMin = new Float64Array(n); this.eZTop = new Float64Array(n);
    this.eFirstNear = new Int32Array(n); this.eFirstThrough = new Int32Array(n); this.eTool = new Int32Array(n);
    this.eArc = new Int32Array(n);
    this.arcs = new EdgeArcs(arcHint);
    this.vHead = new Int32Array(n); this.hNext = new Int32Array(2 * n);
    this.vertexByKey = new KeyTable(capacityHint);
  }

  get edgeCount(): number { return this.eCount; }
  get vertexCount(): number { return this.vCount; }

  private growVertices(): void {
    const n = this.vx.length * 2;
    this.vx = grownF64(this.vx, n);
    this.vy = grownF64(this.vy, n);
    this.vHead = grownI32(this.vHead, n);
  }

  private growEdges(): void {
    const n = this.eu.length * 2;
    this.eu = grownI32(this.eu, n); this.ev = grownI32(this.ev, n);
    this.eZMin = grownF64(this.eZMin, n); this.eZTop = grownF64(this.eZTop, n);
    this.eFirstNear = grownI32(this.eFirstNear, n); this.eFirstThrough = grownI32(this.eFirstThrough, n); this.eTool = grownI32(this.eTool, n);
    this.eArc = grownI32(this.eArc, n);
    this.hNext = grownI32(this.hNext, 2 * n);
  }

  /** the live edge u–v, an arc edge or a straight one as asked, or −1 */
  private findEdge(u: number, v: number, arc: boolean): number {
    const eu = this.eu, ev = this.ev, eArc = this.eArc, r = this.arcs.r, next = this.hNext;
    for (let h = this.vHead[u]; h >= 0; h = next[h]) {
      const e = h >> 1;
      const a = eu[e];
      if (a < 0) continue; // replaced by zipOverlaps
      if ((h & 1 ? a : ev[e]) === v && r[eArc[e]] > 0 === arc) return e;
    }
    return -1;
  }

  private link(e: number): void {
    const u = this.eu[e], v = this.ev[e];
    this.hNext[2 * e] = this.vHead[u];
    this.vHead[u] = 2 * e;
    this.hNext[2 * e + 1] = this.vHead[v];
    this.vHead[v] = 2 * e + 1;
  }

  /** the last point snapped (x, y) and its id: consecutive pieces share an end point */
  private readonly last = new Float64Array([NaN, NaN]);
  private lastId = -1;
  /** the lowest and highest Z of the cut being recorded (for newEdge and record) */
  private readonly zr = new Float64Array(2);
  /** scratch for a point of a sub-arc */
  private readonly pt = new Float64Array(2);

  /** the vertex at the point (io[at], io[at + 1]) (x then y), snapped to the chain tolerance */
  private vertex(io: Float64Array, at: number): number {
    const x = io[at], y = io[at + 1];
    const last = this.last;
    // consecutive pieces share an end point: skip the hash for it
    if (x === last[0] && y === last[1]) return this.lastId;
    let qx = Math.round(x * this.invQ), qy = Math.round(y * this.invQ);
    qx = qx > KEY_LIMIT ? KEY_LIMIT : qx < -KEY_LIMIT ? -KEY_LIMIT : qx;
    qy = qy > KEY_LIMIT ? KEY_LIMIT : qy < -KEY_LIMIT ? -KEY_LIMIT : qy;
    let id = this.vertexByKey.getOrSet(qx + KEY_OFFSET, qy + KEY_OFFSET, this.vCount);
    if (id < 0) {
      id = this.vCount++;
      if (id === this.vx.length) this.growVertices();
      this.vx[id] = x;
      this.vy[id] = y;
      this.vHead[id] = -1;
    }
    last[0] = x;
    last[1] = y;
    this.lastId = id;
    return id;
  }

  /**
   * the straight piece at p[at …] (PieceSlot layout), lying wholly on one side of the through
   * and band levels, cut by `move` with `tool`
   */
  piece(p: Float64Array, at: number, move: number, tool: number): void {
    const a = this.vertex(p, at + P_X0);
    const b = this.vertex(p, at + P_X1);
    if (a === b) return;
    const z0 = p[at + P_Z0], z1 = p[at + P_Z1];
    const u = a < b ? a : b;
    const v = a < b ? b : a;
    const zr = this.zr;
    zr[0] = z0 < z1 ? z0 : z1;
    zr[1] = z0 < z1 ? z1 : z0;
    const through = (z0 + z1) * 0.5 <= this.throughZ;
    const e = this.findEdge(u, v, false);
    if (e < 0) {
      this.newEdge(u, v, move, through ? move : -1, tool);
      return;
    }
    this.record(e, move, through, tool);
  }

  /** the flat XY arc in io (ArcSlot layout), added as sub-arcs of at most SUB_ARC_RAD (45°) */
  arc(io: Float64Array, move: number, tool: number): void {
    const z = io[A_Z], cx = io[A_CX], cy = io[A_CY], r = io[A_R], a0 = io[A_A0], sweep = io[A_SWEEP];
    const n = Math.max(1, Math.ceil(Math.abs(sweep) / SUB_ARC_RAD - 1e-9));
    const through = z <= this.throughZ;
    const pt = this.pt;
    const zr = this.zr;
    let a = this.vertex(io, A_X0);
    for (let k = 1; k <= n; k++) {
      let b: number;
      if (k === n) b = this.vertex(io, A_X1);
      else {
        pt[0] = cx + r * Math.cos(a0 + (sweep * k) / n);
        pt[1] = cy + r * Math.sin(a0 + (sweep * k) / n);
        b = this.vertex(pt, 0);
      }
      if (a !== b) {
        const u = a < b ? a : b;
        const v = a < b ? b : a;
        const e = this.findEdge(u, v, true);
        zr[0] = z;
        zr[1] = z;
        if (e < 0) {
          const id = this.newEdge(u, v, move, through ? move : -1, tool);
          const startAngle = a0 + (sweep * (k - 1)) / n;
          const step = sweep / n;
          if (r > 0) {
            // (a zero radius stays a straight edge, as the arc tests read it)
            const t = this.arcs, slot = t.slot();
            this.eArc[id] = slot;
            t.cx[slot] = cx;
            t.cy[slot] = cy;
            t.r[slot] = r;
            t.au[slot] = a === u ? startAngle : startAngle + step;
            t.sweep[slot] = a === u ? step : -step;
          }
        } else {
          this.record(e, move, through, tool);
        }
      }
      a = b;
    }
  }

  /** a new edge u–v cut from zr[0] up to zr[1] */
  private newEdge(u: number, v: number, near: number, through: number, tool: number): number {
    const id = this.eCount++;
    if (id === this.eu.length) this.growEdges();
    this.eu[id] = u;
    this.ev[id] = v;
    this.eZMin[id] = this.zr[0];
    this.eZTop[id] = this.zr[1];
    this.eFirstNear[id] = near;
    this.eFirstThrough[id] = through;
    this.eTool[id] = tool;
    // eArc is 0 already (a straight edge): slots past the edge count stay zero, as the array is
    // made and grown zeroed and compact() clears what it frees
    this.link(id);
    return id;
  }

  /** another cut of edge e, from zr[0] up to zr[1] */
  private record(e: number, move: number, through: boolean, tool: number): void {
    const zLo = this.zr[0], zHi = this.zr[1];
    if (zLo < this.eZMin[e]) {
      this.eZMin[e] = zLo;
      this.eZTop[e] = zHi;
      this.eTool[e] = tool;
    }
    if (through && this.eFirstThrough[e] < 0) {
      this.eFirstThrough[e] = move;
      this.eTool[e] = tool;
    }
  }

  /**
   * Joins passes that retrace one path with different subdivisions (a lap at one depth, the
   * next lap broken for tabs or entered by a ramp): where two edges leave a vertex in the same
   * direction and the shorter one's far end lies on the longer, the longer is split there, and
   * the split carries on from that point ("zipping" the two chains together). Only vertices
   * where edges meet three or more at a time can start this, so the work follows the overlaps.
   */
  zipOverlaps(): void {
    const V = this.vCount;
    const E = this.eCount;
    if (E === 0) return;
    const deg = vertexDegrees(this.eu, this.ev, V, E);
    // no vertex where three edges meet: no pass overlaps another, and the graph stays as it is
    let branchPoints = false;
    for (let v = 0; v < V && !branchPoints; v++) if (deg[v] >= 3) branchPoints = true;
    if (!branchPoints) return;
    const { start, adj: csr } = vertexEdges(this.eu, this.ev, deg, V, E);
    const overlay = new Map<number, number[]>();
    const adjacency = (v: number): number[] => {
      let list = overlay.get(v);
      if (!list) {
        list = [];
        for (let k = start[v]; k < start[v + 1]; k++) list.push(csr[k]);
        overlay.set(v, list);
      }
      return list;
    };
    const tol = 1 / this.invQ;
    const queue: number[] = [];
    for (let v = 0; v < V; v++) if (deg[v] >= 3) queue.push(v);
    let budget = 4 * E + 1000;
    let split = false;
    while (queue.length > 0 && budget-- > 0) {
      const a = queue.pop()!;
      const list = adjacency(a).filter((e) => this.eu[e] >= 0);
      overlay.set(a, list);
      if (list.length < 2) continue;
      const ax = this.vx[a], ay = this.vy[a];
      let found = false;
      for (let i = 0; i < list.length && !found; i++) {
        const e1 = list[i];
        if (this.eArc[e1] > 0) continue; // arcs are never split: their chords are not the cut
        const p = this.eu[e1] === a ? this.ev[e1] : this.eu[e1];
        const px = this.vx[p] - ax, py = this.vy[p] - ay;
        const lp2 = px * px + py * py;
        for (let j = 0; j < list.length; j++) {
          if (j === i) continue;
          const e2 = list[j];
          if (this.eArc[e2] > 0) continue;
          const q = this.eu[e2] === a ? this.ev[e2] : this.eu[e2];
          const qx = this.vx[q] - ax, qy = this.vy[q] - ay;
          const lq2 = qx * qx + qy * qy;
          if (lq2 <= lp2) continue;
          const dot = px * qx + py * qy;
          if (dot <= 0) continue;
          const lq = Math.sqrt(lq2);
          if (Math.abs(px * qy - py * qx) / lq > tol) continue;
          if (dot / lq >= lq - tol) continue;
          // split e2 = a–q at p: a–p joins e1, p–q is new (or joins an existing p–q)
          this.eu[e2] = -1;
          this.mergeOrAdd(a, p, e2, adjacency);
          this.mergeOrAdd(p, q, e2, adjacency);
          const ql = adjacency(q);
          const at = ql.indexOf(e2);
          if (at >= 0) ql.splice(at, 1);
          queue.push(a, p);
          found = true;
          split = true;
          break;
        }
      }
    }
    if (split) this.compact();
  }

  /** the edge a–b with the cut record of edge src merged in */
  private mergeOrAdd(a: number, b: number, src: number, adjacency: (v: number) => number[]): void {
    const u = a < b ? a : b;
    const v = a < b ? b : a;
    const f = this.findEdge(u, v, false);
    if (f >= 0 && f !== src) {
      this.mergeRecord(f, src);
      return;
    }
    this.zr[0] = this.eZMin[src];
    this.zr[1] = this.eZTop[src];
    const id = this.newEdge(u, v, this.eFirstNear[src], this.eFirstThrough[src], this.eTool[src]);
    adjacency(u).push(id);
    adjacency(v).push(id);
  }

  private mergeRecord(f: number, e: number): void {
    if (this.eZMin[e] < this.eZMin[f]) {
      this.eZMin[f] = this.eZMin[e];
      this.eZTop[f] = this.eZTop[e];
      this.eTool[f] = this.eTool[e];
    }
    if (this.eFirstNear[e] < this.eFirstNear[f]) this.eFirstNear[f] = this.eFirstNear[e];
    const te = this.eFirstThrough[e], tf = this.eFirstThrough[f];
    if (te >= 0 && (tf < 0 || te < tf)) {
      this.eFirstThrough[f] = te;
      this.eTool[f] = this.eTool[e];
    }
  }

  /** drops replaced edges and renumbers the rest */
  private compact(): void {
    const arrays = [this.eu, this.ev, this.eZMin, this.eZTop, this.eFirstNear, this.eFirstThrough, this.eTool, this.eArc];
    let w = 0;
    const n = this.eCount;
    for (let e = 0; e < n; e++) {
      if (this.eu[e] < 0) continue;
      if (w !== e) for (const a of arrays) a[w] = a[e];
      w++;
    }
    this.eCount = w;
    this.eArc.fill(0, w, n);
    // the edges are renumbered: relink the lists
    this.vHead.fill(-1, 0, this.vCount);
    for (let e = 0; e < w; e++) this.link(e);
  }

  edgeLengthMm(e: number): number {
    const arc = this.eArc[e];
    if (arc > 0) return this.arcs.r[arc] * Math.abs(this.arcs.sweep[arc]);
    const u = this.eu[e], v = this.ev[e];
    return len2(this.vx[v] - this.vx[u], this.vy[v] - this.vy[u]);
  }
}
