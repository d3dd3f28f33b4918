import 'server-only';
// The hold-down comparison of one stored estimate (GET /api/estimates/:id/hold-down): the
// per-method analysis the estimate worker stored beside the report (estimates.hold_methods_key,
// lib/estimate/hold-methods.ts), compared at the shop's labour and consumable settings, the
// machine's hourly rate and the job's quantity (lib/holddown/compare.ts). Nothing is computed
// on the request thread but the comparison's arithmetic: an estimate made before the
// comparison existed says so, and a new estimate request makes one with it.
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { estimates, jobs, machines, programs, shops } from '@/db/schema';
import { getShopSettings } from '@/db/queries/shop-settings';
import { compareHoldDowns, HOLD_DOWN_CAUTION, type HoldComparison } from '@/lib/holddown/compare';
import { ruleOutReasons } from '@/lib/holddown/rule-out';
import { HOLD_METHODS_DOC_VERSION, type HoldMethodsDoc, type HoldOptionId } from '@/lib/holddown/types';
import { getObject } from '@/lib/storage/s3';
import type { EstimateStatus } from '@/lib/validation/enums';

export type HoldDownAvailability = 'ready' | 'not-done' | 'not-computed';

export interface HoldDownAnswer extends Omit<HoldComparison, 'options'> {
  estimateId: number;
  programId: number;
  jobId: number;
  estimateStatus: EstimateStatus;
  /** ready: compared; not-done: the estimate is still queued, running or failed; not-computed: made before the comparison existed */
  availability: HoldDownAvailability;
  options: HoldComparison['options'];
}

function empty(base: Pick<HoldDownAnswer, 'estimateId' | 'programId' | 'jobId' | 'estimateStatus' | 'availability' | 'currency' | 'quantity'>, note: string): HoldDownAnswer {
  return { ...base, partsPerSheet: 0, sheets: 0, partCount: 0, options: [], recommended: null, runnerUp: null, note: `${note} ${HOLD_DOWN_CAUTION}`, wouldChange: [], programErrors: 0, programWarnings: 0, caution: HOLD_DOWN_CAUTION };
}

function isDoc(value: unknown): value is HoldMethodsDoc {
  const v = value as Partial<HoldMethodsDoc> | null;
  return !!v && v.version === HOLD_METHODS_DOC_VERSION && Array.isArray(v.parts) && Array.isArray(v.methods);
}

/** null: no such estimate in this shop. `ruledOut`: methods the job cannot use (lib/holddown/rule-out.ts). */
export async function getHoldDownComparison(shopId: number, estimateId: number, ruledOut: readonly HoldOptionId[] = []): Promise<HoldDownAnswer | null> {
  const [row] = await db
    .select({ estimate: estimates, jobId: jobs.id, quantity: jobs.quantity, machineRate: machines.hourlyRateMinor, currency: shops.currency })
    .from(estimates)
    .innerJoin(programs, and(eq(programs.id, estimates.programId), eq(programs.shopId, shopId)))
    .innerJoin(jobs, and(eq(jobs.id, programs.jobId), eq(jobs.shopId, shopId)))
    .innerJoin(machines, and(eq(machines.id, estimates.machineId), eq(machines.shopId, shopId)))
    .innerJoin(shops, eq(shops.id, estimates.shopId))
    .where(and(eq(estimates.shopId, shopId), eq(estimates.id, estimateId)))
    .limit(1);
  if (!row) return null;
  const e = row.estimate;
  const quantity = Math.max(1, row.quantity);
  const base = { estimateId: e.id, programId: e.programId, jobId: row.jobId, estimateStatus: e.status, currency: row.currency, quantity };
  if (e.status !== 'done') {
    const words = e.status === 'failed' ? 'failed, so there is nothing to compare' : `is ${e.status === 'pending' ? 'queued' : 'being computed'}; the comparison comes with it`;
    return empty({ ...base, availability: 'not-done' }, `The estimate ${words}.`);
  }
  const stored = e.holdMethodsKey ? await getObject(e.holdMethodsKey) : null;
  let doc: unknown = null;
  if (stored) {
    try {
      doc = JSON.parse(stored.body.toString('utf8'));
    } catch {
      doc = null;
    }
  }
  if (!isDoc(doc)) {
    return empty(
      { ...base, availability: 'not-computed' },
      'This estimate was stored without the per-method analysis the comparison needs (it was made before the hold-down comparison existed, or that analysis could not be made). Request a new estimate of this program: it is made with the comparison.',
    );
  }
  const settings = await getShopSettings(shopId);
  const comparison = compareHoldDowns({ doc, settings, machineRateMinorPerHour: row.machineRate, currency: row.currency, quantity, excluded: ruleOutReasons(ruledOut) });
  return { ...base, availability: 'ready', ...comparison };
}
