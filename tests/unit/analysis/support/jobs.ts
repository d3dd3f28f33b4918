// Shared job settings for the analysis tests: Alder & Finch's sheets and tool library.
import type { AnalysisInput, HoldDownMethod } from '@/lib/analysis';

export const TOOLS = [
  { number: 1, diameterMm: 6.35, flutes: 2, kind: 'compression' },
  { number: 2, diameterMm: 3.175, flutes: 1, kind: 'up-cut' },
  { number: 3, diameterMm: 6, flutes: 2, kind: 'down-cut' },
  { number: 9, diameterMm: 0, flutes: 1, kind: 'straight' }, // a zero-width "tool": parts equal the tool-path loops
];

export function job(thicknessMm: number, holdDown: HoldDownMethod = 'tape-glue', extra: Partial<AnalysisInput> = {}): AnalysisInput {
  return { sheet: { widthMm: 1220, lengthMm: 2440, thicknessMm }, zZero: 'top', holdDown, tools: TOOLS, ...extra };
}
