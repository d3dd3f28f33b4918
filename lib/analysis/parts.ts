// Parts, holes and slugs from the nested loops. A part is the region a round cutter leaves:
// its loop's interior shrunk by the tool radius, minus each hole's interior grown by its tool
// radius (Clipper offsets with round joins, then a difference). A hole's slug is the hole's
// interior shrunk by the radius, minus any part nested inside it. Each gets its hold verdict.
import { FindingSink, fmt } from './findings';
import { differencePaths, isConvex, offsetPaths, pathInside, pathPerimeterMm, pathsAreaMm2, pathsBBox, type Paths } from './geometry';
import { freedPieceHold } from './hold';
import type { LoopNode } from './nesting';
import type { AnalysisSettings } from './settings';
import type { AnalysisPart, HoldDownMethod } from './types';

/** below this a "part" is only kerf: nothing is left between the cuts */
const MIN_PART_AREA_MM2 = 0.5;

export interface BuiltPart {
  part: AnalysisPart;
  node: LoopNode;
  /** outer boundary of the finished part (the tool-centre loop shrunk by the radius) */
  outline: Paths;
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

export function buildParts(nodes: LoopNode[], ctx: PartContext, sink: FindingSink): { parts: BuiltPart[]; holes: number; looseSlugs: number } {
  const built: BuiltPart[] = [];
  let holeCount = 0;
  const slugChecks: Array<() => void> = [];
  for (const node of nodes) {
    if (node.depth % 2 !== 0) continue;
    const outline = offsetPaths([node.path], -node.radiusMm);
    const holeNodes = node.children.map((c) => nodes[c]);
    const grown: Paths = [];
    for (const h of holeNodes) grown.push(...offsetPaths([h.path], h.radiusMm));
    const area = materialArea(outline, grown);
    if (area < MIN_PART_AREA_MM2) continue;
    const bbox = pathsBBox(outline)!;
    let perimeter = 0;
    const outlineAreas = outline.map((p) => pathsAreaMm2([p]));
    outline.forEach((p, i) => { if (outlineAreas[i] > 0) perimeter += pathPerimeterMm(p); });
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
    const b: BuiltPart = { part, node, outline, outlineAreas, freedMove: info.freedMove, sortMove: info.freedMove >= 0 ? info.freedMove : info.completedMove };
    built.push(b);
    for (const h of holeNodes) {
      // tape and glue hold any slug: its size does not matter
      const slug = ctx.method === 'tape-glue' ? 0 : slugOf(h, nodes);
      part.holes++;
      holeCount++;
      const hi = h.info;
      if (hi.tabs.length > 0 || hi.skinMm > 0 || hi.freedMove < 0 || slug <= MIN_PART_AREA_MM2) continue;
      const v = freedPieceHold(ctx.method, slug, hi.tool, ctx.vacuumKpa, ctx.settings);
      if (v.held) continue;
      const line = ctx.line[hi.freedMove];
      slugChecks.push(() => {
        sink.add('loose-slug', 'warning', line,
          `The scrap inside a hole of part ${part.id} (${fmt(h.bbox.maxX - h.bbox.minX)} × ${fmt(h.bbox.maxY - h.bbox.minY)} mm tool path, slug ${fmt(slug, 0)} mm²) is cut free at line ${line} and nothing holds it: ${v.reason}. A loose slug can be thrown by the cutter; leave a tab or skin on it, or clear it as a pocket.`,
          part.id);
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
