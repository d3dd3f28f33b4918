// Methods ruled out for a job before any figure: a hold the shop cannot or may not use here
// (no vacuum table, finished faces that may not be taped or glued, no marks from tabs). The
// comparison then recommends among the rest, and where none of those holds every part it says
// which parts fail under each and what would change the verdict (lib/holddown/compare.ts).
// Tape and glue holds any part by its bond, so on a real program that verdict is reached
// exactly when tape and glue is ruled out. Pure: the program page and the route share it.
import { z } from '@/lib/validation/zod';
import type { HoldOptionId } from './types';

export const HOLD_OPTION_IDS = ['vacuum', 'vacuum-machine', 'tape-glue', 'clamps', 'tabs', 'skin'] as const satisfies readonly HoldOptionId[];

/** why a method is ruled out, as the comparison says it ("ruled out for this job: …") */
export const RULE_OUT_REASONS: Record<HoldOptionId, string> = {
  vacuum: 'vacuum is not used for this job (no vacuum table, or a sheet that will not seal)',
  'vacuum-machine': 'vacuum is not used for this job (no vacuum table, or a sheet that will not seal)',
  'tape-glue': 'the parts may not be taped or glued (faces that must stay clean of tape and glue)',
  clamps: 'the sheet may not be screwed or clamped down',
  tabs: 'tabs are not wanted on these parts (no trimming marks)',
  skin: 'an onion skin is not wanted on these parts (no skin to break out)',
};

/** `?ruleOut=tape-glue,clamps` of GET /api/estimates/:id/hold-down; empty or absent: none */
export const ruleOutQuerySchema = z.object({
  ruleOut: z
    .string()
    .max(200, { error: 'Name at most the six methods.' })
    .optional()
    .transform((raw, ctx) => {
      const ids = (raw ?? '').split(',').map((s) => s.trim()).filter((s) => s !== '');
      const unknown = ids.filter((id) => !(HOLD_OPTION_IDS as readonly string[]).includes(id));
      if (unknown.length > 0) {
        ctx.addIssue({ code: 'custom', message: `Not a hold-down method: ${unknown.join(', ')}. Use ${HOLD_OPTION_IDS.join(', ')}.` });
        return z.NEVER;
      }
      return [...new Set(ids)] as HoldOptionId[];
    }),
});

export function ruleOutReasons(ids: readonly HoldOptionId[]): Partial<Record<HoldOptionId, string>> {
  return Object.fromEntries(ids.map((id) => [id, RULE_OUT_REASONS[id]]));
}

/** "parts 1–3, 7, 9–12": part numbers (the order they come free) in runs */
export function partRuns(orders: readonly number[]): string {
  const sorted = [...new Set(orders)].sort((a, b) => a - b);
  const runs: string[] = [];
  for (let i = 0; i < sorted.length; ) {
    let j = i;
    while (j + 1 < sorted.length && sorted[j + 1] === sorted[j]! + 1) j++;
    runs.push(j === i ? `${sorted[i]}` : `${sorted[i]}–${sorted[j]}`);
    i = j + 1;
  }
  return `${sorted.length === 1 ? 'part' : 'parts'} ${runs.join(', ')}`;
}
