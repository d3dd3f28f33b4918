// Nests the closed loops by containment (point in polygon on the tool-centre rings):
// a loop inside nothing, or inside a hole, bounds a part; a loop inside a part is a hole.
// Two loops so close that the kerf leaves no material between them (a finishing pass beside
// a roughing pass) are one cut and are merged.
import { nearRing, pointInRing, SCALE, type Path } from './geometry';
import type { LoopShape } from './loop-shapes';
import { AREA_CHORD_MM, type LoopInfo } from './loops';
import type { BBox } from './types';

export interface LoopNode {
  info: LoopInfo;
  /** the tool-centre loop's outline (shared by congruent copies) and its origin on the grid */
  shape: LoopShape;
  ox: number;
  oy: number;
  /** the loop at its place as a Clipper path, made when first read (for offsets) */
  readonly path: Path;
  areaMm2: number;
  perimeterMm: number;
  bbox: BBox;
  radiusMm: number;
  depth: number;
  parent: number;
  children: number[];
}

export function nestLoops(infos: LoopInfo[], radiusOf: (tool: number) => number, toleranceMm: number): LoopNode[] {
  const all: LoopNode[] = infos.map((info) => loopNode(info, info.shape, info.ox, info.oy, radiusOf(info.tool)));
  all.sort((a, b) => b.areaMm2 - a.areaMm2);
  // a uniform grid of the kept loops' boxes: a loop's container must cover the cell of its first point
  let gx0 = Infinity, gy0 = Infinity, gx1 = -Infinity, gy1 = -Infinity;
  for (const n of all) {
    gx0 = Math.min(gx0, n.bbox.minX); gy0 = Math.min(gy0, n.bbox.minY);
    gx1 = Math.max(gx1, n.bbox.maxX); gy1 = Math.max(gy1, n.bbox.maxY);
  }
  const side = Math.max(1, Math.min(256, Math.ceil(Math.sqrt(all.length))));
  const cw = Math.max((gx1 - gx0) / side, 1e-9), ch = Math.max((gy1 - gy0) / side, 1e-9);
  const col = (x: number) => Math.min(side - 1, Math.max(0, Math.floor((x - gx0) / cw)));
  const row = (y: number) => Math.min(side - 1, Math.max(0, Math.floor((y - gy0) / ch)));
  const cells: number[][] = Array.from({ length: side * side }, () => []);
  const kept: LoopNode[] = [];
  for (let i = 0; i < all.length; i++) {
    const node = all[i];
    let parent = -1;
    const list = cells[row(node.oy / SCALE) * side + col(node.ox / SCALE)];
    for (let j = list.length - 1; j >= 0; j--) {
      if (contains(kept[list[j]], node, toleranceMm)) {
        parent = list[j];
        break;
      }
    }
    if (parent >= 0) {
      const p = kept[parent];
      const gap = p.areaMm2 - node.areaMm2;
      // the same contour twice: no material between them, and about the same size (a hole that
      // eats its part is not the part's twin)
      if (gap <= p.perimeterMm * (p.radiusMm + node.radiusMm + toleranceMm) && node.areaMm2 >= 0.9 * p.areaMm2) {
        mergeInto(p, node);
        continue;
      }
      node.parent = parent;
      node.depth = p.depth + 1;
      p.children.push(kept.length);
    }
    const id = kept.length;
    kept.push(node);
    for (let r = row(node.bbox.minY); r <= row(node.bbox.maxY); r++)
      for (let c = col(node.bbox.minX); c <= col(node.bbox.maxX); c++) cells[r * side + c].push(id);
  }
  return kept;
}

function contains(outer: LoopNode, inner: LoopNode, tol: number): boolean {
  const a = outer.bbox, b = inner.bbox;
  if (b.minX < a.minX - tol || b.maxX > a.maxX + tol || b.minY < a.minY - tol || b.maxY > a.maxY + tol) return false;
  // inner's points, moved into outer's frame (whole grid units: the test is exact either way)
  const xs = inner.shape.ring.x, ys = inner.shape.ring.y;
  const dx = inner.ox - outer.ox, dy = inner.oy - outer.oy;
  const ring = outer.shape.ring;
  const n = xs.length;
  const step = Math.max(1, Math.floor(n / 5));
  for (let k = 0; k < n; k += step) {
    const px = xs[k] + dx, py = ys[k] + dy;
    const r = pointInRing(px, py, ring);
    // both loops are drawn within AREA_CHORD_MM of their true curves: closer than that is the same line
    if (r === 1 || (r === 0 && !nearRing(px, py, ring, AREA_CHORD_MM + tol))) return r === 1;
  }
  return true;
}

/** the node of one placed loop, not yet nested */
export function loopNode(info: LoopInfo, shape: LoopShape, ox: number, oy: number, radiusMm: number): LoopNode {
  let path: Path | null = null;
  const box = shape.box;
  return {
    info, shape, ox, oy,
    get path() {
      if (path) return path;
      const { x, y } = shape.ring;
      path = new Array(x.length);
      for (let i = 0; i < x.length; i++) path[i] = { X: x[i] + ox, Y: y[i] + oy };
      return path;
    },
    areaMm2: shape.areaMm2, perimeterMm: shape.perimeterMm,
    bbox: { minX: (box[0] + ox) / SCALE, minY: (box[1] + oy) / SCALE, maxX: (box[2] + ox) / SCALE, maxY: (box[3] + oy) / SCALE },
    radiusMm, depth: 0, parent: -1, children: [],
  };
}

/** the merged cut frees the part as soon as either loop is through all round */
function mergeInto(keep: LoopNode, other: LoopNode): void {
  const a = keep.info, b = other.info;
  if (b.freedMove >= 0 && (a.freedMove < 0 || b.freedMove < a.freedMove)) {
    a.freedMove = b.freedMove;
    a.tool = b.tool;
    a.tabs = [];
    a.skinMm = 0;
  }
  a.firstMove = Math.min(a.firstMove, b.firstMove);
  a.completedMove = Math.max(a.completedMove, b.completedMove);
}
