// The path as the GPU draws it, built once in the worker from the move list and the planner's
// clock: one line strip for the whole program (the path is continuous, so each segment shares
// its start with the end of the one before: one vertex per segment, not two), arcs flattened
// at the machine's chord tolerance (the same sagitta rule as the planner, lib/gcode
// arcChordCount), and per move the index of its first segment, so playback maps a move to a
// draw range without touching the geometry. Per move also its view kind (path-kinds.ts) and its
// achieved speed: length ÷ the planner's time for it, as a share of the commanded feed.
// Everything is a typed array, transferred out of the worker; no object per move.
import { arcChordCount, type MoveList } from '@/lib/gcode';
import { feedKind, ViewKind } from './path-kinds';

export interface ViewerPath {
  /** the strip's vertices, x y z each (float32, mm, G54): the path's start, then the end of
   *  every segment, so segment s runs from vertex s to vertex s + 1 */
  positions: Float32Array;
  /** per vertex: distance along the run of rapids that reaches it (mm); 0 where a run starts
   *  and at the end of every other segment (the shader dashes rapids only) */
  dash: Float32Array;
  /** per vertex: [tool slot (index into tools), flags (bit 0 rapid, bit 1 a finding's line)] of
   *  the segment ending there (the first vertex repeats the first segment's); the GPU takes a
   *  segment's flat attributes from its last vertex, as WebGL 2 does */
  tag: Uint8Array;
  /** per move m: its first segment; moveSegStart[count] = the segment count */
  moveSegStart: Uint32Array;
  /** per move: ViewKind */
  viewKind: Uint8Array;
  /** per move: achieved ÷ commanded speed, 0–1; NaN where it has no meaning (rapids, records) */
  speedShare: Float32Array;
  /** per move: its tool slot (index into tools), as in tag, kept per move so colouring by tool
   *  never needs the vertex buffers (the page lets those go once the GPU has them) */
  toolSlot: Uint8Array;
  /** tool numbers in the order first used; tag's slot indexes this */
  tools: number[];
  /** box of every vertex, mm; null for a program without motion */
  bounds: { minX: number; minY: number; minZ: number; maxX: number; maxY: number; maxZ: number } | null;
}

export const TAG_RAPID = 1;
export const TAG_FINDING = 2;

/** true when `line` is in the sorted list */
function hasLine(sorted: Uint32Array, line: number): boolean {
  let lo = 0;
  let hi = sorted.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const v = sorted[mid];
    if (v === line) return true;
    if (v < line) lo = mid + 1;
    else hi = mid - 1;
  }
  return false;
}

/** segments of move i: chords for an arc, 1 for a straight move, 0 for a record */
function segmentCount(moves: MoveList, i: number, arcIndex: number, toleranceMm: number): number {
  const k = moves.kind[i];
  if (k === 2) return arcChordCount(moves.arcs.radius[arcIndex], moves.arcs.sweep[arcIndex], toleranceMm);
  return k <= 1 ? 1 : 0;
}

export function buildViewerPath(
  moves: MoveList,
  cumulativeS: Float64Array,
  options: { stockTopZ: number; chordToleranceMm: number; findingLines: Uint32Array },
): ViewerPath {
  const n = moves.count;
  const tol = options.chordToleranceMm;
  const moveSegStart = new Uint32Array(n + 1);
  let segs = 0;
  for (let i = 0, a = 0; i < n; i++) {
    moveSegStart[i] = segs;
    segs += segmentCount(moves, i, a, tol);
    if (moves.kind[i] === 2) a++;
  }
  moveSegStart[n] = segs;

  const vertices = segs > 0 ? segs + 1 : 0;
  const positions = new Float32Array(vertices * 3);
  const dash = new Float32Array(vertices);
  const tag = new Uint8Array(vertices * 2);
  const viewKind = new Uint8Array(n);
  const speedShare = new Float32Array(n);
  const slots = new Uint8Array(n);
  const toolSlot = new Map<number, number>();
  const tools: number[] = [];
  const topZ = options.stockTopZ;
  let minX = Infinity, minY = Infinity, minZ = Infinity, maxX = -Infinity, maxY = -Infinity, maxZ = -Infinity;

  let x0 = moves.startX, y0 = moves.startY, z0 = moves.startZ;
  let s = 0; // segment being written
  let arc = 0;
  for (let i = 0; i < n; i++) {
    const k = moves.kind[i];
    const x1 = moves.x[i], y1 = moves.y[i], z1 = moves.z[i];
    const dt = cumulativeS[i] - (i > 0 ? cumulativeS[i - 1] : 0);
    if (k > 2) {
      viewKind[i] = ViewKind.still;
      speedShare[i] = Number.NaN;
      continue;
    }
    const toolNo = moves.tool[i];
    let slot = toolSlot.get(toolNo);
    if (slot === undefined) {
      slot = Math.min(tools.length, 255);
      toolSlot.set(toolNo, slot);
      tools.push(toolNo);
    }
    slots[i] = slot;
    const flags = (k === 0 ? TAG_RAPID : 0) | (hasLine(options.findingLines, moves.line[i]) ? TAG_FINDING : 0);
    const chords = k === 2 ? moveSegStart[i + 1] - moveSegStart[i] : 1;
    let length = 0;
    let px = x0, py = y0, pz = z0;
    let lowZ = z0 < z1 ? z0 : z1;
    // an arc's chord ends, as lib/gcode arcPoint gives them (the same expressions, so the same
    // numbers), with the start angle worked out once per arc instead of once per chord
    let plane = 0, cA = 0, cB = 0, r = 0, sweep = 0, a0 = 0, sN = 0, eN = 0;
    if (k === 2) {
      const a = moves.arcs;
      plane = a.plane[arc];
      r = a.radius[arc];
      sweep = a.sweep[arc];
      // the arc's start is the previous move's end, as arcPoint takes it
      const sx = i === 0 ? moves.startX : moves.x[i - 1];
      const sy = i === 0 ? moves.startY : moves.y[i - 1];
      const sz = i === 0 ? moves.startZ : moves.z[i - 1];
      if (plane === 0) {
        cA = a.cx[arc];
        cB = a.cy[arc];
        a0 = Math.atan2(sy - cB, sx - cA);
        sN = sz;
        eN = z1;
      } else if (plane === 1) {
        cA = a.cz[arc];
        cB = a.cx[arc];
        a0 = Math.atan2(sx - cB, sz - cA);
        sN = sy;
        eN = y1;
      } else {
        cA = a.cy[arc];
        cB = a.cz[arc];
        a0 = Math.atan2(sz - cB, sy - cA);
        sN = sx;
        eN = x1;
      }
    }
    for (let c = 1; c <= chords; c++) {
      let qx = x1, qy = y1, qz = z1;
      if (k === 2 && c < chords) {
        const t = c / chords;
        const ang = a0 + sweep * t;
        const sA = cA + r * Math.cos(ang);
        const sB = cB + r * Math.sin(ang);
        const nn = sN + (eN - sN) * t;
        if (plane === 0) {
          qx = sA;
          qy = sB;
          qz = nn;
        } else if (plane === 1) {
          qz = sA;
          qx = sB;
          qy = nn;
        } else {
          qy = sA;
          qz = sB;
          qx = nn;
        }
      }
      const segLen = Math.sqrt((qx - px) * (qx - px) + (qy - py) * (qy - py) + (qz - pz) * (qz - pz));
      if (s === 0) {
        // the strip's first vertex: the path's start, with the first segment's tag
        positions[0] = px;
        positions[1] = py;
        positions[2] = pz;
        dash[0] = 0;
        tag[0] = slot;
        tag[1] = flags;
      }
      const v = s + 1;
      const o = v * 3;
      positions[o] = qx;
      positions[o + 1] = qy;
      positions[o + 2] = qz;
      dash[v] = k === 0 ? dash[s] + segLen : 0;
      tag[v * 2] = slot;
      tag[v * 2 + 1] = flags;
      length += segLen;
      if (qz < lowZ) lowZ = qz;
      if (qx < minX) minX = qx;
      if (qx > maxX) maxX = qx;
      if (qy < minY) minY = qy;
      if (qy > maxY) maxY = qy;
      if (qz < minZ) minZ = qz;
      if (qz > maxZ) maxZ = qz;
      px = qx;
      py = qy;
      pz = qz;
      s++;
    }
    if (x0 < minX) minX = x0;
    if (x0 > maxX) maxX = x0;
    if (y0 < minY) minY = y0;
    if (y0 > maxY) maxY = y0;
    if (z0 < minZ) minZ = z0;
    if (z0 > maxZ) maxZ = z0;
    if (k === 0) {
      viewKind[i] = ViewKind.rapid;
      speedShare[i] = Number.NaN;
    } else {
      viewKind[i] = k === 2 ? (lowZ < topZ ? ViewKind.cut : ViewKind.air) : feedKind(x0, y0, z0, x1, y1, z1, topZ);
      const feed = moves.feed[i];
      // mm/s reached over mm/s asked; a move the planner gave no time (zero length) counts as full speed
      speedShare[i] = feed > 0 && dt > 0 && length > 0 ? Math.min(1, length / dt / (feed / 60)) : 1;
    }
    if (k === 2) arc++;
    x0 = x1;
    y0 = y1;
    z0 = z1;
  }
  const bounds = segs > 0 ? { minX, minY, minZ, maxX, maxY, maxZ } : null;
  return { positions, dash, tag, moveSegStart, viewKind, speedShare, toolSlot: slots, tools, bounds };
}

/** vertices of the strip (one more than the segments, none without any); known once the buffers are released */
export function vertexCountOf(path: ViewerPath): number {
  const segs = path.moveSegStart[path.moveSegStart.length - 1];
  return segs > 0 ? segs + 1 : 0;
}

/**
 * The page's own copy of the vertex buffers (positions, dash distances, tags) let go once the
 * GPU holds them: the scene never reads them back (bounds, tool slots and kinds are per move),
 * so keeping them would only double the path's memory. Called by the scene after the upload.
 */
export function releaseVertexBuffers(path: ViewerPath): void {
  path.positions = new Float32Array(0);
  path.dash = new Float32Array(0);
  path.tag = new Uint8Array(0);
}

/** every buffer of the path, once each, for postMessage's transfer list */
export function pathTransferables(path: ViewerPath): ArrayBuffer[] {
  return [path.positions, path.dash, path.tag, path.moveSegStart, path.viewKind, path.speedShare, path.toolSlot].map((a) => a.buffer as ArrayBuffer);
}
