// Cut order: once a part's outside profile is through, the part can shift, so any cut in the
// stock inside that part's outline afterwards (a hole, a pocket, a nested part) is a
// `cut-order` error naming both lines. A second pass, from the first freeing move on, with the
// freed parts in a coarse grid so that each move tests only the parts under it.
import { MoveKind, type MoveList } from '@/lib/gcode/move-list';
import { THROWN_PIECE, type FindingSink } from './findings';
import { pointInRegion } from '../geometry/polygons';
import { cellOf } from '../shapes/nesting';
import type { BuiltPart } from '../shapes/parts';

export function checkCutOrder(moves: MoveList, parts: BuiltPart[], stockTopZ: number, toleranceMm: number, sink: FindingSink): void {
  const freed = parts.filter((p) => p.freedMove >= 0);
  if (freed.length === 0) return;
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity, firstMove = Infinity;
  for (const p of freed) {
    const b = p.part.bbox;
    minX = Math.min(minX, b.minX); minY = Math.min(minY, b.minY);
    maxX = Math.max(maxX, b.maxX); maxY = Math.max(maxY, b.maxY);
    firstMove = Math.min(firstMove, p.freedMove);
  }
  const side = Math.min(256, Math.max(1, Math.ceil(Math.sqrt(freed.length) * 2)));
  const cw = Math.max((maxX - minX) / side, 1e-6), ch = Math.max((maxY - minY) / side, 1e-6);
  const cells: number[][] = Array.from({ length: side * side }, () => []);
  freed.forEach((p, idx) => {
    const b = p.part.bbox;
    for (let gx = cellOf(b.minX, minX, cw, side); gx <= cellOf(b.maxX, minX, cw, side); gx++)
      for (let gy = cellOf(b.minY, minY, ch, side); gy <= cellOf(b.maxY, minY, ch, side); gy++) cells[gy * side + gx].push(idx);
  });
  const firstLine = new Int32Array(freed.length).fill(-1);
  const lastLine = new Int32Array(freed.length).fill(-1);
  const { x, y, z, kind, line } = moves;
  const limitZ = stockTopZ - toleranceMm;
  // local copies: an imported enum is read through an accessor on every use
  const FEED = MoveKind.feed, ARC = MoveKind.arc;
  for (let i = firstMove + 1; i < moves.count; i++) {
    const k = kind[i];
    if (k !== FEED && k !== ARC) continue;
    const px = x[i], py = y[i];
    if (z[i] >= limitZ || px < minX || px > maxX || py < minY || py > maxY) continue;
    const list = cells[cellOf(py, minY, ch, side) * side + cellOf(px, minX, cw, side)];
    for (let j = 0; j < list.length; j++) {
      const idx = list[j];
      const p = freed[idx];
      if (i <= p.freedMove) continue;
      const b = p.part.bbox;
      if (px <= b.minX || px >= b.maxX || py <= b.minY || py >= b.maxY) continue;
      if (!pointInRegion(px, py, p.outline, p.outlineAreas)) continue;
      if (firstLine[idx] < 0) firstLine[idx] = line[i];
      lastLine[idx] = line[i];
    }
  }
  freed.forEach((p, idx) => {
    if (firstLine[idx] < 0) return;
    const at = p.part.freedAtLine;
    const span = lastLine[idx] > firstLine[idx] ? `From this line to line ${lastLine[idx]} the program cuts` : 'This line cuts';
    sink.add('cut-order', 'error', firstLine[idx],
      `${span} inside part ${p.part.id} after its outside profile went through at line ${at}. Once the outside is through the part can shift or be thrown. ${THROWN_PIECE} Cut inside features (holes, pockets) before the outside profile.`,
      p.part.id);
  });
}
