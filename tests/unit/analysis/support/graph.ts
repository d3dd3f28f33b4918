// Test drawing helpers for the cut graph: a piece or an arc given as numbers, written into a
// buffer by its named slots (PieceSlot, ArcSlot), then added as the move pass adds them.
import { ArcSlot, PieceSlot, type CutGraph } from '@/lib/analysis/graph/cut-graph';

export function addPiece(g: CutGraph, x0: number, y0: number, z0: number, x1: number, y1: number, z1: number, move: number, tool: number): void {
  const p = new Float64Array(PieceSlot.size);
  p[PieceSlot.x0] = x0; p[PieceSlot.y0] = y0; p[PieceSlot.z0] = z0;
  p[PieceSlot.x1] = x1; p[PieceSlot.y1] = y1; p[PieceSlot.z1] = z1;
  g.piece(p, 0, move, tool);
}

/** a flat XY arc at height z from (x0, y0) about (cx, cy), radius r, start angle a0, signed sweep, ending at (x1, y1) */
export function addArc(g: CutGraph, x0: number, y0: number, x1: number, y1: number, z: number, cx: number, cy: number, r: number, a0: number, sweep: number, move: number, tool: number): void {
  const a = new Float64Array(ArcSlot.size);
  a[ArcSlot.x0] = x0; a[ArcSlot.y0] = y0; a[ArcSlot.x1] = x1; a[ArcSlot.y1] = y1; a[ArcSlot.z] = z;
  a[ArcSlot.cx] = cx; a[ArcSlot.cy] = cy; a[ArcSlot.r] = r; a[ArcSlot.a0] = a0; a[ArcSlot.sweep] = sweep;
  g.arc(a, move, tool);
}
