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

export function scanMoves(moves: MoveList, levels: ScanLevels, checks: ProgramChecks): ScanResult {
  const { x, y, z, kind, flags, tool, feed, line, arcs } = moves;
  const n = moves.count;
  const graph = levels.throughZ !== null ? new CutGraph(levels.chainToleranceMm, levels.throughZ) : null;
  const band = graph && levels.bandTopZ !== null && levels.throughZ !== null
    ? new BandCollector(graph, levels.throughZ, levels.bandTopZ, levels.stockTopZ ?? Infinity, levels.tabMaxLengthMm)
    : null;
  const bandTop = levels.bandTopZ ?? -Infinity;
  const chords = new ArcChords();
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
        if (arcCursor < arcs.count && arcs.move[arcCursor] === i) {
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
    checks.motion(line[i], k, px, py, pz, x1, y1, z1, bx0, by0, bx1, by1, zLo, spindleOn, feed[i], t);
    px = x1; py = y1; pz = z1;
  }
  checks.finish();
  return { graph, firstThroughByTool, toolFirstLine };
}
