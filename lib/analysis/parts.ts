// Parts, holes and slugs from the nested loops. A part is the region a round cutter leaves:
// its loop's interior shrunk by the tool radius, minus each hole's interior grown by its tool
// radius (Clipper offsets with round joins, then a difference). A hole's slug is the hole's
// interior shrunk by the radius, minus any part nested inside it. Each gets its hold verdict.
// Loops that repeat (a nest of copies) reuse the Clipper results of the first copy
// (shape-cache); a slug's exact area is worked out only when its verdict or its finding's
// text needs it, from the bounds A − r·P ≤ slug ≤ A of the hole's interior A and perimeter P.
import { FindingSink, fmt } from './findings';
import { differencePaths, isConvex, offsetPaths, pathInside, pathPerimeterMm, pathsAreaMm2, pathsBBox, SCALE, type Paths, type Ring } from './geometry';
import { freedPieceHeld, freedPieceHold } from './hold';
import type { LoopNode } from './nesting';
import { lowest, ShapeCache, shapeKey, translatePath } from './shape-cache';
import type { AnalysisSettings } from './settings';
import type { AnalysisPart, BBox, HoldDownMethod } from './types';

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
  method: HoldDownMethod;
  vacuumKpa: number;
  settings: AnalysisSettings;
  line: Uint32Array;
}

/** what the Clipper work gives for one part, relative to its key's origin */
interface PartShape {
  outline: Paths;
  outlineAreas: number[];
  areaMm2: number;
  perimeterMm: number;
  bbox: BBox | null;
}

/** a part shape at its place: the outline paths are only made if asked for (the cut-order check) */
export interface PlacedShape extends Omit<PartShape, 'outline'> {
  outline(): Paths;
}

/** the finished part of a loop and its holes: outline shrunk by the radius, grown holes taken off */
export function partShape(node: LoopNode, holeNodes: LoopNode[]): PartShape {
  const outline = offsetPaths([node.path], -node.radiusMm);
  const grown: Paths = [];
  for (const h of holeNodes) grown.push(...offsetPaths([h.path], h.radiusMm));
  const areaMm2 = materialArea(outline, grown);
  const outlineAreas = outline.map((p) => pathsAreaMm2([p]));
  let perimeterMm = 0;
  outline.forEach((p, i) => { if (outlineAreas[i] > 0) perimeterMm += pathPerimeterMm(p); });
  return { outline, outlineAreas, areaMm2, perimeterMm, bbox: pathsBBox(outline) };
}

/** partShape through the cache: the same loop and holes moved elsewhere give the same shape, moved */
export class PartShapes {
  readonly parts = new ShapeCache<PartShape & { box: number[] | null }>();
  readonly slugs = new ShapeCache<number>();

  part(node: LoopNode, holeNodes: LoopNode[]): PlacedShape {
    const rings: Ring[] = [node.ring];
    const radii = [node.radiusMm];
    const starts = [startOf(node)];
    for (const h of holeNodes) { rings.push(h.ring); radii.push(h.radiusMm); starts.push(startOf(h)); }
    const k = shapeKey(rings, radii, starts);
    const rel = this.parts.get(k, () => {
      const s = partShape(node, holeNodes);
      const outline = s.outline.map((p) => translatePath(p, -k.ox, -k.oy));
      return { ...s, outline, box: intBox(outline) };
    });
    let outline: Paths | null = null;
    return {
      outlineAreas: rel.outlineAreas,
      areaMm2: rel.areaMm2,
      perimeterMm: rel.perimeterMm,
      bbox: rel.box && { minX: (rel.box[0] + k.ox) / SCALE, minY: (rel.box[1] + k.oy) / SCALE, maxX: (rel.box[2] + k.ox) / SCALE, maxY: (rel.box[3] + k.oy) / SCALE },
      outline: () => (outline ??= rel.outline.map((p) => translatePath(p, k.ox, k.oy))),
    };
  }

  slug(hole: LoopNode, nodes: LoopNode[]): number {
    const kids = hole.children.map((c) => nodes[c]);
    const k = shapeKey([hole.ring, ...kids.map((c) => c.ring)], [hole.radiusMm, ...kids.map((c) => c.radiusMm)], [startOf(hole), ...kids.map(startOf)]);
    return this.slugs.get(k, () => slugOf(hole, nodes));
  }
}

/** a loop's path takes part in several keys (its part's, its parent's, a slug's): its start is found once */
function startOf(node: LoopNode): number {
  return (node.lowestIndex ??= lowest(node.ring));
}

export function buildParts(nodes: LoopNode[], ctx: PartContext, sink: FindingSink, shapes = new PartShapes()): { parts: BuiltPart[]; holes: number; looseSlugs: number } {
  const built: BuiltPart[] = [];
  let holeCount = 0;
  const slugChecks: Array<() => void> = [];
  for (const node of nodes) {
    if (node.depth % 2 !== 0) continue;
    const holeNodes = node.children.map((c) => nodes[c]);
    const shape = shapes.part(node, holeNodes);
    const { outlineAreas, areaMm2: area, perimeterMm: perimeter } = shape;
    if (area < MIN_PART_AREA_MM2 || !shape.bbox) continue;
    const bbox = shape.bbox;
    const info = node.info;
    const part: AnalysisPart = {
      id: 0, order: 0, bbox, areaMm2: area, perimeterMm: perimeter, holes: 0,
      tabs: info.tabs.length, tabDetails: info.tabs, skinMm: info.skinMm,
      held: true, holdBy: 'none', freedAtLine: info.freedMove >= 0 ? ctx.line[info.freedMove] : null, tool: info.tool,
    };
    if (info.tabs.length > 0) part.holdBy = 'tabs';
    else if (info.skinMm > 0) part.holdBy = 'skin';
    else {
      const v = freedPieceHold(ctx.method, area, info.tool, ctx.vacuumKpa, ctx.settings);
      part.held = v.held;
      part.holdBy = v.holdBy;
      if (!v.held) {
        slugChecks.push(() => {
          sink.add('unheld-part', 'error', part.freedAtLine ?? 0,
            `Part ${part.id} (${fmt(bbox.maxX - bbox.minX)} × ${fmt(bbox.maxY - bbox.minY)} mm, ${fmt(area, 0)} mm²) is cut free at line ${part.freedAtLine} and nothing holds it: ${v.reason}. Leave tabs or an onion skin, or hold it with tape and glue.`,
            part.id);
        });
      }
    }
    const b: BuiltPart = { part, node, get outline() { return shape.outline(); }, outlineAreas, freedMove: info.freedMove, sortMove: info.freedMove >= 0 ? info.freedMove : info.completedMove };
    built.push(b);
    for (const h of holeNodes) {
      part.holes++;
      holeCount++;
      const hi = h.info;
      // tape and glue hold any slug, whatever its size; tabs or skin keep it in the sheet
      if (ctx.method === 'tape-glue' || hi.tabs.length > 0 || hi.skinMm > 0 || hi.freedMove < 0) continue;
      let exact = NaN;
      const slugArea = () => (Number.isNaN(exact) ? (exact = shapes.slug(h, nodes)) : exact);
      const upper = h.areaMm2;
      const lower = h.children.length === 0 ? upper - h.radiusMm * h.perimeterMm : -Infinity;
      const decided = lower > MIN_PART_AREA_MM2 && !freedPieceHeld(ctx.method, upper, hi.tool, ctx.vacuumKpa, ctx.settings);
      if (!decided) {
        const slug = slugArea();
        if (slug <= MIN_PART_AREA_MM2 || freedPieceHeld(ctx.method, slug, hi.tool, ctx.vacuumKpa, ctx.settings)) continue;
      }
      const line = ctx.line[hi.freedMove];
      slugChecks.push(() => {
        // the exact area and the wording only for a finding that is listed; the rest are counted
        sink.add('loose-slug', 'warning', line, () => {
          const slug = slugArea();
          const v = freedPieceHold(ctx.method, slug, hi.tool, ctx.vacuumKpa, ctx.settings);
          return `The scrap inside a hole of part ${part.id} (${fmt(h.bbox.maxX - h.bbox.minX)} × ${fmt(h.bbox.maxY - h.bbox.minY)} mm tool path, slug ${fmt(slug, 0)} mm²) is cut free at line ${line} and nothing holds it: ${v.reason}. A loose slug can be thrown by the cutter; leave a tab or skin on it, or clear it as a pocket.`;
        }, part.id);
      });
    }
  }
  // ids in program order of the first cut; order: freed parts as they are freed, then those tabs or skin keep
  built.sort((a, b) => a.node.info.firstMove - b.node.info.firstMove);
  built.forEach((b, i) => { b.part.id = i + 1; });
  const byOrder = built.slice().sort((a, b) => {
    const fa = a.freedMove >= 0 ? 0 : 1, fb = b.freedMove >= 0 ? 0 : 1;
    return fa - fb || a.sortMove - b.sortMove || a.part.id - b.part.id;
  });
  byOrder.forEach((b, i) => { b.part.order = i + 1; });
  let looseSlugs = 0;
  for (const f of slugChecks) f();
  for (const f of sink.findings) if (f.kind === 'loose-slug') looseSlugs++;
  return { parts: built, holes: holeCount, looseSlugs: looseSlugs + (sink.suppressed['loose-slug'] ?? 0) };
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

/** integer bounding box [minX, minY, maxX, maxY] of paths in Clipper units, null when empty */
function intBox(paths: Paths): number[] | null {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const p of paths)
    for (const q of p) {
      if (q.X < minX) minX = q.X;
      if (q.X > maxX) maxX = q.X;
      if (q.Y < minY) minY = q.Y;
      if (q.Y > maxY) maxY = q.Y;
    }
  return minX > maxX ? null : [minX, minY, maxX, maxY];
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
