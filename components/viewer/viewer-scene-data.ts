// What the scene draws besides the path, derived once from the worker's result on the main
// thread: plunge points (the analysis's list), tool changes (moves of that kind), the moves on
// findings' lines, part outlines, the Z range of the path, and the sizes that scale with it.
import { MoveKind } from '@/lib/gcode/move-list';
import type { ReportPartView } from '@/lib/jobs/estimate-view';
import { boxRadius, type Box3Like } from '@/lib/viewer/camera-fit';
import { moveAtLine } from '@/lib/viewer/playhead';
import type { ViewerResult } from '@/lib/viewer/view-run';
import type { MarkerPoint, PartOutline } from './scene/markers';

export interface SceneData {
  plunges: MarkerPoint[];
  toolChanges: MarkerPoint[];
  findingPoints: MarkerPoint[];
  parts: PartOutline[];
  flaggedParts: Set<number>;
  pathBox: Box3Like;
  sheetBox: Box3Like | null;
  zLimits: [number, number];
  markerSizeMm: number;
  dashMm: number;
}

const MAX_FINDING_MARKERS = 2000;

export function sceneData(result: ViewerResult, sheet: { widthMm: number; lengthMm: number; thicknessMm: number } | null): SceneData {
  const { moves, report, stockTopZ } = result;
  // read from the columns: the report's own list of objects is only built when something asks
  const pc = result.plunges;
  const plunges: MarkerPoint[] = new Array(pc.count);
  for (let i = 0; i < pc.count; i++) plunges[i] = { x: pc.x[i], y: pc.y[i], z: stockTopZ - pc.depthMm[i] };
  const toolChanges: MarkerPoint[] = [];
  for (let i = 0; i < moves.count; i++) {
    if (moves.kind[i] === MoveKind.toolChange) toolChanges.push({ x: moves.x[i], y: moves.y[i], z: moves.z[i] });
  }
  const findingPoints: MarkerPoint[] = [];
  for (const f of report.findings) {
    if (f.line <= 0 || findingPoints.length >= MAX_FINDING_MARKERS) continue;
    const m = moveAtLine(moves.line, f.line);
    if (m >= 0 && moves.line[m] === f.line) findingPoints.push({ x: moves.x[m], y: moves.y[m], z: moves.z[m] });
  }
  const flaggedParts = new Set<number>();
  for (const f of report.findings) if (f.part) flaggedParts.add(f.part);
  const parts = (report.parts as ReportPartView[]).map((p) => ({ id: p.id, order: p.order, ...p.bbox, flagged: flaggedParts.has(p.id) }));
  const b = result.path.bounds;
  const sheetBox = sheet ? { minX: 0, minY: 0, minZ: stockTopZ - sheet.thicknessMm, maxX: sheet.widthMm, maxY: sheet.lengthMm, maxZ: stockTopZ } : null;
  const pathBox = b ?? sheetBox ?? { minX: 0, minY: 0, minZ: 0, maxX: 100, maxY: 100, maxZ: 10 };
  const radius = boxRadius(sheetBox ?? pathBox);
  return {
    plunges,
    toolChanges,
    findingPoints,
    parts,
    flaggedParts,
    pathBox,
    sheetBox,
    zLimits: [Math.min(pathBox.minZ, sheetBox?.minZ ?? pathBox.minZ), Math.max(pathBox.maxZ, sheetBox?.maxZ ?? pathBox.maxZ)],
    markerSizeMm: Math.max(2, radius * 0.008),
    dashMm: Math.max(1, radius * 0.004),
  };
}

/** a box around a part for the camera to focus on (its outline with a margin, the sheet's depth) */
export function partBox(p: ReportPartView, zLimits: [number, number]): Box3Like {
  const m = Math.max(p.bbox.maxX - p.bbox.minX, p.bbox.maxY - p.bbox.minY) * 0.3 + 5;
  return { minX: p.bbox.minX - m, minY: p.bbox.minY - m, minZ: zLimits[0], maxX: p.bbox.maxX + m, maxY: p.bbox.maxY + m, maxZ: zLimits[1] };
}

/** a box around a point, for focusing on a finding's move */
export function pointBox(p: MarkerPoint, halfMm: number): Box3Like {
  return { minX: p.x - halfMm, minY: p.y - halfMm, minZ: p.z - halfMm / 4, maxX: p.x + halfMm, maxY: p.y + halfMm, maxZ: p.z + halfMm / 4 };
}
