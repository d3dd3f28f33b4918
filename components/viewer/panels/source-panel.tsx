'use client';
// The whole program as text, virtualised (@tanstack/react-virtual: only the lines on screen
// exist in the DOM, decoded from the file's bytes on demand), monospace, the playhead's line
// highlighted and kept in view; clicking a line moves the playhead there.
import { useVirtualizer } from '@tanstack/react-virtual';
import { useEffect, useMemo, useRef } from 'react';
import { lineCountOf, lineText } from '@/lib/viewer/line-index';
import { usePlayback, type PlaybackStore } from '../playback-store';

const ROW_PX = 24;

export function SourcePanel({ bytes, starts, store }: { bytes: Uint8Array; starts: Uint32Array; store: PlaybackStore }) {
  const snap = usePlayback(store);
  const parent = useRef<HTMLDivElement>(null);
  const decoder = useMemo(() => new TextDecoder(), []);
  const count = lineCountOf(starts);
  const virtualizer = useVirtualizer({ count, getScrollElement: () => parent.current, estimateSize: () => ROW_PX, overscan: 12 });
  useEffect(() => {
    if (snap.line >= 1) virtualizer.scrollToIndex(snap.line - 1, { align: 'auto' });
  }, [snap.line, virtualizer]);
  const digits = String(count).length;
  return (
    <section aria-labelledby="source-title" className="flex min-h-0 flex-col rounded-md border-2 border-rule bg-panel">
      <h3 id="source-title" className="border-b-2 border-rule-light px-3 py-2 text-base font-bold">
        Program text <span className="figure font-normal text-ink-soft">({count.toLocaleString('en')} lines)</span>
      </h3>
      <div ref={parent} className="h-80 overflow-auto font-mono text-sm" data-testid="source-panel" role="list" aria-label="Program lines">
        <div className="relative w-full" style={{ height: virtualizer.getTotalSize() }}>
          {virtualizer.getVirtualItems().map((row) => {
            const line = row.index + 1;
            const current = line === snap.line;
            return (
              <div
                key={row.key}
                role="listitem"
                data-line={line}
                aria-current={current ? 'true' : undefined}
                className={`absolute left-0 top-0 flex w-full cursor-pointer whitespace-pre px-2 ${current ? 'bg-spruce text-white' : 'hover:bg-ground'}`}
                style={{ height: ROW_PX, transform: `translateY(${row.start}px)` }}
                onClick={() => store.toLine(line)}
              >
                <span className={`mr-3 inline-block select-none text-right ${current ? 'text-white' : 'text-ink-faint'}`} style={{ width: `${digits}ch` }}>
                  {line}
                </span>
                {lineText(bytes, starts, line, decoder)}
              </div>
            );
          })}
        </div>
      </div>
    </section>
  );
}
