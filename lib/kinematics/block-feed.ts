// Turns moves into planner blocks: per-axis limits projected on each block's direction
// (axis-limits.ts), F, block rate and the centripetal cap, the block's kind for the
// breakdown, and arcs walked chord by chord (arc-chords.ts).
//
// Arcs take a faster path than lines because a fine chord tolerance makes most blocks chords:
// all chords of one arc share their length and corner angle, points advance by a fixed
// rotation, and the corner between two chords of the same arc never binds when its
// corner-tolerance radius R = δ·s/(1 − s) (s = sin(θ/2), corner-speed.ts) is at least the arc
// radius r: the corner speed √(a_w·R) is then at least √(a·r), which already caps the chords (a_w, the
// acceleration along the in-plane vector u_out − u_in, is at least the plane's smaller axis
// limit a). The last chord ends exactly on the move's end point and is planned in full.

import type { ArcTable } from '../gcode/move-list';
import type { MachineProfile } from '../validation/machine-profile';
import { chordCount } from './arc-chords';
import type { BlockPlanner } from './planner';
import { TimeKind } from './timeline';

const MIN_BLOCK_MM = 1e-9;
const RAPID = TimeKind.rapid;
const PLUNGE = TimeKind.plunge;
const CUTTING = TimeKind.cutting;
const AIR = TimeKind.air;

/** 1 / min over moving axes of limit_i/|u_i|, as max of |u_i|/limit_i (inverse limits given). */
function inverseLimit(ux: number, uy: number, uz: number, ix: number, iy: number, iz: number): number {
  const a = (ux < 0 ? -ux : ux) * ix;
  const b = (uy < 0 ? -uy : uy) * iy;
  const c = (uz < 0 ? -uz : uz) * iz;
  return a > b ? (a > c ? a : c) : b > c ? b : c;
}

export class BlockFeed {
  px: number;
  py: number;
  pz: number;
  private readonly planner: BlockPlanner;
  // inverse limits: s/mm for speeds, s²/mm for accelerations
  private readonly ifx: number;
  private readonly ify: number;
  private readonly ifz: number;
  private readonly irx: number;
  private readonly iry: number;
  private readonly irz: number;
  private readonly iax: number;
  private readonly iay: number;
  private readonly iaz: number;
  private readonly ax: number;
  private readonly ay: number;
  private readonly az: number;
  private readonly rate: number;
  private readonly tol: number;
  private readonly cornerTol: number;
  private readonly stockTop: number;
  private readonly pt = new Float64Array(3);

  constructor(planner: BlockPlanner, profile: MachineProfile, stockTopZ: number, start: { x: number; y: number; z: number }) {
    this.planner = planner;
    this.ifx = 60 / profile.maxFeedMmPerMin.x;
    this.ify = 60 / profile.maxFeedMmPerMin.y;
    this.ifz = 60 / profile.maxFeedMmPerMin.z;
    this.irx = 60 / profile.rapidMmPerMin.x;
    this.iry = 60 / profile.rapidMmPerMin.y;
    this.irz = 60 / profile.rapidMmPerMin.z;
    this.ax = profile.accelMmPerS2.x;
    this.ay = profile.accelMmPerS2.y;
    this.az = profile.accelMmPerS2.z;
    this.iax = 1 / this.ax;
    this.iay = 1 / this.ay;
    this.iaz = 1 / this.az;
    this.rate = profile.maxBlocksPerS;
    this.tol = profile.chordToleranceMm;
    this.cornerTol = profile.cornerToleranceMm;
    this.stockTop = stockTopZ - 1e-9;
    this.px = start.x;
    this.py = start.y;
    this.pz = start.z;
  }

  /**
   * One straight block to (qx,qy,qz). `fMmPerS` ≤ 0 means no F (axis limits only); `cap` is a
   * further speed cap (√(a·r) on arcs), `scale` stretches a chord to its share of the arc.
   */
  line(move: number, rapid: boolean, qx: number, qy: number, qz: number, fMmPerS: number, cap: number, scale: number): void {
    const dx = qx - this.px;
    const dy = qy - this.py;
    const dz = qz - this.pz;
    const chord = Math.sqrt(dx * dx + dy * dy + dz * dz);
    if (chord < MIN_BLOCK_MM) return;
    const inv = 1 / chord;
    this.block(move, rapid, dx * inv, dy * inv, dz * inv, dx, dy, dz, chord * scale, qz, fMmPerS, cap, false);
    this.px = qx;
    this.py = qy;
    this.pz = qz;
  }

  private block(move: number, rapid: boolean, ux: number, uy: number, uz: number, dx: number, dy: number, dz: number, len: number, qz: number, fMmPerS: number, cap: number, cornerFree: boolean): void {
    let v: number;
    let kind: number;
    if (rapid) {
      v = 1 / inverseLimit(ux, uy, uz, this.irx, this.iry, this.irz);
      kind = RAPID;
    } else {
      v = 1 / inverseLimit(ux, uy, uz, this.ifx, this.ify, this.ifz);
      if (fMmPerS > 0 && fMmPerS < v) v = fMmPerS;
      if (cap < v) v = cap;
      if (dz < 0 && dz * dz > dx * dx + dy * dy) kind = PLUNGE; // steeper than 45° down
      else kind = (this.pz < qz ? this.pz : qz) < this.stockTop ? CUTTING : AIR;
    }
    if (this.rate > 0 && len * this.rate < v) v = len * this.rate;
    this.planner.push(move, kind, len, ux, uy, uz, v, 1 / inverseLimit(ux, uy, uz, this.iax, this.iay, this.iaz), cornerFree);
  }

  /** Arc row `row` of `arcs`, ending at (ex,ey,ez), as chords within the chord tolerance. */
  arc(move: number, arcs: ArcTable, row: number, ex: number, ey: number, ez: number, fMmPerS: number): void {
    const plane = arcs.plane[row];
    // in-plane axes p, q and the normal n, as indices into (x, y, z)
    const ip = plane === 0 ? 0 : plane === 1 ? 2 : 1;
    const iq = plane === 0 ? 1 : plane === 1 ? 0 : 2;
    const inn = plane === 0 ? 2 : plane === 1 ? 1 : 0;
    const pt = this.pt;
    pt[0] = this.px;
    pt[1] = this.py;
    pt[2] = this.pz;
    const cp = plane === 0 ? arcs.cx[row] : plane === 1 ? arcs.cz[row] : arcs.cy[row];
    const cq = plane === 0 ? arcs.cy[row] : plane === 1 ? arcs.cx[row] : arcs.cz[row];
    const n0 = pt[inn];
    const n1 = inn === 0 ? ex : inn === 1 ? ey : ez;
    const r = arcs.radius[row];
    const sweep = arcs.sweep[row];
    const n = chordCount(r, sweep, this.tol);
    const aPlane = Math.min(ip === 0 || iq === 0 ? this.ax : Infinity, ip === 1 || iq === 1 ? this.ay : Infinity, ip === 2 || iq === 2 ? this.az : Infinity);
    const cap = Math.sqrt(aPlane * r);
    const phi = sweep / n;
    const rise = (n1 - n0) / n;
    const inPlane = 2 * r * Math.abs(Math.sin(phi / 2));
    const chordLen = Math.sqrt(inPlane * inPlane + rise * rise);
    const arcLen = Math.sqrt(r * sweep * (r * sweep) + (n1 - n0) * (n1 - n0));
    const blockLen = arcLen / n;
    const scale = chordLen > 0 ? blockLen / chordLen : 1;
    // corner between two chords of this arc: cos θ = −u_in·u_out
    const dot = chordLen > 0 ? (inPlane * inPlane * Math.cos(phi) + rise * rise) / (chordLen * chordLen) : 1;
    const s = Math.sqrt(Math.max(0, (1 + dot) / 2));
    const cornerFree = s >= 1 - 1e-12 || (this.cornerTol * s) / (1 - s) >= r;
    // When F and √(a·r) lie below every direction's axis feed limit in this arc's plane (and
    // along its normal on a helix), all inner chords share one speed limit.
    const ifMax = Math.max(ip === 0 || iq === 0 ? this.ifx : 0, ip === 1 || iq === 1 ? this.ify : 0, ip === 2 || iq === 2 ? this.ifz : 0, rise !== 0 ? (inn === 0 ? this.ifx : inn === 1 ? this.ify : this.ifz) : 0);
    let vInner = fMmPerS > 0 && fMmPerS < cap ? fMmPerS : cap;
    if (vInner * ifMax > 1) vInner = NaN; // the axis limits may bind: project per chord
    else if (this.rate > 0 && blockLen * this.rate < vInner) vInner = blockLen * this.rate;
    const plunging = inn !== 2 || (rise < 0 && rise * rise > inPlane * inPlane); // Z in the plane, or a steep helix down
    const cosPhi = Math.cos(phi);
    const sinPhi = Math.sin(phi);
    let rp = pt[ip] - cp;
    let rq = pt[iq] - cq;
    const invChord = chordLen > 0 ? 1 / chordLen : 0;
    for (let k = 1; k < n; k++) {
      const np = rp * cosPhi - rq * sinPhi;
      rq = rp * sinPhi + rq * cosPhi;
      rp = np;
      const sx = this.px;
      const sy = this.py;
      const sz = this.pz;
      pt[ip] = cp + rp;
      pt[iq] = cq + rq;
      pt[inn] = n0 + rise * k;
      if (k === 1 || !cornerFree || chordLen < MIN_BLOCK_MM) {
        this.line(move, false, pt[0], pt[1], pt[2], fMmPerS, cap, scale);
      } else {
        const dx = pt[0] - sx;
        const dy = pt[1] - sy;
        const dz = pt[2] - sz;
        if (vInner === vInner) {
          const ux = dx * invChord;
          const uy = dy * invChord;
          const uz = dz * invChord;
          const kind = plunging && dz < 0 && dz * dz > dx * dx + dy * dy ? PLUNGE : (sz < pt[2] ? sz : pt[2]) < this.stockTop ? CUTTING : AIR;
          this.planner.push(move, kind, blockLen, ux, uy, uz, vInner, 1 / inverseLimit(ux, uy, uz, this.iax, this.iay, this.iaz), true);
        } else {
          this.block(move, false, dx * invChord, dy * invChord, dz * invChord, dx, dy, dz, blockLen, pt[2], fMmPerS, cap, true);
        }
        this.px = pt[0];
        this.py = pt[1];
        this.pz = pt[2];
      }
    }
    this.line(move, false, ex, ey, ez, fMmPerS, cap, scale);
  }
}
