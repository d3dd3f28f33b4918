// History lines for the job_events kinds the queries write (db/queries/jobs.ts: created,
// edited with the changed fields, status as "from>to"; db/queries/programs.ts: program-uploaded
// with "name, version n"; lib/estimate-server/queue.ts: estimate-done with a sentence). Status words are the enum labels of lib/validation/enums.ts.
import { describe, expect, it } from 'vitest';
import { historyLine } from '@/lib/jobs/history-words';

describe('historyLine', () => {
  it('words each kind', () => {
    expect(historyLine('created', '')).toBe('Created the job.');
    expect(historyLine('edited', 'sheet size, quantity')).toBe('Changed sheet size, quantity.');
    expect(historyLine('status', 'draft>programmed')).toBe('Moved the job from draft to programmed.');
    expect(historyLine('program-uploaded', 'brackets.nc, version 2')).toBe('Uploaded brackets.nc, version 2.');
  });

  it('keeps what it does not know readable', () => {
    expect(historyLine('status', 'draft>paused')).toBe('Changed the status (draft>paused).');
    expect(historyLine('estimate-done', 'Estimate 16 of brackets.nc v1: 271.0 s, 0 errors, 4 warnings.')).toBe('finished estimate 16 of brackets.nc v1: 271.0 s, 0 errors, 4 warnings.');
    expect(historyLine('run-logged', 'Lena logged 5 min 2 s.')).toBe('Lena logged 5 min 2 s.');
    expect(historyLine('run-logged', '')).toBe('run logged.');
  });
});
