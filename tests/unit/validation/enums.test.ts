// The form enumerations must stay equal to the database's (db/schema.ts), or a form
// would offer a value MariaDB's ENUM column refuses.
import { describe, expect, it } from 'vitest';
import * as schema from '@/db/schema';
import { HOLD_DOWNS, JOB_STATUSES, ROLES, Z_ZEROS, HOLD_DOWN_LABELS, JOB_STATUS_LABELS, ROLE_LABELS } from '@/lib/validation/enums';

describe('lib/validation/enums', () => {
  it('matches db/schema.ts', () => {
    expect([...ROLES]).toEqual([...schema.ROLES]);
    expect([...HOLD_DOWNS]).toEqual([...schema.HOLD_DOWNS]);
    expect([...Z_ZEROS]).toEqual([...schema.Z_ZEROS]);
    expect([...JOB_STATUSES]).toEqual([...schema.JOB_STATUSES]);
  });

  it('has a distinct label for every value', () => {
    for (const labels of [ROLE_LABELS, HOLD_DOWN_LABELS, JOB_STATUS_LABELS]) {
      const values = Object.values(labels);
      expect(new Set(values).size).toBe(values.length);
    }
    expect(Object.keys(JOB_STATUS_LABELS)).toEqual([...JOB_STATUSES]);
    expect(Object.keys(HOLD_DOWN_LABELS)).toEqual([...HOLD_DOWNS]);
  });
});
