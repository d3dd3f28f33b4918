// A comparison's per-part verdicts in the shape the viewer's parts panel reads
// (lib/viewer/hold-overlay.ts): for each method, held or not and the reason, by part id.
import type { HoldOverlayMethod } from '../viewer/hold-overlay';
import type { HoldOption } from './compare';

export function overlayMethods(comparison: { options: readonly Pick<HoldOption, 'method' | 'label' | 'heldParts' | 'unheldParts'>[] }): HoldOverlayMethod[] {
  return comparison.options.map((o) => {
    const verdicts = new Map<number, { held: boolean; reason: string }>();
    for (const p of o.heldParts) verdicts.set(p.part, { held: true, reason: p.reason });
    for (const p of o.unheldParts) verdicts.set(p.part, { held: false, reason: p.reason });
    return { method: o.method, label: o.label, verdicts };
  });
}
