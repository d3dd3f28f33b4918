// Where a vacuum job's level comes from (issue 12: "vacuum level prefilled from the machine"):
// the machine's own level first, the level its last vacuum job used when the machine has
// none, empty when neither is known. Invented demo numbers.
import { describe, expect, it } from 'vitest';
import { machineVacuumKpa, newJobValues } from '@/lib/jobs/form-values';
import type { JobFormOptions } from '@/db/queries/jobs';

const machine = (defaultVacuumKpa: number | null, lastVacuumKpa: number | null, extra: Partial<JobFormOptions['machines'][number]> = {}) => ({
  id: 1,
  name: 'Router 1',
  defaultHoldDown: 'vacuum' as const,
  defaultVacuumKpa,
  lastVacuumKpa,
  archived: false,
  ...extra,
});
const options = (machines: JobFormOptions['machines']): JobFormOptions => ({ customers: [], machines, materials: [] });

describe('the vacuum level a new job starts from', () => {
  it("takes the machine's own level over the last job's", () => {
    expect(machineVacuumKpa(machine(61, 48))).toBe(61);
    expect(newJobValues(options([machine(61, 48)])).vacuumKpa).toBe('61');
  });

  it("falls back to the level the machine's last vacuum job used", () => {
    expect(machineVacuumKpa(machine(null, 48))).toBe(48);
    expect(newJobValues(options([machine(null, 48)])).vacuumKpa).toBe('48');
  });

  it('stays empty when neither is known, and for a machine whose usual hold-down is not vacuum', () => {
    expect(machineVacuumKpa(machine(null, null))).toBeNull();
    expect(newJobValues(options([machine(null, null)])).vacuumKpa).toBe('');
    expect(newJobValues(options([machine(61, 48, { defaultHoldDown: 'clamps' })])).vacuumKpa).toBe('');
  });

  it('skips an archived first machine', () => {
    const values = newJobValues(options([machine(30, null, { id: 1, archived: true }), machine(61, null, { id: 2 })]));
    expect(values).toMatchObject({ machineId: '2', vacuumKpa: '61' });
  });
});
