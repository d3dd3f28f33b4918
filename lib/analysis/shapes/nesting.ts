// Nests the closed loops by containment (point in polygon on the tool-centre rings):
// a loop inside nothing, or inside a hole, bounds a part; a loop inside a part is a hole.
// Two loops so close that the kerf leaves no material between them (a finishing pass beside
// a roughing pass) are one cut and are merged.
import { gridBoxMm, nearRing, pointInRing, SCALE, type Path } from '../geometry/polygons';
import type { LoopShape } from './loop-shapes';
import { AREA_CHORD_MM, type LoopInfo } from './loops';
import { grownI32 } from '../typed-arrays';
import type { BBox } from '../types';

// a module-level copy: an imported binding is read through an accessor on every use
const GRID = SCALE;

export interface LoopNode {
  info: LoopInfo;
  /** the tool-centre loop's outline (shared by congruent copies) and its origin on the grid */
  shape: LoopShape;
  ox: number;
  oy: number;
  /** the loop at its place as a Clipper path, made when first read (for offsets) */
  readonly path: Path;
  readonly areaMm2: number;
  readonly perimeterMm: number;
  /** tool-centre box in mm */
  readonly bbox: BBox;
  radiusMm: number;
  depth: number;
  parent: number;
  children: number[];
}

export function nestLoops(infos: LoopInfo[], radiusOf: (tool: number) => number, toleranceMm: number): LoopNode[] {
  const all: LoopNode[] = new Array(infos.length);
  for (let i = 0; i < infos.length; i++) {
    const info = infos[i];
    all[i] = loopNode(info, info.shape, info.ox, info.oy, radiusOf(info.tool));
  }
  all.sort(byAreaDescending);
  // a uniform grid of the kept loops' boxes: a loop's container must cover the cell of its
  // origin (a point of the loop); each cell lists its loops newest first (a linked list on
  // typed arrays), so the smallest candidate container is tried first
  // (in grid units, from each shape's box and origin: whole numbers, no box object per loop)
  let gx0 = Infinity, gy0 = Infinity, gx1 = -Infinity, gy1 = -Infinity;
  for (const n of all) {
    const b = n.shape.box;
    if (b[0] + n.ox < gx0) gx0 = b[0] + n.ox;
    if (b[1] + n.oy < gy0) gy0 = b[1] + n.oy;
    if (b[2] + n.ox > gx1) gx1 = b[2] + n.ox;
    if (b[3] + n.oy > gy1) gy1 = b[3] + n.oy;
  }
  const side = Math.max(1, Math.min(256, Math.ceil(Math.sqrt(all.length))));
  const cw = Math.max((gx1 - gx0) / side, 1e-9), ch = Math.max((gy1 - gy0) / side, 1e-9);
  const head = new Int32Array(side * side).fill(-1);
  let entryNode = new Int32Array(4 * all.length + 16);
  let entryNext = new Int32Array(entryNode.length);
  let entries = 0;
  const kept: LoopNode[] = [];
  for (let i = 0; i < all.length; i++) {
    const node = all[i];
    let parent = -1;
    const c0 = cellOf(node.ox, gx0, cw, side), r0 = cellOf(node.oy, gy0, ch, side);
    for (let k = head[r0 * side + c0]; k >= 0; k = entryNext[k]) {
      const j = entryNode[k];
      if (contains(kept[j], node, toleranceMm)) {
        parent = j;
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
    const b = node.shape.box, ox = node.ox, oy = node.oy;
    const ra = cellOf(b[1] + oy, gy0, ch, side), rb = cellOf(b[3] + oy, gy0, ch, side);
    const ca = cellOf(b[0] + ox, gx0, cw, side), cb = cellOf(b[2] + ox, gx0, cw, side);
    for (let r = ra; r <= rb; r++)
      for (let c = ca; c <= cb; c++) {
        if (entries === entryNode.length) {
          entryNode = grownI32(entryNode, 2 * entryNode.length);
          entryNext = grownI32(entryNext, 2 * entryNext.length);
        }
        const cell = r * side + c;
        entryNode[entries] = id;
        entryNext[entries] = head[cell];
        head[cell] = entries++;
      }
  }
  return kept;
}

/** the cell of v on a grid of `side` cells of `size` from lo, clamped to the grid */
export function cellOf(v: number, lo: number, size: number, side: number): number {
  const k = Math.floor((v - lo) / size);
  return k < 0 ? 0 : k >= side ? side - 1 : k;
}

/** (−1, 0 or 1: a difference of doubles handed back to the sort would be boxed on every compare) */
function byAreaDescending(a: LoopNode, b: LoopNode): number {
  return b.areaMm2 > a.areaMm2 ? 1 : b.areaMm2 < a.areaMm2 ? -1 : 0;
}

function contains(outer: LoopNode, inner: LoopNode, tol: number): boolean {
  // the boxes in outer's frame, in grid units (whole numbers: exact)
  const a = outer.shape.box, b = inner.shape.box;
  const dx = inner.ox - outer.ox, dy = inner.oy - outer.oy;
  const t = tol * GRID;
  if (b[0] + dx < a[0] - t || b[2] + dx > a[2] + t || b[1] + dy < a[1] - t || b[3] + dy > a[3] + t) return false;
  // inner's points, moved into outer's frame (whole grid units: the test is exact either way)
  const xs = inner.shape.ring.x, ys = inner.shape.ring.y;
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

/**
 * a placed loop in the nesting; its area and perimeter are its shape's, and its box and Clipper
 * path are made when first read (a finding's text, the offsets): thousands of loops live
 * through the analysis, and each number or object kept on them is copied by the collector
 */
class Node implements LoopNode {
  depth = 0;
  parent = -1;
  children: number[] = [];
  private clipperPath: Path | null = null;
  private box: BBox | null = null;

  constructor(readonly info: LoopInfo, readonly shape: LoopShape, readonly ox: number, readonly oy: number, readonly radiusMm: number) {}

  get areaMm2(): number { return this.shape.areaMm2; }
  get perimeterMm(): number { return this.shape.perimeterMm; }

  get bbox(): BBox {
    if (this.box) return this.box;
    return (this.box = gridBoxMm(this.shape.box, this.ox, this.oy));
  }

  get path(): Path {
    if (this.clipperPath) return this.clipperPath;
    const { x, y } = this.shape.ring;
    const path: Path = new Array(x.length);
    for (let i = 0; i < x.length; i++) path[i] = { x: x[i] + this.ox, y: y[i] + this.oy };
    return (this.clipperPath = path);
  }
}

/** the node of one placed loop, not yet nested */
export function loopNode(info: LoopInfo, shape: LoopShape, ox: number, oy: number, radiusMm: number): LoopNode {
  return new Node(info, shape, ox, oy, radiusMm);
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
