// Sheet lift: an up-cut spiral tool pulls a thin sheet that is held only at its edges (clamps,
// tabs, or nothing named) up off the table, so tabs can fail and parts kick loose (common
// practice). One finding per such tool, at the first move it cuts through with.
import { fmt, THROWN_PIECE, type FindingSink } from './findings';
import type { HoldDownMethod, SheetSpec, ToolSpec } from '../types';

export function sheetLift(sheet: SheetSpec, holdDown: HoldDownMethod | null, tools: Map<number, ToolSpec>, firstThroughByTool: Map<number, number>, line: Uint32Array, thinSheetMm: number, sink: FindingSink): void {
  if (sheet.thicknessMm > thinSheetMm || (holdDown !== 'clamps' && holdDown !== 'tabs' && holdDown !== null)) return;
  for (const [t, move] of firstThroughByTool) {
    const kind = (tools.get(t)?.kind ?? '').toLowerCase().replace(/[^a-z]/g, '');
    if (kind !== 'upcut' && kind !== 'upspiral') continue;
    const held = holdDown === 'clamps' ? 'clamps at the sheet edge' : holdDown === 'tabs' ? 'tabs only' : 'only the tabs or skin the program leaves (no hold-down was given)';
    sink.add('sheet-lift', 'warning', line[move],
      `Up-cut tool T${t} cuts through the ${fmt(sheet.thicknessMm, 1)} mm sheet from this line on with ${held} to hold it: an up-cut bit pulls a thin sheet up in the middle, so tabs can fail and parts kick loose. ${THROWN_PIECE} Use a down-cut or compression tool, vacuum, or tape and glue.`);
  }
}
