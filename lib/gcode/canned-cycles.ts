// Canned cycles expanded into their real moves, after NISTIR 6556 §3.5.16 (G81 G82 G83 G85
// G89; G73 is a dialect extension): preliminary rapid up to R if below it, then per repeat
// (L, §3.5.16 "repeat") a rapid in XY, a rapid to R, the cycle's own moves, and the retract
// of §3.5.20 (G98: to the Z before the cycle or R, whichever is higher; G99: to R).
// Z, R, P, Q are sticky while the cycle stays in force. In G91, R is measured from the Z
// before the cycle and Z from R, and X Y are added on each repeat.
// G85 and G89 retract at the feed rate to clear Z (§3.5.16.6, §3.5.16.10); here the feed-out
// ends at R and the rest of the way to clear Z (G98 above R) is a rapid, a difference listed
// in docs/references.md.
// G83 returns to just above the last depth before the next peck (§3.5.16.4 says "backed off
// a bit", no figure); the 0.254 mm (0.010 in) gap is from memory of the NIST interpreter's
// constant, not a read value. G73's chip-breaking lift reuses it: neither sourced nor
// computed (from memory; on machines the lift is a setting, common practice).
import { Interp } from './interpreter-state';
import { L } from './line-words';
import { MoveFlag, MoveKind } from './move-list';

const PECK_CLEARANCE_MM = 0.254;

/** a cycle's levels and counts once its words are checked, mm in the work frame */
class CycleLevels {
  repeats = 1;
  /** R level, hole bottom, and the level each hole retracts to (G98/G99) */
  rZ = 0;
  bottomZ = 0;
  clearZ = 0;
  /** dwell at the bottom (G82, G89), s */
  dwellS = 0;
}

const cycle = new CycleLevels();

/** a canned cycle line: its words checked and its levels worked out, then each repeat's hole */
export function cannedCycle(ip: Interp, code: number): void {
  if (!readCycle(ip, code, cycle)) return;
  const w = ip.w;
  if (ip.z < cycle.rZ) ip.line(MoveKind.rapid, ip.x, ip.y, cycle.rZ, 0, MoveFlag.cannedCycle);
  for (let rep = 0; rep < cycle.repeats; rep++) {
    let x = ip.x;
    let y = ip.y;
    if (ip.absolute) {
      if (w.has(L.X)) x = w.value[L.X] * ip.scale + ip.g92x;
      if (w.has(L.Y)) y = w.value[L.Y] * ip.scale + ip.g92y;
    } else {
      if (w.has(L.X)) x += w.value[L.X] * ip.scale;
      if (w.has(L.Y)) y += w.value[L.Y] * ip.scale;
    }
    cycleHole(ip, code, x, y, cycle);
  }
}

/**
 * the cycle's sticky words (Z, R, P, Q) taken, L, the levels and Q checked, into `c`; false,
 * reported, when the cycle is skipped
 */
function readCycle(ip: Interp, code: number, c: CycleLevels): boolean {
  const w = ip.w;
  const text = ip.lineText;
  const d = ip.diag;
  const n = ip.lineNo;
  if (code === 840 || code === 860 || code === 870 || code === 880) {
    d.add('unsupported-canned-cycle', n, `G${code / 10} is not interpreted; the cycle is skipped`, text);
    return false;
  }
  if (ip.plane !== 0) {
    d.add('cycle-plane-unsupported', n, 'canned cycles are interpreted in the G17 plane only; the cycle is skipped', text);
    return false;
  }
  if (ip.inverseTime) {
    d.add('cycle-inverse-time', n, 'a canned cycle cannot run in G93 inverse time mode; the cycle is skipped', text);
    return false;
  }
  if (w.has(L.Z)) ip.cycZ = w.value[L.Z] * ip.scale;
  if (w.has(L.R)) ip.cycR = w.value[L.R] * ip.scale;
  if (w.has(L.P)) ip.cycP = w.value[L.P];
  if (w.has(L.Q)) ip.cycQ = w.value[L.Q] * ip.scale;
  const repeats = w.has(L.L) ? w.value[L.L] : 1;
  if (!Number.isInteger(repeats) || repeats < 1) {
    d.add('cycle-bad-l', n, `L must be a whole number of at least 1, not ${repeats}; the cycle is skipped`, text);
    return false;
  }
  if (Number.isNaN(ip.cycZ)) {
    d.add('cycle-missing-z', n, 'the canned cycle has no Z depth in force; the cycle is skipped', text);
    return false;
  }
  if (Number.isNaN(ip.cycR)) {
    d.add('cycle-missing-r', n, 'the canned cycle has no R level in force; the cycle is skipped', text);
    return false;
  }
  const oldZ = ip.z;
  const rZ = ip.absolute ? ip.cycR + ip.g92z : oldZ + ip.cycR;
  const bottomZ = ip.absolute ? ip.cycZ + ip.g92z : rZ + ip.cycZ;
  if (rZ < bottomZ) {
    d.add('cycle-r-below-z', n, 'the R level is below the Z depth; the cycle is skipped', text);
    return false;
  }
  const peck = code === 830 || code === 730;
  if (peck && !(ip.cycQ > 0)) {
    d.add('cycle-bad-q', n, 'a peck cycle needs Q greater than 0; the cycle is skipped', text);
    return false;
  }
  const dwells = code === 820 || code === 890;
  let dwellS = 0;
  if (dwells && !Number.isNaN(ip.cycP)) {
    if (ip.cycP < 0) {
      d.add('dwell-negative', n, `dwell P ${ip.cycP} is negative (NISTIR 6556 §3.5.4); no dwell`, text);
    } else dwellS = ip.cycP;
  }
  if (ip.feedMmPerMin <= 0) d.add('feed-missing', n, 'canned cycle with no F in force; its feed moves have feed 0', text);
  c.repeats = repeats;
  c.rZ = rZ;
  c.bottomZ = bottomZ;
  c.clearZ = ip.retractOldZ ? Math.max(oldZ, rZ) : rZ;
  c.dwellS = dwellS;
  return true;
}

/** one hole at (x, y): rapid there and to R, the cycle's own moves, the retract */
function cycleHole(ip: Interp, code: number, x: number, y: number, c: CycleLevels): void {
  const cf = MoveFlag.cannedCycle;
  const feed = ip.feedMmPerMin;
  const { rZ, bottomZ, dwellS } = c;
  if (x !== ip.x || y !== ip.y) ip.line(MoveKind.rapid, x, y, ip.z, 0, cf);
  if (ip.z !== rZ) ip.line(MoveKind.rapid, x, y, rZ, 0, cf);
  switch (code) {
    case 810:
    case 820:
      ip.line(MoveKind.feed, x, y, bottomZ, feed, cf);
      if (dwellS > 0) ip.atRest(MoveKind.dwell, dwellS, cf);
      break;
    case 830:
    case 730: {
      const gap = Math.min(PECK_CLEARANCE_MM, ip.cycQ);
      let depth = rZ;
      while (depth > bottomZ) {
        const next = Math.max(depth - ip.cycQ, bottomZ);
        if (code === 830 && depth < rZ) ip.line(MoveKind.rapid, x, y, depth + gap, 0, cf);
        ip.line(MoveKind.feed, x, y, next, feed, cf);
        depth = next;
        if (depth > bottomZ) {
          // G83 clears the chips up at R; G73 only breaks them with a short lift
          if (code === 830) ip.line(MoveKind.rapid, x, y, rZ, 0, cf);
          else ip.line(MoveKind.rapid, x, y, depth + gap, 0, cf);
        }
      }
      break;
    }
    case 850:
    case 890:
      ip.line(MoveKind.feed, x, y, bottomZ, feed, cf);
      if (dwellS > 0) ip.atRest(MoveKind.dwell, dwellS, cf);
      // out at feed to R (the bore is finished on the way out), then the common retract
      ip.line(MoveKind.feed, x, y, rZ, feed, cf);
      break;
  }
  if (ip.z !== c.clearZ) ip.line(MoveKind.rapid, x, y, c.clearZ, 0, cf);
}
