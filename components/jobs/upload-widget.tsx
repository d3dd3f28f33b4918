'use client';
// Program upload on the job page: drop files on the area or choose them with the file
// picker; several at once, each with its own bar (bytes sent), its cancel button and its own
// message. Names and sizes are checked before anything is sent; at most two files travel at a
// time, the rest wait their turn. Each stored file refreshes the programs list.
import { useCallback, useEffect, useRef, useState, type DragEvent } from 'react';
import { Button } from '@/components/ui/button';
import { ProgressBar } from '@/components/ui/progress-bar';
import { formatBytes } from '@/lib/jobs/format';
import { checkBeforeSending, sendProgram, type UploadedProgramView, type UploadHandle } from '@/lib/jobs/upload-request';
import { PROGRAM_EXTENSIONS } from '@/lib/programs/program-names';

const AT_A_TIME = 2;

type ItemState = 'waiting' | 'sending' | 'stored' | 'refused' | 'failed' | 'cancelled';

interface Item {
  key: number;
  file: File;
  state: ItemState;
  sentBytes: number;
  message: string;
}

const STATE_WORDS: Record<ItemState | 'storing', { glyph: string; word: string; tone: string }> = {
  waiting: { glyph: '…', word: 'Waiting', tone: 'text-ink-soft' },
  sending: { glyph: '↑', word: 'Sending', tone: 'text-ink' },
  // every byte sent, the answer not in yet: the server is streaming it to storage and checking it
  storing: { glyph: '↑', word: 'Storing', tone: 'text-ink' },
  stored: { glyph: '✓', word: 'Stored', tone: 'text-ok' },
  refused: { glyph: '✕', word: 'Not sent', tone: 'text-fault' },
  failed: { glyph: '✕', word: 'Not stored', tone: 'text-fault' },
  cancelled: { glyph: '–', word: 'Cancelled', tone: 'text-ink-soft' },
};

export function UploadWidget({ jobId, maxBytes, onStored }: { jobId: number; maxBytes: number; onStored: (programs: UploadedProgramView[]) => void }) {
  const [items, setItems] = useState<Item[]>([]);
  const [dragging, setDragging] = useState(false);
  const handles = useRef(new Map<number, UploadHandle>());
  const nextKey = useRef(1);
  // keys already started: the effect below may run again before the new state is rendered
  const started = useRef(new Set<number>());
  const inputRef = useRef<HTMLInputElement>(null);

  const update = useCallback((key: number, patch: Partial<Item>) => setItems((list) => list.map((i) => (i.key === key ? { ...i, ...patch } : i))), []);

  // start waiting files while fewer than AT_A_TIME are on their way
  useEffect(() => {
    const sending = items.filter((i) => i.state === 'sending' || (i.state === 'waiting' && started.current.has(i.key))).length;
    const waiting = items.filter((i) => i.state === 'waiting' && !started.current.has(i.key)).slice(0, Math.max(0, AT_A_TIME - sending));
    for (const item of waiting) {
      started.current.add(item.key);
      update(item.key, { state: 'sending' });
      const handle = sendProgram(`/api/jobs/${jobId}/programs`, item.file, (sentBytes) => update(item.key, { sentBytes }));
      handles.current.set(item.key, handle);
      handle.done.then((outcome) => {
        handles.current.delete(item.key);
        if (outcome.ok) {
          const stored = outcome.programs[0];
          update(item.key, { state: 'stored', sentBytes: item.file.size, message: stored ? `Stored as ${stored.name}, version ${stored.version}; its estimate is queued.` : 'Stored.' });
          onStored(outcome.programs);
        } else {
          update(item.key, { state: outcome.cancelled ? 'cancelled' : 'failed', message: outcome.message });
        }
      });
    }
  }, [items, jobId, onStored, update]);

  // leaving the page cancels what is still on its way (the server keeps nothing of it)
  useEffect(() => {
    const current = handles.current;
    return () => current.forEach((h) => h.cancel());
  }, []);

  function add(files: FileList | File[]) {
    const added: Item[] = [...files].map((file) => {
      const refusal = checkBeforeSending(file, maxBytes);
      return { key: nextKey.current++, file, state: refusal ? 'refused' : 'waiting', sentBytes: 0, message: refusal ?? '' };
    });
    setItems((list) => [...added, ...list]);
  }

  function cancel(item: Item) {
    if (item.state === 'waiting') update(item.key, { state: 'cancelled', message: 'Cancelled before sending.' });
    else handles.current.get(item.key)?.cancel();
  }

  function onDrop(event: DragEvent<HTMLDivElement>) {
    event.preventDefault();
    setDragging(false);
    if (event.dataTransfer.files.length > 0) add(event.dataTransfer.files);
  }

  const finished = items.some((i) => i.state !== 'waiting' && i.state !== 'sending');

  return (
    <section aria-labelledby="upload-title" className="rounded-md border-2 border-rule bg-panel p-5" data-testid="upload-widget">
      <h3 id="upload-title" className="text-lg font-bold">Upload programs</h3>
      <div
        onDragOver={(e) => {
          e.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={onDrop}
        className={`mt-3 flex flex-col items-center gap-3 rounded-md border-2 border-dashed p-6 text-center ${dragging ? 'border-spruce bg-spruce-light' : 'border-rule bg-ground'}`}
      >
        <p>
          <span className="font-bold">Drop G-code files here</span> or choose them; several at once are fine.
        </p>
        <label htmlFor="program-files" className="inline-flex min-h-target cursor-pointer items-center rounded-md border-2 border-spruce bg-spruce px-4 font-bold text-white hover:bg-spruce-dark has-[:focus-visible]:outline has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-offset-2 has-[:focus-visible]:outline-ink">
          Choose program files
          <input
            ref={inputRef}
            id="program-files"
            type="file"
            multiple
            accept={PROGRAM_EXTENSIONS.join(',')}
            className="sr-only"
            aria-describedby="program-files-hint"
            onChange={(e) => {
              if (e.target.files) add(e.target.files);
              e.target.value = '';
            }}
          />
        </label>
        <p id="program-files-hint" className="text-sm text-ink-soft">
          Endings {PROGRAM_EXTENSIONS.join(' ')}, up to {formatBytes(maxBytes)} each. A name the job already has becomes that program&apos;s next version.
        </p>
      </div>

      {items.length > 0 ? (
        <ul className="mt-4 flex flex-col gap-3" aria-label="Files being uploaded" aria-live="polite">
          {items.map((item) => {
            const words = STATE_WORDS[item.state === 'sending' && item.sentBytes >= item.file.size ? 'storing' : item.state];
            const share = item.file.size > 0 ? item.sentBytes / item.file.size : 0;
            return (
              <li key={item.key} className="rounded-md border-2 border-rule-light p-3" data-testid="upload-item" data-state={item.state}>
                <div className="flex flex-wrap items-center justify-between gap-2">
                  <p className="font-bold">
                    <span className={words.tone}>
                      <span aria-hidden="true">{words.glyph} </span>
                      {words.word}:
                    </span>{' '}
                    <span className="break-all">{item.file.name}</span>
                  </p>
                  {item.state === 'waiting' || item.state === 'sending' ? (
                    <Button variant="secondary" onClick={() => cancel(item)} aria-label={`Cancel ${item.file.name}`}>
                      Cancel
                    </Button>
                  ) : null}
                </div>
                {item.state !== 'refused' ? (
                  <div className="mt-2">
                    <ProgressBar
                      label={`${item.file.name}: bytes sent`}
                      value={share}
                      text={`${formatBytes(item.sentBytes)} of ${formatBytes(item.file.size)} · ${Math.round(share * 100)} %`}
                    />
                  </div>
                ) : null}
                {item.message ? <p className={`mt-2 text-sm ${item.state === 'failed' || item.state === 'refused' ? 'font-bold text-fault' : 'text-ink-soft'}`} data-testid="upload-message">{item.message}</p> : null}
              </li>
            );
          })}
        </ul>
      ) : null}
      {finished ? (
        <Button variant="secondary" className="mt-3" onClick={() => setItems((list) => list.filter((i) => i.state === 'waiting' || i.state === 'sending'))}>
          Clear finished files
        </Button>
      ) : null}
    </section>
  );
}
