// A job's status as a word with a mark of its own; the tone only repeats what the
// word says. Every status has a different outline (not two that differ only by fill),
// so the marks can be told apart in grey, at a distance, or by a colour-blind reader.
// The marks are drawn here as small SVG paths (no icon font). Statuses never use the
// action colour (spruce), and `fault` is kept for things that went wrong.
import type { ReactElement } from 'react';
import { JOB_STATUS_LABELS, type JobStatus } from '@/lib/validation/enums';

/** The statuses that have a mark: every job status. */
export type MarkedStatus = JobStatus;

interface Mark {
  tone: string;
  /** the mark, drawn in currentColor on a 16 × 16 grid */
  shape: ReactElement;
}

const STROKE = { fill: 'none', stroke: 'currentColor', strokeWidth: 2.2, strokeLinecap: 'round', strokeLinejoin: 'round' } as const;

const NEUTRAL = 'border-rule text-ink-soft bg-panel';
const NOTE = 'border-note text-note bg-note-tint';
const OK = 'border-ok text-ok bg-ok-tint';
const CAUTION = 'border-caution text-caution bg-caution-tint';

export const STATUS_MARKS: Record<MarkedStatus, Mark> = {
  // a dashed ring: nothing settled yet
  draft: { tone: NEUTRAL, shape: <circle cx="8" cy="8" r="5.5" {...STROKE} strokeWidth={2} strokeDasharray="2.6 2.1" strokeLinecap="butt" /> },
  // a diamond: the program is in
  programmed: { tone: NOTE, shape: <path d="M8 1.5 14.5 8 8 14.5 1.5 8Z" fill="currentColor" /> },
  // a price tag: a quote went out
  quoted: { tone: NOTE, shape: <path d="M1.5 3.5h8.2L14.5 8l-4.8 4.5H1.5Z" fill="currentColor" /> },
  // a tick: the customer said yes
  accepted: { tone: OK, shape: <path d="M2.5 8.5 6.3 12.2 13.5 3.8" {...STROKE} strokeWidth={2.6} /> },
  // an hourglass: waiting for its slot on a machine
  scheduled: { tone: OK, shape: <path d="M3 1.8h10L8 8l5 6.2H3L8 8Z" fill="currentColor" /> },
  // a square half filled: part way through
  running: {
    tone: CAUTION,
    shape: (
      <>
        <rect x="2.2" y="2.2" width="11.6" height="11.6" rx="1" {...STROKE} strokeWidth={2} />
        <path d="M2.2 2.2H8v11.6H2.2Z" fill="currentColor" />
      </>
    ),
  },
  // a flag on its pole: finished
  done: {
    tone: OK,
    shape: (
      <>
        <path d="M3.5 1.5v13" {...STROKE} strokeWidth={2} />
        <path d="M4.5 2h9l-2.6 3.6L13.5 9.2h-9Z" fill="currentColor" />
      </>
    ),
  },
  // a cross: it will not be cut
  cancelled: { tone: 'border-rule text-ink-faint bg-ground', shape: <path d="M3.8 3.8l8.4 8.4M12.2 3.8l-8.4 8.4" {...STROKE} strokeWidth={2.4} /> },
};

/** Labels for every status, from the one list of them. */
export const STATUS_LABELS: Record<MarkedStatus, string> = JOB_STATUS_LABELS;

export function JobStatusBadge({ status }: { status: MarkedStatus }) {
  // A status the page does not know yet (a newer server) still shows its word.
  const mark: Mark | undefined = STATUS_MARKS[status];
  return (
    <span
      className={`inline-flex items-center gap-2 rounded-full border-2 px-3 py-0.5 text-sm font-bold ${mark?.tone ?? NEUTRAL}`}
      data-status={status}
    >
      {mark ? (
        <svg aria-hidden="true" viewBox="0 0 16 16" width="16" height="16" className="shrink-0">
          {mark.shape}
        </svg>
      ) : null}
      {STATUS_LABELS[status] ?? status}
    </span>
  );
}
