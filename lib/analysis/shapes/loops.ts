// What each closed loop of the cut graph is: cut through all round (frees what it encloses),
// through except for raised spans (tabs: count, length at the base, height above the bottom),
// or nowhere through but within the skin band (an onion skin of the thinnest layer left).
import type { CutGraph } from '../graph/cut-graph';
import type { GraphLoop } from '../graph/faces';
import { LoopShapes, type LoopShape } from './loop-shapes';
import type { TabDetail } from '../types';

export interface LoopInfo {
  /** the outline, shared with congruent copies, and where this copy's origin sits (grid units) */
  shape: LoopShape;
  ox: number;
  oy: number;
  /** freeing move: the move that cut the last edge through; −1 when tabs or skin remain */
  freedMove: number;
  /** the move that cut the last edge within the band (the loop's final pass is done) */
  completedMove: number;
  /** first move that cut any of it within the band */
  firstMove: number;
  tool: number;
  tabs: TabDetail[];
  skinMm: number;
}

/** sagitta of the chords the area work draws arcs with, mm (areas stay exact, see loop-shapes) */
export const AREA_CHORD_MM = 0.05;

export function describeLoop(g: CutGraph, loop: GraphLoop, bottomZ: number, throughZ: number, line: Uint32Array, chordToleranceMm: number, shapes = new LoopShapes()): LoopInfo {
  const { edges, start: o, length: n } = loop;
  const { shape, ox, oy } = shapes.place(g, loop, Math.max(chordToleranceMm, AREA_CHORD_MM));
  const eFirstNear = g.eFirstNear, eFirstThrough = g.eFirstThrough, eZMin = g.eZMin;
  let completed = -1, first = 0x7fffffff, freed = -1, allThrough = true, anyThrough = false, freeEdge = -1;
  let skin = Infinity;
  for (let i = 0; i < n; i++) {
    const e = edges[o + i];
    const near = eFirstNear[e];
    if (near > completed) completed = near;
    if (near < first) first = near;
    const ft = eFirstThrough[e];
    const zMin = eZMin[e];
    if (ft < 0 || zMin > throughZ) {
      allThrough = false;
      const left = zMin - bottomZ;
      if (left < skin) skin = left;
    } else {
      anyThrough = true;
      if (ft > freed) {
        freed = ft;
        freeEdge = e;
      }
    }
  }
  const freeTool = freeEdge >= 0 ? g.eTool[freeEdge] : -1;
  const tabs: TabDetail[] = [];
  if (!allThrough && anyThrough) {
    // rotate to a through edge, then read the raised runs
    let s = 0;
    while (g.eFirstThrough[edges[o + s]] < 0) s++;
    let runLen = 0, runTop = -Infinity, runFirst = Infinity;
    for (let j = 1; j <= n; j++) {
      const e = edges[o + ((s + j) % n)];
      const raised = g.eFirstThrough[e] < 0;
      if (raised) {
        runLen += g.edgeLengthMm(e);
        if (g.eZTop[e] > runTop) runTop = g.eZTop[e];
        if (g.eFirstNear[e] < runFirst) runFirst = g.eFirstNear[e];
      } else if (runLen > 0) {
        tabs.push({ lengthMm: runLen, heightMm: runTop - bottomZ, line: line[runFirst] });
        runLen = 0; runTop = -Infinity; runFirst = Infinity;
      }
    }
  }
  return {
    shape,
    ox,
    oy,
    freedMove: allThrough ? freed : -1,
    completedMove: completed,
    firstMove: first === 0x7fffffff ? -1 : first,
    tool: allThrough ? freeTool : g.eTool[edges[o]],
    tabs,
    skinMm: !allThrough && !anyThrough ? Math.max(0, skin) : 0,
  };
}
