// Straight and arc motion (NISTIR 6556 §3.5.2, §3.5.3), G53 machine-coordinate moves
// (§3.5.12) and G28/G30 returns through an intermediate point to the machine's home
// (§3.5.8). Arc rules: I J K are offsets from the current point (unless G90.1 makes them
// absolute, a common extension); start and end radius may differ by 0.002 mm / 0.0002 in;
// R > 0 turns ≤ 180°, R < 0 more; R and I/J/K together are an error.
import { arcSweep as arcSweepImp, centreFromRadius as centreFromRadiusImp, helixLength as helixLengthImp, type RadiusCentre } from './arc-geometry';
import type { Interp } from './interpreter-state';
import { L as LETTERS } from './line-words';
import { MoveFlag as MOVE_FLAG, MoveKind as MOVE_KIND } from './move-list';

// imported bindings are read through getters once transpiled to CommonJS; local copies keep
// the per-line path free of them
const L = { ...LETTERS };
const MoveFlag = { ...MOVE_FLAG };
const MoveKind = { ...MOVE_KIND };
const arcSweep = arcSweepImp;
const centreFromRadius = centreFromRadiusImp;
const helixLength = helixLengthImp;


export function straightMove(ip: Interp, kind: 0 | 1): void {
  const x = ip.targetX();
  const y = ip.targetY();
  const z = ip.targetZ();
  const feed = kind === 0 ? 0 : ip.feedFor(Math.hypot(x - ip.x, y - ip.y, z - ip.z));
  ip.line(kind, x, y, z, feed);
}

/** G53: absolute machine coordinates for the axes given, with G0 or G1 */
export function machineMove(ip: Interp, kind: 0 | 1): void {
  const w = ip.w;
  const s = ip.scale;
  const x = w.has(L.X) ? w.value[L.X] * s - ip.offset.x : ip.x;
  const y = w.has(L.Y) ? w.value[L.Y] * s - ip.offset.y : ip.y;
  const z = w.has(L.Z) ? w.value[L.Z] * s - ip.offset.z : ip.z;
  const feed = kind === 0 ? 0 : ip.feedFor(Math.hypot(x - ip.x, y - ip.y, z - ip.z));
  ip.line(kind, x, y, z, feed, MoveFlag.machineFrame);
}

/** G28/G30: rapid to the programmed point (if any axis word), then to home, all axes */
export function homeMove(ip: Interp, second: boolean): void {
  if (ip.hasAxisWords()) ip.line(MoveKind.rapid, ip.targetX(), ip.targetY(), ip.targetZ(), 0, MoveFlag.machineFrame);
  const h = second ? ip.home2 : ip.home;
  ip.diag.once('home-position-assumed', ip.lineNo, `G${second ? 30 : 28} goes to the machine home (${h.x}, ${h.y}, ${h.z}) mm, as the machine profile gives it`);
  ip.line(MoveKind.rapid, h.x - ip.offset.x, h.y - ip.offset.y, h.z - ip.offset.z, 0, MoveFlag.machineFrame);
}

const rc: RadiusCentre = { ok: false, ca: 0, cb: 0, radius: 0 };

// in-plane axes (a, b) and normal n per plane, as letter indices: G17 X Y Z, G18 Z X Y, G19 Y Z X
const AXIS_A = [L.X, L.Z, L.Y];
const AXIS_B = [L.Y, L.X, L.Z];
const OFF_A = [L.I, L.K, L.J];
const OFF_B = [L.J, L.I, L.K];

function pick(axis: number, x: number, y: number, z: number): number {
  return axis === L.X ? x : axis === L.Y ? y : z;
}

function fmt(v: number): string {
  return String(Math.round(v * 1e5) / 1e5);
}

/**
 * G2/G3: the end point, the centre from R (radiusCentre) or from I/J/K (offsetCentre), then
 * the arc written with its centre in x, y, z order
 */
export function arcMove(ip: Interp, ccw: boolean): void {
  const w = ip.w;
  const p = ip.plane;
  const hasR = w.has(L.R);
  if (hasR && (w.has(L.I) || w.has(L.J) || w.has(L.K))) {
    ip.diag.add('arc-mixed-formats', ip.lineNo, 'an arc takes either R or I/J/K, not both; the arc is skipped', ip.lineText);
    return;
  }
  if (!ip.hasAxisWords()) {
    ip.diag.add('arc-no-axis-word', ip.lineNo, `G${ccw ? 3 : 2} needs at least one axis word; the arc is skipped`, ip.lineText);
    return;
  }
  const ex = ip.targetX();
  const ey = ip.targetY();
  const ez = ip.targetZ();
  const aA = AXIS_A[p];
  const aB = AXIS_B[p];
  const sa = pick(aA, ip.x, ip.y, ip.z);
  const sb = pick(aB, ip.x, ip.y, ip.z);
  const ea = pick(aA, ex, ey, ez);
  const eb = pick(aB, ex, ey, ez);
  if (!(hasR ? radiusCentre(ip, ccw, sa, sb, ea, eb) : offsetCentre(ip, sa, sb, ea, eb))) return;
  const ca = rc.ca;
  const cb = rc.cb;
  const radius = rc.radius;
  const sweep = arcSweep(sa, sb, ea, eb, ca, cb, ccw, true);
  const sn = p === 0 ? ip.z : p === 1 ? ip.y : ip.x;
  const en = p === 0 ? ez : p === 1 ? ey : ex;
  const feed = ip.feedFor(helixLength(radius, sweep, en - sn));
  let cx: number, cy: number, cz: number;
  if (p === 0) {
    cx = ca;
    cy = cb;
    cz = sn;
  } else if (p === 1) {
    cz = ca;
    cx = cb;
    cy = sn;
  } else {
    cy = ca;
    cz = cb;
    cx = sn;
  }
  const flags = ip.flags() | (ip.inverseTime ? MoveFlag.inverseTime : 0);
  ip.moves.pushArc(ex, ey, ez, feed, ip.lineNo, flags, ip.tool, ip.rpm(), cx, cy, cz, radius, sweep, p);
  ip.x = ex;
  ip.y = ey;
  ip.z = ez;
}

/**
 * a radius-format arc's centre in its plane, from its start (sa, sb), end (ea, eb) and R, into
 * rc; false, reported, when the arc is skipped
 */
function radiusCentre(ip: Interp, ccw: boolean, sa: number, sb: number, ea: number, eb: number): boolean {
  const w = ip.w;
  const text = ip.lineText;
  if (!w.has(AXIS_A[ip.plane]) && !w.has(AXIS_B[ip.plane])) {
    ip.diag.add('arc-radius-no-end', ip.lineNo, 'a radius-format arc needs an end word in its plane; the arc is skipped', text);
    return false;
  }
  if (Math.abs(ea - sa) < 1e-9 && Math.abs(eb - sb) < 1e-9) {
    ip.diag.add('arc-radius-end-equals-start', ip.lineNo, 'a radius-format arc cannot end where it starts (use I/J/K for a full circle); the arc is skipped', text);
    return false;
  }
  centreFromRadius(sa, sb, ea, eb, w.value[L.R] * ip.scale, ccw, ip.arcEndRadiusToleranceMm, rc);
  if (!rc.ok) {
    const unit = ip.inch ? 'in' : 'mm';
    const half = Math.hypot(ea - sa, eb - sb) / 2 / ip.scale;
    ip.diag.add('arc-radius-too-small', ip.lineNo, `R ${fmt(Math.abs(w.value[L.R]))} ${unit} is shorter than half the distance to the end point (${fmt(half)} ${unit}); the arc is skipped`, text);
    return false;
  }
  return true;
}

/**
 * a centre-format arc's centre in its plane from I/J/K (offsets, or a point under G90.1) and
 * its radius, into rc; false, reported, when the offsets are missing or the start and end
 * radii differ by more than the tolerance
 */
function offsetCentre(ip: Interp, sa: number, sb: number, ea: number, eb: number): boolean {
  const w = ip.w;
  const p = ip.plane;
  const aA = AXIS_A[p];
  const aB = AXIS_B[p];
  const oA = OFF_A[p];
  const oB = OFF_B[p];
  if (!w.has(oA) && !w.has(oB)) {
    ip.diag.add('arc-no-offsets', ip.lineNo, 'a centre-format arc needs an offset in its plane (I/J for G17, I/K for G18, J/K for G19); the arc is skipped', ip.lineText);
    return false;
  }
  const va = w.has(oA) ? w.value[oA] * ip.scale : 0;
  const vb = w.has(oB) ? w.value[oB] * ip.scale : 0;
  let ca: number;
  let cb: number;
  if (ip.arcAbsolute) {
    // G90.1: the centre is a point in program coordinates
    ca = w.has(oA) ? va + (aA === L.X ? ip.g92x : aA === L.Y ? ip.g92y : ip.g92z) : sa;
    cb = w.has(oB) ? vb + (aB === L.X ? ip.g92x : aB === L.Y ? ip.g92y : ip.g92z) : sb;
  } else {
    ca = sa + va;
    cb = sb + vb;
  }
  const radius = Math.hypot(sa - ca, sb - cb);
  const r1 = Math.hypot(ea - ca, eb - cb);
  if (Math.abs(radius - r1) > ip.arcEndRadiusToleranceMm) {
    const unit = ip.inch ? 'in' : 'mm';
    const lim = ip.inch ? '0.0002 in' : '0.002 mm';
    ip.diag.add('arc-radius-mismatch', ip.lineNo, `arc start radius ${fmt(radius / ip.scale)} ${unit} and end radius ${fmt(r1 / ip.scale)} ${unit} differ by more than ${lim}; the arc is skipped`, ip.lineText);
    return false;
  }
  rc.ok = true;
  rc.ca = ca;
  rc.cb = cb;
  rc.radius = radius;
  return true;
}
