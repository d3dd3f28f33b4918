// Who may correct a run (lib/runs/correct-rule.ts, the rule issue 15 states: operators their
// own runs on the day, admins any run), the estimate a run is measured against
// (lib/runs/run-estimate.ts: one sheet's estimate × sheets cut, common practice), and the
// timer's face and typed durations (lib/runs/run-format.ts), on hand-picked values.
import { describe, expect, it } from 'vitest';
import { mayCorrect } from '@/lib/runs/correct-rule';
import { runEstimateSeconds } from '@/lib/runs/run-estimate';
import { clockFace, parseDurationText } from '@/lib/runs/run-format';

const run = { operatorId: 8, startedAt: new Date('2026-12-04T07:10:00Z'), finishedAt: new Date('2026-12-04T09:40:00Z') };

describe('who may correct a finished run', () => {
  it('its operator, on the UTC day it ended', () => {
    expect(mayCorrect({ id: 8, role: 'operator' }, run, new Date('2026-12-04T23:59:59Z'))).toBe(true);
    expect(mayCorrect({ id: 8, role: 'operator' }, run, new Date('2026-12-05T00:00:00Z'))).toBe(false);
  });
  it('not another operator, nor a role that does not log runs', () => {
    expect(mayCorrect({ id: 9, role: 'operator' }, run, new Date('2026-12-04T10:00:00Z'))).toBe(false);
    expect(mayCorrect({ id: 8, role: 'estimator' }, run, new Date('2026-12-04T10:00:00Z'))).toBe(false);
    expect(mayCorrect({ id: 8, role: 'programmer' }, run, new Date('2026-12-04T10:00:00Z'))).toBe(false);
  });
  it('an admin, any run on any day', () => {
    expect(mayCorrect({ id: 1, role: 'admin' }, run, new Date('2027-03-01T10:00:00Z'))).toBe(true);
  });
  it('a run that ended after midnight counts on the day it ended, not the day it started', () => {
    const late = { operatorId: 8, startedAt: '2026-12-04T23:30:00Z', finishedAt: '2026-12-05T00:20:00Z' };
    expect(mayCorrect({ id: 8, role: 'operator' }, late, new Date('2026-12-05T08:00:00Z'))).toBe(true);
    expect(mayCorrect({ id: 8, role: 'operator' }, late, new Date('2026-12-04T23:59:00Z'))).toBe(false);
  });
});

describe('the estimate for a run', () => {
  it('is one sheet’s seconds × sheets cut', () => {
    expect(runEstimateSeconds(271.5, 4)).toBe(1086);
  });
  it('is missing without an estimate or without a sheet cut', () => {
    expect(runEstimateSeconds(null, 3)).toBeNull();
    expect(runEstimateSeconds(0, 3)).toBeNull();
    expect(runEstimateSeconds(271.5, 0)).toBeNull();
    expect(runEstimateSeconds(271.5, null)).toBeNull();
  });
});

describe('times on the run forms', () => {
  it('shows h:mm:ss', () => {
    expect(clockFace(0)).toBe('0:00:00');
    expect(clockFace(59.99)).toBe('0:00:59');
    expect(clockFace(3725)).toBe('1:02:05');
    expect(clockFace(36_000)).toBe('10:00:00');
    expect(clockFace(-5)).toBe('0:00:00');
  });
  it('reads minutes, h:mm and h:mm:ss', () => {
    expect(parseDurationText('45')).toBe(2700);
    expect(parseDurationText(' 45.5 ')).toBe(2730);
    expect(parseDurationText('1:05')).toBe(3900);
    expect(parseDurationText('1:05:30')).toBe(3930);
    for (const bad of ['', '1:65', 'an hour', '-5', '1:05:61']) expect(parseDurationText(bad), bad).toBeNull();
  });
});
