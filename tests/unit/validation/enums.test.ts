// The form enumerations must stay equal to the database's (db/schema.ts), or a form
// would offer a value MariaDB's ENUM column refuses.
import { describe, expect, it } from 'vitest';
import * as schema from '@/db/schema';
import { HOLD_DOWNS, JOB_STATUSES, ROLES, TOOL_KINDS, Z_ZEROS, HOLD_DOWN_LABELS, JOB_STATUS_LABELS, ROLE_LABELS, TOOL_KIND_LABELS } from '@/lib/validation/enums';
import { machineProfileSchema } from '@/lib/validation/machine-profile';

describe('lib/validation/enums', () => {
  it('matches db/schema.ts', () => {
    expect([...ROLES]).toEqual([...schema.ROLES]);
    expect([...HOLD_DOWNS]).toEqual([...schema.HOLD_DOWNS]);
    expect([...Z_ZEROS]).toEqual([...schema.Z_ZEROS]);
    expect([...JOB_STATUSES]).toEqual([...schema.JOB_STATUSES]);
    // the tools table's ENUM column takes its values from the same list
    expect(schema.tools.kind.enumValues).toEqual([...TOOL_KINDS]);
  });

  it('gives the profile schema the same tool kinds (the CLI and the forms accept the same set)', () => {
    const kind = machineProfileSchema.shape.tools.element.shape.kind;
    expect(kind.options).toEqual([...TOOL_KINDS]);
  });

  it('has a distinct label for every value', () => {
    for (const labels of [ROLE_LABELS, HOLD_DOWN_LABELS, JOB_STATUS_LABELS, TOOL_KIND_LABELS]) {
      const values = Object.values(labels);
      expect(new Set(values).size).toBe(values.length);
    }
    expect(Object.keys(JOB_STATUS_LABELS)).toEqual([...JOB_STATUSES]);
    expect(Object.keys(HOLD_DOWN_LABELS)).toEqual([...HOLD_DOWNS]);
    expect(Object.keys(TOOL_KIND_LABELS)).toEqual([...TOOL_KINDS]);
  });
});
