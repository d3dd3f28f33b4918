// Program facts from a finished move list: bounds of rapid and of cutting moves (arcs by
// their true extent, not their end points), tools in the order M6 first selected them, and
// spindle speeds in the order they were first used.
import type { Bounds, MoveList } from './move-list';

function emptyBounds(): Bounds {
  return { minX: Infinity, minY: Infinity, minZ: Infinity, maxX: -Infinity, maxY: -Infinity, maxZ: -Infinity };
}

function include(b: Bounds, x: number, y: number, z: number): void {
  if (x < b.minX) b.minX = x;
  if (x > b.maxX) b.maxX = x;
  if (y < b.minY) b.minY = y;
  if (y > b.maxY) b.maxY = y;
  if (z < b.minZ) b.minZ = z;
  if (z > b.maxZ) b.maxZ = z;
}

/** adds the axis-aligned extremes an arc passes through (quarter points inside its sweep) */
function includeArcExtremes(b: Bounds, m: MoveList, k: number, sx: number, sy: number, sz: number): void {
  const a = m.arcs;
  const plane = a.plane[k];
  const r = a.radius[k];
  const sweep = a.sweep[k];
  const ca = plane === 0 ? a.cx[k] : plane === 1 ? a.cz[k] : a.cy[k];
  const cb = plane === 0 ? a.cy[k] : plane === 1 ? a.cx[k] : a.cz[k];
  const sa = plane === 0 ? sx : plane === 1 ? sz : sy;
  const sb = plane === 0 ? sy : plane === 1 ? sx : sz;
  const a0 = Math.atan2(sb - cb, sa - ca);
  const i = a.move[k];
  const n0 = plane === 0 ? sz : plane === 1 ? sy : sx;
  const n1 = plane === 0 ? m.z[i] : plane === 1 ? m.y[i] : m.x[i];
  for (let q = -4; q <= 8; q++) {
    const ang = (q * Math.PI) / 2;
    const t = (ang - a0) / sweep;
    if (!(t > 0 && t < 1)) continue;
    const pa = ca + r * Math.cos(ang);
    const pb = cb + r * Math.sin(ang);
    const pn = n0 + (n1 - n0) * t;
    if (plane === 0) include(b, pa, pb, pn);
    else if (plane === 1) include(b, pb, pn, pa);
    else include(b, pn, pa, pb);
  }
}

export function computeFacts(m: MoveList): { rapidBounds: Bounds | null; feedBounds: Bounds | null; toolsUsed: number[]; spindleSpeeds: number[] } {
  const rapid = emptyBounds();
  const feed = emptyBounds();
  let anyRapid = false;
  let anyFeed = false;
  const tools: number[] = [];
  const speeds: number[] = [];
  const seenTools = new Set<number>();
  const seenSpeeds = new Set<number>();
  let sx = m.startX;
  let sy = m.startY;
  let sz = m.startZ;
  let arc = 0;
  let lastSpeed = 0;
  for (let i = 0; i < m.count; i++) {
    const k = m.kind[i];
    const x = m.x[i];
    const y = m.y[i];
    const z = m.z[i];
    if (k === 0) {
      include(rapid, sx, sy, sz);
      include(rapid, x, y, z);
      anyRapid = true;
    } else if (k === 1 || k === 2) {
      include(feed, sx, sy, sz);
      include(feed, x, y, z);
      if (k === 2) includeArcExtremes(feed, m, arc++, sx, sy, sz);
      anyFeed = true;
    } else if (k === 4) {
      const t = m.tool[i];
      if (!seenTools.has(t)) {
        seenTools.add(t);
        tools.push(t);
      }
    }
    const s = m.spindle[i];
    if (s !== lastSpeed) {
      lastSpeed = s;
      if (s > 0 && !seenSpeeds.has(s)) {
        seenSpeeds.add(s);
        speeds.push(s);
      }
    }
    sx = x;
    sy = y;
    sz = z;
  }
  return { rapidBounds: anyRapid ? rapid : null, feedBounds: anyFeed ? feed : null, toolsUsed: tools, spindleSpeeds: speeds };
}
