// The job form's starting values, as the strings its inputs hold: for a new job the shop's
// first machine that is not archived and that machine's usual hold-down (and the vacuum level
// last used on it); for an edit, the job as stored.
import type { Job } from '@/db/schema';
import type { JobFormOptions } from '@/db/queries/jobs';
import type { HoldDown, ZZero } from '@/lib/validation/enums';

export interface JobFormValues {
  title: string;
  customerId: string;
  machineId: string;
  materialId: string;
  sheetWidthMm: string;
  sheetLengthMm: string;
  sheetThicknessMm: string;
  zZero: ZZero;
  holdDown: HoldDown;
  vacuumKpa: string;
  quantity: string;
  dueDate: string;
  notes: string;
}

// the stored value exactly: a prefilled 3.175 mm must not become 3.18
const num = (v: number | null | undefined) => (v === null || v === undefined ? '' : String(v));

/** The vacuum level a job on this machine starts from: the machine's own, else the level its last vacuum job used. */
export function machineVacuumKpa(machine: Pick<JobFormOptions['machines'][number], 'defaultVacuumKpa' | 'lastVacuumKpa'> | undefined): number | null {
  return machine?.defaultVacuumKpa ?? machine?.lastVacuumKpa ?? null;
}

export function newJobValues(options: JobFormOptions): JobFormValues {
  const machine = options.machines.find((m) => !m.archived);
  const hold = machine?.defaultHoldDown ?? 'vacuum';
  return {
    title: '',
    customerId: '',
    machineId: machine ? String(machine.id) : '',
    materialId: '',
    sheetWidthMm: '',
    sheetLengthMm: '',
    sheetThicknessMm: '',
    zZero: 'top',
    holdDown: hold,
    vacuumKpa: hold === 'vacuum' ? num(machineVacuumKpa(machine)) : '',
    quantity: '1',
    dueDate: '',
    notes: '',
  };
}

export function jobFormValues(job: Job): JobFormValues {
  return {
    title: job.title,
    customerId: String(job.customerId),
    machineId: job.machineId === null ? '' : String(job.machineId),
    materialId: job.materialId === null ? '' : String(job.materialId),
    sheetWidthMm: num(job.sheetWidthMm),
    sheetLengthMm: num(job.sheetLengthMm),
    sheetThicknessMm: num(job.sheetThicknessMm),
    zZero: job.zZero,
    holdDown: job.holdDown,
    vacuumKpa: num(job.vacuumKpa),
    quantity: String(job.quantity),
    dueDate: job.dueDate ?? '',
    notes: job.notes ?? '',
  };
}
