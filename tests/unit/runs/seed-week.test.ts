// The dated demo jobs' due dates (db/seed-week.ts): the scheduled job falls inside the ISO week
// of the day the seed runs, whatever the weekday, so the dashboard's "machine hours this week"
// counts it. Checked against ISO 8601-1:2019 weeks (Monday to Sunday) worked out by hand for
// the week of Monday 2026-11-30 to Sunday 2026-12-06, and for a week across a year's end
// (2026-12-28 to 2027-01-03: 2027-01-01 is a Friday, ISO week 53 of 2026).
import { describe, expect, it } from 'vitest';
import { dueThisWeek, WEEK_JOBS } from '@/db/seed-week';

const at = (ymd: string) => new Date(`${ymd}T10:00:00Z`);

describe('dueThisWeek', () => {
  it('is the Friday until Friday, then the Sunday of the same ISO week', () => {
    expect(dueThisWeek(at('2026-11-30'))).toBe('2026-12-04'); // Monday
    expect(dueThisWeek(at('2026-12-03'))).toBe('2026-12-04'); // Thursday
    expect(dueThisWeek(at('2026-12-04'))).toBe('2026-12-04'); // Friday
    expect(dueThisWeek(at('2026-12-05'))).toBe('2026-12-06'); // Saturday
    expect(dueThisWeek(at('2026-12-06'))).toBe('2026-12-06'); // Sunday
  });

  it('stays in the week across a year’s end', () => {
    expect(dueThisWeek(at('2026-12-28'))).toBe('2027-01-01');
    expect(dueThisWeek(at('2027-01-02'))).toBe('2027-01-03');
  });

  it('reads the day in UTC (the pages’ clock): late on Thursday UTC is still Thursday', () => {
    expect(dueThisWeek(new Date('2026-12-03T23:59:59Z'))).toBe('2026-12-04');
    expect(dueThisWeek(new Date('2026-12-04T23:59:59Z'))).toBe('2026-12-04');
  });
});

describe('the dated demo jobs', () => {
  it('are one scheduled this week and one waiting job due in two days', () => {
    const [week, soon] = WEEK_JOBS;
    expect(week.status).toBe('scheduled');
    expect(week.due(at('2026-12-01'))).toBe('2026-12-04');
    expect(soon.due(at('2026-12-30'))).toBe('2027-01-01');
  });
});
