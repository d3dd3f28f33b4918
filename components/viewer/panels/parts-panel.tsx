'use client';
// The parts the program cuts free, in the order they come free: size, area, whether something
// holds each and what, and the line that frees it. Choosing a part focuses the camera on it and
// moves the playhead to that line. When the program page's hold-down section has published its
// comparison (lib/viewer/hold-overlay.ts), each part is coloured and worded held or not held
// for the method chosen there or in this panel's own selector, with the reason.
// A long list (a nest of thousands of parts) is virtualised (@tanstack/react-virtual): only
// the rows in view and a few either side exist, between two spacer rows that keep the
// scroll height, so the page never lays out a table of every part.
import { useVirtualizer } from '@tanstack/react-virtual';
import { useRef, useSyncExternalStore } from 'react';
import { HELD_BY_WORDS, type ReportPartView } from '@/lib/jobs/estimate-view';
import type { LengthUnit } from '@/lib/units/length';
import { holdOverlay, selectedMethod } from '@/lib/viewer/hold-overlay';
import { formatArea, formatSize } from '@/lib/viewer/readouts';

/** from this many parts on, only the rows in view are rendered */
export const VIRTUAL_PARTS_FROM = 300;
const ROW_PX = 33;

export function PartsPanel({ parts, unit, flagged, onChoose }: { parts: ReportPartView[]; unit: LengthUnit; flagged: ReadonlySet<number>; onChoose: (p: ReportPartView) => void }) {
  const overlay = useSyncExternalStore(holdOverlay.subscribe, holdOverlay.getSnapshot, holdOverlay.getSnapshot);
  const chosen = selectedMethod(overlay);
  const scroller = useRef<HTMLDivElement>(null);
  const virtual = parts.length >= VIRTUAL_PARTS_FROM;
  const virtualizer = useVirtualizer({
    count: virtual ? parts.length : 0,
    getScrollElement: () => scroller.current,
    estimateSize: () => ROW_PX,
    overscan: 12,
    enabled: virtual,
  });
  const items = virtual ? virtualizer.getVirtualItems() : null;
  const rows = items ? items.map((it) => ({ p: parts[it.index], index: it.index })) : parts.map((p, index) => ({ p, index }));
  const padTop = items && items.length ? items[0].start : 0;
  const padBottom = items && items.length ? virtualizer.getTotalSize() - items[items.length - 1].end : 0;
  return (
    <section className="rounded-md border-2 border-rule bg-panel">
      {chosen ? (
        <div className="flex flex-wrap items-center gap-3 border-b border-rule-light px-3 py-2">
          <label htmlFor="parts-hold-method" className="font-bold">
            Held or not, for
          </label>
          <select id="parts-hold-method" className="min-h-target rounded-md border-2 border-rule bg-panel px-3" value={chosen.method} onChange={(e) => holdOverlay.select(e.target.value)}>
            {overlay.methods.map((m) => (
              <option key={m.method} value={m.method}>
                {m.label}
              </option>
            ))}
          </select>
        </div>
      ) : null}
      <div ref={scroller} className="max-h-96 overflow-auto">
        <table className="w-full text-sm" data-testid="viewer-parts" aria-rowcount={virtual ? parts.length + 1 : undefined}>
          <caption className="px-3 py-2 text-left text-base font-bold">Parts</caption>
          <thead className="bg-night text-white">
            <tr>
              <th scope="col" className="px-2 py-1 text-left">Order</th>
              <th scope="col" className="px-2 py-1 text-left">Size X × Y</th>
              <th scope="col" className="px-2 py-1 text-left">Area</th>
              <th scope="col" className="px-2 py-1 text-left">Held</th>
              <th scope="col" className="px-2 py-1 text-left">Freed at</th>
            </tr>
          </thead>
          <tbody>
            {padTop > 0 ? (
              <tr aria-hidden="true" style={{ height: padTop }}>
                <td colSpan={5} />
              </tr>
            ) : null}
            {rows.map(({ p, index }) => {
              const w = p.bbox.maxX - p.bbox.minX;
              const l = p.bbox.maxY - p.bbox.minY;
              const verdict = chosen?.verdicts.get(p.id) ?? null;
              const tint = verdict ? (verdict.held ? 'bg-ok-tint' : 'bg-fault-tint') : flagged.has(p.id) ? 'bg-fault-tint' : '';
              return (
                <tr
                  key={p.id}
                  ref={virtual ? virtualizer.measureElement : undefined}
                  data-index={index}
                  aria-rowindex={virtual ? index + 2 : undefined}
                  className={`border-t border-rule-light ${tint}`}
                  data-part-order={p.order}
                  data-hold={verdict ? (verdict.held ? 'held' : 'not-held') : undefined}
                >
                  <td className="px-2 py-1">
                    <button type="button" onClick={() => onChoose(p)} className="figure font-bold text-spruce underline underline-offset-4" aria-label={`Part ${p.order}: show it`}>
                      {p.order}
                    </button>
                    {flagged.has(p.id) ? <span className="ml-1 font-bold text-fault" title="A finding names this part">!</span> : null}
                  </td>
                  <td className="figure px-2 py-1">
                    {formatSize(w, unit)} × {formatSize(l, unit)}
                  </td>
                  <td className="figure px-2 py-1">{formatArea(p.areaMm2, unit)}</td>
                  {verdict ? (
                    <td className="px-2 py-1">
                      <span className={`font-bold ${verdict.held ? 'text-ok' : 'text-fault'}`}>{verdict.held ? '✓ Held' : '✕ Not held'}</span>
                      <span className="block text-xs text-ink-soft">{verdict.reason}</span>
                    </td>
                  ) : (
                    <td className="px-2 py-1">{p.held ? `Yes, ${HELD_BY_WORDS[p.holdBy]}` : 'No, held by nothing'}</td>
                  )}
                  <td className="figure px-2 py-1">{p.freedAtLine ? `line ${p.freedAtLine}` : p.tabs > 0 ? 'stays on tabs' : p.skinMm > 0 ? 'stays on the skin' : '—'}</td>
                </tr>
              );
            })}
            {padBottom > 0 ? (
              <tr aria-hidden="true" style={{ height: padBottom }}>
                <td colSpan={5} />
              </tr>
            ) : null}
          </tbody>
        </table>
      </div>
      {parts.length === 0 ? <p className="px-3 py-2">No parts cut free of the sheet were found.</p> : null}
    </section>
  );
}
