// The job status marks of components/jobs/job-status-badge.tsx, against the rules in
// docs/style.md: every status of the job's life (draft → programmed → quoted → accepted
// → scheduled → running → done, or cancelled) has a word and a mark; no two marks
// share an outline (two that differ only by fill are hard to tell apart in grey or at
// a distance); statuses never wear the action colour; "Done" does not look like a stop.
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { JobStatusBadge, STATUS_LABELS, STATUS_MARKS, type MarkedStatus } from '@/components/jobs/job-status-badge';
import { JOB_STATUSES } from '@/lib/validation/enums';

const LIFE: MarkedStatus[] = ['draft', 'programmed', 'quoted', 'accepted', 'scheduled', 'running', 'done', 'cancelled'];

/** The mark's geometry alone: its elements and coordinates, with fill and stroke styling removed. */
function outline(status: MarkedStatus): string {
  return renderToStaticMarkup(STATUS_MARKS[status].shape)
    .replace(/\s(fill|stroke|stroke-width|stroke-linecap|stroke-linejoin|stroke-dasharray)="[^"]*"/g, '')
    .replace(/\s+/g, ' ');
}

describe('job status marks', () => {
  it('cover every status of the enum and the coming "scheduled"', () => {
    for (const s of [...JOB_STATUSES, 'scheduled' as const]) {
      expect(STATUS_MARKS[s], s).toBeDefined();
      expect(STATUS_LABELS[s], s).toMatch(/^[A-Z][a-z]+$/);
    }
    expect(Object.keys(STATUS_MARKS).sort()).toEqual([...LIFE].sort());
  });

  it('have eight different outlines, so none differs from another by fill alone', () => {
    const outlines = LIFE.map(outline);
    expect(new Set(outlines).size).toBe(LIFE.length);
  });

  it('never use the action colour (spruce)', () => {
    for (const s of LIFE) expect(STATUS_MARKS[s].tone, s).not.toMatch(/spruce/);
  });

  it('do not mark "Done" like a stop: no square, no fault tone, and not the mark of "Cancelled"', () => {
    const done = outline('done');
    expect(done).not.toMatch(/<rect/);
    expect(STATUS_MARKS.done.tone).not.toMatch(/fault/);
    expect(STATUS_MARKS.done.tone).not.toBe(STATUS_MARKS.cancelled.tone);
  });

  it('render the word with the mark hidden from screen readers, the word being what is read', () => {
    const html = renderToStaticMarkup(createElement(JobStatusBadge, { status: 'scheduled' }));
    expect(html).toContain('<svg aria-hidden="true"');
    expect(html.replace(/<[^>]+>/g, '')).toBe('Scheduled');
  });
});
