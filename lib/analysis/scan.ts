// The single pass over the move list: walks every move once on the typed arrays, feeds the
// chords near the sheet bottom to the cut graph and every motion to the program checks, and
// notes for each tool the first move that cut through (for the sheet-lift check).
import { MoveFlag, MoveKind, type MoveList } from '@/lib/gcode/move-list';
import { ArcChords } from './arc';
import { BandCollector } from './band';
import { CutGraph } from './cut-graph';
import type { ProgramChecks } from './program-checks';

export interface ScanLevels {
  /** null when no sheet is given: no through-cut graph */
  throughZ: number | null;
  bandTopZ: number | null;
  stockTopZ: number | null;
  chainToleranceMm: number;
  arcToleranceMm: number;
  tabMaxLengthMm: number;
}

export interface ScanResult {
  graph: CutGraph | null;
  /** tool number → first move index that cut through */
  firstThroughByTool: Map<number, number>;
  /** tool number → first line of a cutting move with it */
  toolFirstLine: Map<number, number>;
}

/** XY extent of an arc: its end points and the axis crossings its sweep passes */
function arcExtent(cx: number, cy: number, r: number, a0: number, sweep: number, out: Float64Array): void {
  const a1 = a0 + sweep;
  let minX = Math.min(cx + r * Math.cos(a0), cx + r * Math.cos(a1));
  let maxX = Math.max(cx + r * Math.cos(a0), cx + r * Math.cos(a1));
  let minY = Math.min(cy + r * Math.sin(a0), cy + r * Math.sin(a1));
  let maxY = Math.max(cy + r * Math.sin(a0), cy + r * Math.sin(a1));
  const lo = Math.min(a0, a1), hi = Math.max(a0, a1);
  for (let k = Math.ceil(lo / (Math.PI / 2)); k * (Math.PI / 2) <= hi; k++) {
    const q = ((k % 4) + 4) % 4;
    if (q === 0) maxX = cx + r;
    else if (q === 1) maxY = cy + r;
    else if (q === 2) minX = cx - r;
    else minY = cy - r;
  }
  out[0] = minX; out[1] = minY; out[2] = maxX; out[3] = maxY;
}

export function scanMoves(moves: MoveList, levels: ScanLevels, checks: ProgramChecks): ScanResult {
  const { x, y, z, kind, flags, tool, feed, line, arcs } = moves;
  const n = moves.count;
  const graph = levels.throughZ !== null ? new CutGraph(levels.chainToleranceMm, levels.throughZ, Math.max(1 << 14, n >> 2)) : null;
  const band = graph && levels.bandTopZ !== null && levels.throughZ !== null
    ? new BandCollector(graph, levels.throughZ, levels.bandTopZ, levels.stockTopZ ?? Infinity, levels.tabMaxLengthMm)
    : null;
  const bandTop = levels.bandTopZ ?? -Infinity;
  const chords = new ArcChords();
  const ext = new Float64Array(4);
  const m = checks.m;
  const toolFirstLine = new Map<number, number>();
  const firstThroughByTool = new Map<number, number>();
  let lastTool = -1;
  let px = moves.startX, py = moves.startY, pz = moves.startZ;
  let arcCursor = 0;
  const throughZ = levels.throughZ ?? -Infinity;

  for (let i = 0; i < n; i++) {
    const k = kind[i];
    const x1 = x[i], y1 = y[i], z1 = z[i];
    if (k > MoveKind.arc) {
      if (band && k !== MoveKind.dwell) band.breakRun();
      px = x1; py = y1; pz = z1;
      continue;
    }
    const t = tool[i];
    const spindleOn = (flags[i] & MoveFlag.spindleOn) !== 0;
    let zLo = pz < z1 ? pz : z1;
    let bx0 = px < x1 ? px : x1, bx1 = px < x1 ? x1 : px;
    let by0 = py < y1 ? py : y1, by1 = py < y1 ? y1 : py;
    if (k === MoveKind.rapid) {
      if (band) band.breakRun();
    } else {
      if (t !== lastTool) {
        if (!toolFirstLine.has(t)) toolFirstLine.set(t, line[i]);
        lastTool = t;
      }
      if (zLo <= throughZ && !firstThroughByTool.has(t)) firstThroughByTool.set(t, i);
      if (k === MoveKind.feed) {
        if (band) band.segment(px, py, pz, x1, y1, z1, i, t);
      } else {
        while (arcCursor < arcs.count && arcs.move[arcCursor] < i) arcCursor++;
        const isArc = arcCursor < arcs.count && arcs.move[arcCursor] === i;
        if (isArc && band && arcs.plane[arcCursor] === 0 && pz === z1 && z1 <= bandTop) {
          // a flat arc near the bottom stays an arc in the graph
          const cx = arcs.cx[arcCursor], cy = arcs.cy[arcCursor], r = arcs.radius[arcCursor], sw = arcs.sweep[arcCursor];
          const a0 = Math.atan2(py - cy, px - cx);
          band.arc(px, py, x1, y1, z1, cx, cy, r, a0, sw, i, t);
          arcExtent(cx, cy, r, a0, sw, ext);
          if (ext[0] < bx0) bx0 = ext[0];
          if (ext[1] < by0) by0 = ext[1];
          if (ext[2] > bx1) bx1 = ext[2];
          if (ext[3] > by1) by1 = ext[3];
        } else if (isArc && arcs.plane[arcCursor] === 0 && pz === z1 && !(band && band.isArmed)) {
          // a flat arc away from the bottom, no tab rise pending: its exact extent is all the checks need
          const cx = arcs.cx[arcCursor], cy = arcs.cy[arcCursor];
          arcExtent(cx, cy, arcs.radius[arcCursor], Math.atan2(py - cy, px - cx), arcs.sweep[arcCursor], ext);
          if (ext[0] < bx0) bx0 = ext[0];
          if (ext[1] < by0) by0 = ext[1];
          if (ext[2] > bx1) bx1 = ext[2];
          if (ext[3] > by1) by1 = ext[3];
        } else if (isArc) {
          // exact chords near the bottom; coarser ones suffice for the extent checks
          const near = zLo <= bandTop;
          chords.flatten(arcs, arcCursor, px, py, pz, x1, y1, z1, near ? levels.arcToleranceMm : levels.arcToleranceMm * 10);
          const cx = chords.x, cy = chords.y, cz = chords.z, m = chords.count;
          for (let j = 1; j < m; j++) {
            if (band) band.segment(cx[j - 1], cy[j - 1], cz[j - 1], cx[j], cy[j], cz[j], i, t);
            if (cx[j] < bx0) bx0 = cx[j];
            if (cx[j] > bx1) bx1 = cx[j];
            if (cy[j] < by0) by0 = cy[j];
            if (cy[j] > by1) by1 = cy[j];
            if (cz[j] < zLo) zLo = cz[j];
          }
        } else if (band) {
          band.segment(px, py, pz, x1, y1, z1, i, t);
        }
      }
    }
    m[0] = px; m[1] = py; m[2] = pz; m[3] = x1; m[4] = y1; m[5] = z1;
    m[6] = bx0; m[7] = by0; m[8] = bx1; m[9] = by1; m[10] = zLo; m[11] = feed[i];
    checks.motion(line[i], k, spindleOn, t, (flags[i] & MoveFlag.cannedCycle) !== 0);
    px = x1; py = y1; pz = z1;
  }
  checks.finish();
  return { graph, firstThroughByTool, toolFirstLine };
}
