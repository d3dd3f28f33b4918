// Parts, holes and slugs from the nested loops. A part is the region a round cutter leaves:
// its loop's interior shrunk by the tool radius, minus each hole's interior grown by its tool
// radius (Clipper offsets with round joins, then a difference). A hole's slug is the hole's
// interior shrunk by the radius, minus any part nested inside it. Each gets its hold verdict.
// Loops that repeat (a nest of copies) reuse the Clipper results of the first copy
// (shape-cache); a slug's exact area is worked out only when its verdict or its finding's
// text needs it, from the bounds A − r·P ≤ slug ≤ A of the hole's interior A and perimeter P.
import { FindingSink, fmt, THROWN_PIECE } from '../checks/findings';
import { differencePaths, gridBoxMm, isConvex, offsetPaths, pathInside, pathPerimeterMm, pathsAreaMm2, pathsBBox, pathsGridBox, type GridBox, type Paths } from '../geometry/polygons';
import { freedPieceHeld, freedPieceHold } from '../checks/hold';
import type { LoopNode } from './nesting';
import type { LoopShape } from './loop-shapes';
import { hashKey, ScratchKey, ShapeCache, translatePath, type ShapeKey } from './shape-cache';
import type { AnalysisSettings } from '../settings';
import type { AnalysisPart, BBox, HoldDownMethod } from '../types';

/** below this a "part" is only kerf: nothing is left between the cuts */
const MIN_PART_AREA_MM2 = 0.5;

export interface BuiltPart {
  part: AnalysisPart;
  node: LoopNode;
  /** outer boundary of the finished part (the tool-centre loop shrunk by the radius), made when first read */
  readonly outline: Paths;
  outlineAreas: number[];
  freedMove: number;
  sortMove: number;
}

export interface PartContext {
  /** null: no hold-down was named */
  method: HoldDownMethod | null;
  vacuumKpa: number;
  settings: AnalysisSettings;
  line: Uint32Array;
}

/** what the Clipper work gives for one part */
interface PartShape {
  outline: Paths;
  outlineAreas: number[];
  areaMm2: number;
  perimeterMm: number;
}

/** a part shape relative to its key's origin, with the outline's grid box */
type RelShape = PartShape & { box: GridBox | null };

/**
 * a part shape at its place: the outline paths are only made if asked for (the cut-order
 * check). A class, not an object with closures: thousands are made per program.
 */
class PlacedShape {
  private paths: Paths | null = null;
  readonly bbox: BBox | null;

  constructor(private readonly rel: RelShape, private readonly ox: number, private readonly oy: number) {
    const b = rel.box;
    this.bbox = b && gridBoxMm(b, ox, oy);
  }

  get outlineAreas(): number[] { return this.rel.outlineAreas; }
  get areaMm2(): number { return this.rel.areaMm2; }
  get perimeterMm(): number { return this.rel.perimeterMm; }

  outline(): Paths {
    if (this.paths) return this.paths;
    const out: Paths = [];
    for (const p of this.rel.outline) out.push(translatePath(p, this.ox, this.oy));
    return (this.paths = out);
  }
}

/** the finished part of a loop and its holes: outline shrunk by the radius, grown holes taken off */
function partShape(node: LoopNode, holeNodes: LoopNode[]): PartShape {
  const r = node.radiusMm;
  if (r > 0 && holeNodes.length > 0 && holeNodes.every((h) => h.radiusMm === r)) {
    // one tool for the outline and the holes: the part is the region between them shrunk by the
    // radius (erosion of A − H by a disc is A eroded minus H dilated), one offset of the loop
    // with its holes turned clockwise, where Clipper's union resolves holes that reach the edge
    const paths = [node.path];
    for (const h of holeNodes) paths.push(h.path.slice().reverse());
    const region = offsetPaths(paths, -r);
    return withOutline(region.filter((p) => pathsAreaMm2([p]) > 0), pathsAreaMm2(region));
  }
  const outline = offsetPaths([node.path], -r);
  const grown: Paths = [];
  for (const h of holeNodes) grown.push(...offsetPaths([h.path], h.radiusMm));
  return withOutline(outline, materialArea(outline, grown));
}

/** the part's outline with each path's signed area, and the perimeter of its outer paths */
function withOutline(outline: Paths, areaMm2: number): PartShape {
  const outlineAreas = outline.map((p) => pathsAreaMm2([p]));
  let perimeterMm = 0;
  outline.forEach((p, i) => { if (outlineAreas[i] > 0) perimeterMm += pathPerimeterMm(p); });
  return { outline, outlineAreas, areaMm2, perimeterMm };
}

/**
 * partShape through the cache: the same loop and holes moved elsewhere give the same shape,
 * moved. The key is the part's outline shape and tool radius, then each hole's shape, offset
 * from the part's origin and radius (holes in a fixed order), so a copy is found from a few
 * numbers; the shapes themselves were matched point for point when the loops were placed.
 */
export class PartShapes {
  readonly parts = new ShapeCache<RelShape>();
  readonly slugs = new ShapeCache<number>();
  private readonly ids = new Map<LoopShape, number>();
  /** the key being looked up, in a buffer reused from part to part (copied only into the cache) */
  private readonly scratch = new ScratchKey();

  private idOf(shape: LoopShape): number {
    let id = this.ids.get(shape);
    if (id === undefined) {
      id = this.ids.size;
      this.ids.set(shape, id);
    }
    return id;
  }

  /**
   * the key of a loop with the loops inside it, relative to the first one's origin: the probe,
   * valid until the next call (put() a copy)
   */
  private key(outer: LoopNode, inner: LoopNode[]): ShapeKey {
    const data = this.scratch.data(3 + 4 * inner.length);
    data[0] = this.idOf(outer.shape);
    data[1] = outer.radiusMm;
    data[2] = inner.length;
    const order = inner.length < 2 ? inner : inner.slice().sort((a, b) => a.ox - b.ox || a.oy - b.oy || this.idOf(a.shape) - this.idOf(b.shape));
    let o = 3;
    for (const h of order) {
      data[o++] = this.idOf(h.shape);
      data[o++] = h.ox - outer.ox;
      data[o++] = h.oy - outer.oy;
      data[o++] = h.radiusMm;
    }
    return this.scratch.key(hashKey(data, 1, 1, 1e6), data, outer.ox, outer.oy);
  }

  part(node: LoopNode, holeNodes: LoopNode[]): PlacedShape {
    const k = this.key(node, holeNodes);
    let rel = this.parts.find(k);
    if (!rel) {
      const s = partShape(node, holeNodes);
      const outline = s.outline.map((p) => translatePath(p, -k.ox, -k.oy));
      rel = this.parts.put(ScratchKey.kept(k), { ...s, outline, box: pathsGridBox(outline) });
    }
    return new PlacedShape(rel, k.ox, k.oy);
  }

  slug(hole: LoopNode, nodes: LoopNode[]): number {
    const kids: LoopNode[] = [];
    for (const c of hole.children) kids.push(nodes[c]);
    const k = this.key(hole, kids);
    const area = this.slugs.find(k);
    return area ?? this.slugs.put(ScratchKey.kept(k), slugOf(hole, nodes));
  }
}

/** a part's finished shape and the numbers the finding and the cut-order check read */
class Built implements BuiltPart {
  constructor(
    readonly part: AnalysisPart,
    readonly node: LoopNode,
    private readonly shape: PlacedShape,
    readonly freedMove: number,
    readonly sortMove: number,
  ) {}

  get outline(): Paths { return this.shape.outline(); }
  get outlineAreas(): number[] { return this.shape.outlineAreas; }
}

/** a hole whose slug nothing holds, reported once the parts are numbered */
interface LooseSlug {
  part: AnalysisPart;
  hole: LoopNode;
  line: number;
  /** the slug's exact area, NaN until worked out */
  areaMm2: number;
}

export function buildParts(nodes: LoopNode[], ctx: PartContext, sink: FindingSink, shapes = new PartShapes()): { parts: BuiltPart[]; holes: number; looseSlugs: number } {
  const built: Built[] = [];
  let holeCount = 0;
  const unheld: Array<{ part: AnalysisPart; reason: string }> = [];
  // the slugs whose findings will be listed; the rest are only counted
  const slugs: LooseSlug[] = [];
  const slugRoom = sink.room('loose-slug');
  let slugsCounted = 0;
  const holeNodes: LoopNode[] = [];
  for (const node of nodes) {
    if (node.depth % 2 !== 0) continue;
    holeNodes.length = 0;
    for (const c of node.children) holeNodes.push(nodes[c]);
    const shape = shapes.part(node, holeNodes);
    const area = shape.areaMm2;
    const bbox = shape.bbox;
    if (area < MIN_PART_AREA_MM2 || !bbox) continue;
    const info = node.info;
    const part: AnalysisPart = {
      id: 0, order: 0, bbox, areaMm2: area, perimeterMm: shape.perimeterMm, holes: 0,
      tabs: info.tabs.length, tabDetails: info.tabs, skinMm: info.skinMm,
      held: true, holdBy: 'none', freedAtLine: info.freedMove >= 0 ? ctx.line[info.freedMove] : null, tool: info.tool,
    };
    if (info.tabs.length > 0) part.holdBy = 'tabs';
    else if (info.skinMm > 0) part.holdBy = 'skin';
    else {
      const v = freedPieceHold(ctx.method, area, info.tool, ctx.vacuumKpa, ctx.settings);
      part.held = v.held;
      part.holdBy = v.holdBy;
      if (!v.held) unheld.push({ part, reason: v.reason });
    }
    built.push(new Built(part, node, shape, info.freedMove, info.freedMove >= 0 ? info.freedMove : info.completedMove));
    for (const h of holeNodes) {
      part.holes++;
      holeCount++;
      const hi = h.info;
      // tape and glue hold any slug, whatever its size; tabs or skin keep it in the sheet
      if (ctx.method === 'tape-glue' || hi.tabs.length > 0 || hi.skinMm > 0 || hi.freedMove < 0) continue;
      const upper = h.areaMm2;
      const lower = h.children.length === 0 ? upper - h.radiusMm * h.perimeterMm : -Infinity;
      const decided = lower > MIN_PART_AREA_MM2 && !freedPieceHeld(ctx.method, upper, hi.tool, ctx.vacuumKpa, ctx.settings);
      let exact = NaN;
      if (!decided) {
        exact = shapes.slug(h, nodes);
        if (exact <= MIN_PART_AREA_MM2 || freedPieceHeld(ctx.method, exact, hi.tool, ctx.vacuumKpa, ctx.settings)) continue;
      }
      if (slugs.length < slugRoom) slugs.push({ part, hole: h, line: ctx.line[hi.freedMove], areaMm2: exact });
      else slugsCounted++;
    }
  }
  // ids in program order of the first cut; order: freed parts as they are freed, then those tabs or skin keep
  built.sort(byFirstMove);
  for (let i = 0; i < built.length; i++) built[i].part.id = i + 1;
  const byOrder = built.slice().sort(byFreeing);
  for (let i = 0; i < byOrder.length; i++) byOrder[i].part.order = i + 1;
  for (const u of unheld) unheldPart(sink, u.part, u.reason);
  let looseSlugs = 0;
  for (const slug of slugs) looseSlug(sink, slug, shapes, nodes, ctx);
  sink.count('loose-slug', slugsCounted);
  for (const f of sink.findings) if (f.kind === 'loose-slug') looseSlugs++;
  return { parts: built, holes: holeCount, looseSlugs: looseSlugs + (sink.suppressed['loose-slug'] ?? 0) };
}

function byFirstMove(a: Built, b: Built): number {
  return a.node.info.firstMove - b.node.info.firstMove;
}

function byFreeing(a: Built, b: Built): number {
  const fa = a.freedMove >= 0 ? 0 : 1, fb = b.freedMove >= 0 ? 0 : 1;
  return fa - fb || a.sortMove - b.sortMove || a.part.id - b.part.id;
}

function unheldPart(sink: FindingSink, part: AnalysisPart, reason: string): void {
  const b = part.bbox;
  sink.add('unheld-part', 'error', part.freedAtLine ?? 0,
    `Part ${part.id} (${fmt(b.maxX - b.minX)} × ${fmt(b.maxY - b.minY)} mm, ${fmt(part.areaMm2, 0)} mm²) is cut free by this move and nothing holds it: ${reason}. The cutter can throw a loose part. ${THROWN_PIECE} Leave tabs or an onion skin, or hold it with tape and glue.`,
    part.id);
}

/** the exact area and the wording only for a finding that is listed; the rest are counted */
function looseSlug(sink: FindingSink, s: LooseSlug, shapes: PartShapes, nodes: LoopNode[], ctx: PartContext): void {
  sink.add('loose-slug', 'warning', s.line, () => {
    const h = s.hole;
    const slug = Number.isNaN(s.areaMm2) ? (s.areaMm2 = shapes.slug(h, nodes)) : s.areaMm2;
    const v = freedPieceHold(ctx.method, slug, h.info.tool, ctx.vacuumKpa, ctx.settings);
    return `The scrap inside a hole of part ${s.part.id} (${fmt(h.bbox.maxX - h.bbox.minX)} × ${fmt(h.bbox.maxY - h.bbox.minY)} mm tool path, slug ${fmt(slug, 0)} mm²) is cut free by this move and nothing holds it: ${v.reason}. The cutter can throw a loose slug. ${THROWN_PIECE} Leave a tab or skin on it, or clear it as a pocket.`;
  }, s.part.id);
}

/**
 * area of the outline minus the grown holes. When the outline is one convex path and the holes
 * lie inside it without touching each other, that is a plain subtraction of areas; otherwise
 * Clipper's difference decides.
 */
function materialArea(outline: Paths, grown: Paths): number {
  if (grown.length === 0) return pathsAreaMm2(outline);
  if (outline.length === 1 && isConvex(outline[0]) && grown.every((g) => pathInside(g, outline[0])) && disjointBoxes(grown)) {
    return pathsAreaMm2(outline) - pathsAreaMm2(grown);
  }
  return pathsAreaMm2(differencePaths(outline, grown));
}

function disjointBoxes(paths: Paths): boolean {
  if (paths.length < 2) return true;
  const boxes = paths.map((p) => pathsBBox([p])!);
  for (let i = 0; i < boxes.length; i++)
    for (let j = i + 1; j < boxes.length; j++) {
      const a = boxes[i], b = boxes[j];
      if (a.minX <= b.maxX && b.minX <= a.maxX && a.minY <= b.maxY && b.minY <= a.maxY) return false;
    }
  return true;
}

function slugOf(hole: LoopNode, nodes: LoopNode[]): number {
  const inner = offsetPaths([hole.path], -hole.radiusMm);
  if (inner.length === 0) return 0;
  const grown: Paths = [];
  for (const c of hole.children) grown.push(...offsetPaths([nodes[c].path], nodes[c].radiusMm));
  return pathsAreaMm2(grown.length > 0 ? differencePaths(inner, grown) : inner);
}
