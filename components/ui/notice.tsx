// A boxed message with a tone, a glyph and a title: the glyph and the words carry
// the meaning, the colour only repeats it.
import type { ReactNode } from 'react';

export type Tone = 'note' | 'ok' | 'caution' | 'fault';

// The screen-reader label says what kind of message it is, as the glyph does for the eye.
const TONES: Record<Tone, { box: string; glyph: string; label: string }> = {
  note: { box: 'border-note bg-note-tint text-note', glyph: 'i', label: 'Note' },
  ok: { box: 'border-ok bg-ok-tint text-ok', glyph: '✓', label: 'Success' },
  caution: { box: 'border-caution bg-caution-tint text-caution', glyph: '!', label: 'Caution' },
  fault: { box: 'border-fault bg-fault-tint text-fault', glyph: '✕', label: 'Problem' },
};

export function Notice({ tone, title, children, role }: { tone: Tone; title: string; children?: ReactNode; role?: 'alert' | 'status' }) {
  const t = TONES[tone];
  return (
    <div role={role} className={`flex gap-3 rounded-md border-l-8 border-2 p-4 ${t.box}`}>
      <span aria-hidden="true" className="flex h-8 w-8 shrink-0 items-center justify-center rounded-full border-2 border-current font-bold">
        {t.glyph}
      </span>
      <div className="text-ink">
        <p className="font-bold">
          <span className="sr-only">{t.label}: </span>
          <span data-part="title">{title}</span>
        </p>
        {children ? <div className="mt-1">{children}</div> : null}
      </div>
    </div>
  );
}

/** The outcome of a form's server action, as the form shows it: a status when saved, an alert when not. */
export function ActionNotice({ state }: { state: { status: string; message?: string } }) {
  if (state.status === 'ok') return <Notice tone="ok" title={state.message ?? 'Saved.'} role="status" />;
  if (state.status === 'error') return <Notice tone="fault" title={state.message ?? 'Not saved.'} role="alert" />;
  return null;
}
