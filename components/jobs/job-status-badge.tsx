// A job's status as a word with its own glyph; the tone only repeats what the word
// says. Glyphs are drawn here (no icon font).
import { JOB_STATUS_LABELS, type JobStatus } from '@/lib/validation/enums';

const LOOK: Record<JobStatus, { tone: string; glyph: string }> = {
  draft: { tone: 'border-rule text-ink-soft bg-panel', glyph: '○' },
  programmed: { tone: 'border-info text-info bg-info-tint', glyph: '◆' },
  quoted: { tone: 'border-hold text-hold bg-hold-tint', glyph: '◇' },
  accepted: { tone: 'border-go text-go bg-go-tint', glyph: '✓' },
  running: { tone: 'border-spruce text-spruce bg-spruce-light', glyph: '▶' },
  done: { tone: 'border-go text-go bg-go-tint', glyph: '■' },
  cancelled: { tone: 'border-stop text-stop bg-stop-tint', glyph: '✕' },
};

export function JobStatusBadge({ status }: { status: JobStatus }) {
  const look = LOOK[status];
  return (
    <span className={`inline-flex items-center gap-2 rounded-full border-2 px-3 py-0.5 text-sm font-bold ${look.tone}`}>
      <span aria-hidden="true">{look.glyph}</span>
      {JOB_STATUS_LABELS[status]}
    </span>
  );
}
