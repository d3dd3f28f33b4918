// The single pass over the move list: walks every move once on the typed arrays, feeds the
// chords near the sheet bottom to the cut graph and every motion to the program checks, and
// notes for each tool the first move that cut through (for the sheet-lift check).
import { MoveFlag, MoveKind, type MoveList } from '@/lib/gcode/move-list';
import { ArcChords } from './arc-chords';
import { BandCollector } from '../graph/band';
import { ArcSlot, CutGraph, PieceSlot, SUB_ARC_RAD } from '../graph/cut-graph';
import { MoveSlot, type ProgramChecks } from '../checks/program-checks';

// The kinds and flags as plain numbers: read through the import on every move, each access is a
// call to the module loader's export getter, which V8 does not inline (tens of ms per pass).
const RAPID: number = MoveKind.rapid;
const FEED: number = MoveKind.feed;
const ARC: number = MoveKind.arc;
const DWELL: number = MoveKind.dwell;
const SPINDLE_ON: number = MoveFlag.spindleOn;
const CANNED: number = MoveFlag.cannedCycle;
// The slots of the buffers this pass fills, copied for the same reason: the move for the checks
// (MoveSlot), a chord for the band (PieceSlot), a flat arc for the band (ArcSlot).
const M_X0 = MoveSlot.x0, M_Y0 = MoveSlot.y0, M_Z0 = MoveSlot.z0, M_X1 = MoveSlot.x1, M_Y1 = MoveSlot.y1, M_Z1 = MoveSlot.z1;
const M_MIN_X = MoveSlot.minX, M_MIN_Y = MoveSlot.minY, M_MAX_X = MoveSlot.maxX, M_MAX_Y = MoveSlot.maxY, M_Z_LO = MoveSlot.zLo, M_FEED = MoveSlot.feedMmPerMin;
const M_COARSE_MIN_X = MoveSlot.coarseMinX, M_COARSE_MIN_Y = MoveSlot.coarseMinY, M_COARSE_MAX_X = MoveSlot.coarseMaxX, M_COARSE_MAX_Y = MoveSlot.coarseMaxY;
const S_X0 = PieceSlot.x0, S_Y0 = PieceSlot.y0, S_Z0 = PieceSlot.z0, S_X1 = PieceSlot.x1, S_Y1 = PieceSlot.y1, S_Z1 = PieceSlot.z1;
const A_X0 = ArcSlot.x0, A_Y0 = ArcSlot.y0, A_X1 = ArcSlot.x1, A_Y1 = ArcSlot.y1, A_Z = ArcSlot.z, A_CX = ArcSlot.cx, A_CY = ArcSlot.cy, A_R = ArcSlot.r, A_A0 = ArcSlot.a0, A_SWEEP = ArcSlot.sweep;

export interface ScanLevels {
  /** null when no sheet is given: no through-cut graph */
  throughZ: number | null;
  bandTopZ: number | null;
  stockTopZ: number | null;
  chainToleranceMm: number;
  chordToleranceMm: number;
  tabMaxLengthMm: number;
}

export interface ScanResult {
  graph: CutGraph | null;
  /** tool number → first move index that cut through */
  firstThroughByTool: Map<number, number>;
  /** tool number → first line of a cutting move with it */
  toolFirstLine: Map<number, number>;
}

/**
 * XY extent of an arc: its end points and the axis crossings its sweep passes. In: centre x,
 * centre y, radius, start angle, signed sweep in io[0..4]; out: minX minY maxX maxY in io[0..3]
 * (numbers through the array: a call that is not inlined boxes each double argument)
 */
function arcExtent(io: Float64Array): void {
  const cx = io[0], cy = io[1], r = io[2], a0 = io[3], sweep = io[4];
  const a1 = a0 + sweep;
  let minX = Math.min(cx + r * Math.cos(a0), cx + r * Math.cos(a1));
  let maxX = Math.max(cx + r * Math.cos(a0), cx + r * Math.cos(a1));
  let minY = Math.min(cy + r * Math.sin(a0), cy + r * Math.sin(a1));
  let maxY = Math.max(cy + r * Math.sin(a0), cy + r * Math.sin(a1));
  const lo = Math.min(a0, a1), hi = Math.max(a0, a1);
  for (let quarter = Math.ceil(lo / (Math.PI / 2)); quarter * (Math.PI / 2) <= hi; quarter++) {
    const q = ((quarter % 4) + 4) % 4;
    if (q === 0) maxX = cx + r;
    else if (q === 1) maxY = cy + r;
    else if (q === 2) minX = cx - r;
    else minY = cy - r;
  }
  io[0] = minX; io[1] = minY; io[2] = maxX; io[3] = maxY;
}

/**
 * A flat arc: arc c of the table, its move's start and end in m (MoveSlot x0 … z1) and the XY
 * box of its end points in m (MoveSlot minX … maxY), which this widens to the arc's path. When the square about the circle,
 * joined with the end points, already gives every check the answer the exact extent would
 * (ProgramChecks.coarseBoxSuffices), that square is the box, with no sine or cosine; else the
 * exact extent. With arcIo given, also lays the arc out for BandCollector.arc.
 */
function flatArc(arcs: MoveList['arcs'], c: number, m: Float64Array, ext: Float64Array, arcIo: Float64Array | null, checks: ProgramChecks, tool: number): void {
  const px = m[M_X0], py = m[M_Y0];
  const cx = arcs.cx[c], cy = arcs.cy[c], r = arcs.radius[c], sw = arcs.sweep[c];
  let a0 = NaN;
  if (arcIo !== null) {
    a0 = Math.atan2(py - cy, px - cx);
    arcIo[A_X0] = px; arcIo[A_Y0] = py; arcIo[A_X1] = m[M_X1]; arcIo[A_Y1] = m[M_Y1]; arcIo[A_Z] = m[M_Z1];
    arcIo[A_CX] = cx; arcIo[A_CY] = cy; arcIo[A_R] = r; arcIo[A_A0] = a0; arcIo[A_SWEEP] = sw;
  }
  // the square about the circle holds the exact extent: each point is cx + r·cos(a) with
  // cos(a) ≥ −1, and rounding keeps that order (the axis crossings are cx ± r exactly)
  if (r >= 0) {
    const lo = cx - r, hi = cx + r, loY = cy - r, hiY = cy + r;
    m[M_COARSE_MIN_X] = m[M_MIN_X] < lo ? m[M_MIN_X] : lo;
    m[M_COARSE_MIN_Y] = m[M_MIN_Y] < loY ? m[M_MIN_Y] : loY;
    m[M_COARSE_MAX_X] = m[M_MAX_X] > hi ? m[M_MAX_X] : hi;
    m[M_COARSE_MAX_Y] = m[M_MAX_Y] > hiY ? m[M_MAX_Y] : hiY;
    if (checks.coarseBoxSuffices(tool)) {
      m[M_MIN_X] = m[M_COARSE_MIN_X]; m[M_MIN_Y] = m[M_COARSE_MIN_Y]; m[M_MAX_X] = m[M_COARSE_MAX_X]; m[M_MAX_Y] = m[M_COARSE_MAX_Y];
      return;
    }
  }
  ext[0] = cx; ext[1] = cy; ext[2] = r; ext[3] = arcIo !== null ? a0 : Math.atan2(py - cy, px - cx); ext[4] = sw;
  arcExtent(ext);
  if (ext[0] < m[M_MIN_X]) m[M_MIN_X] = ext[0];
  if (ext[1] < m[M_MIN_Y]) m[M_MIN_Y] = ext[1];
  if (ext[2] > m[M_MAX_X]) m[M_MAX_X] = ext[2];
  if (ext[3] > m[M_MAX_Y]) m[M_MAX_Y] = ext[3];
}

/**
 * about how many edges (and points) the cut graph will get, and how many of them arcs: a cheap
 * pass over the moves counting the pieces near the bottom, so that its arrays are sized once
 * rather than grown (each growth copies all of them)
 */
function graphCapacity(moves: MoveList, bandTop: number): { edges: number; arcs: number } {
  const { z, kind, arcs } = moves;
  let pieces = 0, arcPieces = 0;
  let pz = moves.startZ;
  for (let i = 0; i < moves.count; i++) {
    const z1 = z[i];
    // a feed into the band splits at most twice: at the band top and at the through level
    if (kind[i] === FEED && (pz <= bandTop || z1 <= bandTop)) pieces += pz <= bandTop && z1 <= bandTop ? 1 : 3;
    pz = z1;
  }
  for (let c = 0; c < arcs.count; c++) {
    const i = arcs.move[c];
    const z0 = i > 0 ? z[i - 1] : moves.startZ;
    if (!(z0 <= bandTop || z[i] <= bandTop)) continue;
    // flat arcs become sub-arcs of SUB_ARC_RAD at most; others, chords: a guess, the arrays still grow
    const flat = arcs.plane[c] === 0 && z0 === z[i];
    const sub = flat ? Math.ceil(Math.abs(arcs.sweep[c]) / SUB_ARC_RAD) : 16;
    const n = sub >= 1 && sub <= 1024 ? sub : 16;
    pieces += n;
    if (flat) arcPieces += n;
  }
  return { edges: Math.max(1 << 14, pieces), arcs: arcPieces };
}

/**
 * The pass itself. Kept as one loop on purpose: its per-move state (the previous point, the
 * move's box, the arc cursor, the last tools) lives in locals, and a step split out into a
 * function would take those doubles as arguments (boxed when the call is not inlined) or keep
 * them in fields (stored boxed): the costs DEVELOPERS.md "Hot loops" measured on this pass. The
 * work that is not per move is already out of it (arcExtent, flatArc, graphCapacity, the checks).
 */
export function scanMoves(moves: MoveList, levels: ScanLevels, checks: ProgramChecks): ScanResult {
  const { x, y, z, kind, flags, tool, feed, line, arcs } = moves;
  const n = moves.count;
  const capacity = levels.throughZ !== null ? graphCapacity(moves, levels.bandTopZ ?? -Infinity) : null;
  const graph = capacity && levels.throughZ !== null ? new CutGraph(levels.chainToleranceMm, levels.throughZ, capacity.edges, capacity.arcs) : null;
  const band = graph && levels.bandTopZ !== null && levels.throughZ !== null
    ? new BandCollector(graph, levels.throughZ, levels.bandTopZ, levels.stockTopZ ?? Infinity, levels.tabMaxLengthMm)
    : null;
  const bandTop = levels.bandTopZ ?? -Infinity;
  const chords = new ArcChords();
  const tolNear = levels.chordToleranceMm, tolFar = levels.chordToleranceMm * 10;
  // Every double handed to a call that is not inlined goes through a typed array: as an
  // argument V8 would box it, and a loop variable passed so turns into a boxed one throughout,
  // allocating on every move. m holds the move for the checks (its start and end also feed
  // the arc chords), seg a chord for the band, arcIo a flat arc for the band, ext the arc extent.
  const m = checks.m;
  const seg = band ? band.io : new Float64Array(PieceSlot.size);
  const arcIo = band ? band.arcIo : new Float64Array(ArcSlot.size);
  const ext = new Float64Array(5);
  const toolFirstLine = new Map<number, number>();
  const firstThroughByTool = new Map<number, number>();
  let lastTool = -1;
  let lastThroughTool = -1;
  // the previous end point, kept in an array rather than loop variables: a loop variable that
  // starts from a property (or from an on-stack-replacement entry) is typed loosely, and V8
  // then boxes every double assigned to it, three per move
  const prev = new Float64Array([moves.startX, moves.startY, moves.startZ]);
  let arcCursor = 0;
  const throughZ = levels.throughZ ?? -Infinity;

  for (let i = 0; i < n; i++) {
    const moveKind = kind[i];
    const x1 = x[i], y1 = y[i], z1 = z[i];
    if (moveKind > ARC) {
      if (band && moveKind !== DWELL) band.breakRun();
      prev[0] = x1; prev[1] = y1; prev[2] = z1;
      continue;
    }
    const px = prev[0], py = prev[1], pz = prev[2];
    m[M_X0] = px; m[M_Y0] = py; m[M_Z0] = pz; m[M_X1] = x1; m[M_Y1] = y1; m[M_Z1] = z1;
    const t = tool[i];
    const fl = flags[i];
    let zLo = pz < z1 ? pz : z1;
    let bx0 = px < x1 ? px : x1, bx1 = px < x1 ? x1 : px;
    let by0 = py < y1 ? py : y1, by1 = py < y1 ? y1 : py;
    if (moveKind === RAPID) {
      if (band) band.breakRun();
    } else {
      if (t !== lastTool) {
        if (!toolFirstLine.has(t)) toolFirstLine.set(t, line[i]);
        lastTool = t;
      }
      if (zLo <= throughZ && t !== lastThroughTool) {
        // the map holds t from now on: look it up again only when the tool changes
        if (!firstThroughByTool.has(t)) firstThroughByTool.set(t, i);
        lastThroughTool = t;
      }
      if (moveKind === FEED) {
        // (a feed above the band with no tab rise pending is nothing to the band: skip the call)
        if (band && (zLo <= bandTop || band.isArmed)) {
          seg[S_X0] = px; seg[S_Y0] = py; seg[S_Z0] = pz; seg[S_X1] = x1; seg[S_Y1] = y1; seg[S_Z1] = z1;
          band.segment(i, t);
        }
      } else {
        while (arcCursor < arcs.count && arcs.move[arcCursor] < i) arcCursor++;
        const isArc = arcCursor < arcs.count && arcs.move[arcCursor] === i;
        const flat = isArc && arcs.plane[arcCursor] === 0 && pz === z1;
        const nearArc = flat && band !== null && z1 <= bandTop;
        if (nearArc || (flat && !(band && band.isArmed))) {
          // a flat arc near the bottom stays an arc in the graph; away from it, with no tab rise
          // pending, its exact extent is all the checks need
          m[M_MIN_X] = bx0; m[M_MIN_Y] = by0; m[M_MAX_X] = bx1; m[M_MAX_Y] = by1;
          flatArc(arcs, arcCursor, m, ext, nearArc ? arcIo : null, checks, t);
          if (nearArc && band) band.arc(i, t);
          bx0 = m[M_MIN_X]; by0 = m[M_MIN_Y]; bx1 = m[M_MAX_X]; by1 = m[M_MAX_Y];
        } else if (isArc) {
          // exact chords near the bottom; coarser ones suffice for the extent checks
          chords.flatten(arcs, arcCursor, m, zLo <= bandTop ? tolNear : tolFar);
          const cx = chords.x, cy = chords.y, cz = chords.z, cn = chords.count;
          for (let j = 1; j < cn; j++) {
            if (band) {
              seg[S_X0] = cx[j - 1]; seg[S_Y0] = cy[j - 1]; seg[S_Z0] = cz[j - 1]; seg[S_X1] = cx[j]; seg[S_Y1] = cy[j]; seg[S_Z1] = cz[j];
              band.segment(i, t);
            }
            if (cx[j] < bx0) bx0 = cx[j];
            if (cx[j] > bx1) bx1 = cx[j];
            if (cy[j] < by0) by0 = cy[j];
            if (cy[j] > by1) by1 = cy[j];
            if (cz[j] < zLo) zLo = cz[j];
          }
        } else if (band) {
          seg[S_X0] = px; seg[S_Y0] = py; seg[S_Z0] = pz; seg[S_X1] = x1; seg[S_Y1] = y1; seg[S_Z1] = z1;
          band.segment(i, t);
        }
      }
    }
    m[M_MIN_X] = bx0; m[M_MIN_Y] = by0; m[M_MAX_X] = bx1; m[M_MAX_Y] = by1; m[M_Z_LO] = zLo; m[M_FEED] = feed[i];
    checks.motion(line[i], moveKind, (fl & SPINDLE_ON) !== 0, t, (fl & CANNED) !== 0);
    prev[0] = x1; prev[1] = y1; prev[2] = z1;
  }
  checks.finish();
  return { graph, firstThroughByTool, toolFirstLine };
}
