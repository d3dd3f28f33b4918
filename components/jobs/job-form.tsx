'use client';
// The create and edit form of a job. Choosing a material fills in the sheet X × Y × T from
// it; choosing a machine fills in its usual hold-down and the vacuum level last used on it.
// Both stay editable. The shared zod schema checks the form in the page (field errors at
// once, focus on the first one), and the server action checks it again.
import { useEffect, useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { FieldShell, InputField, SelectField } from '@/components/ui/field';
import { LinkButton } from '@/components/ui/link-button';
import { ActionNotice } from '@/components/ui/notice';
import { useValidatedAction } from '@/components/ui/use-validated-action';
import type { JobFormOptions } from '@/db/queries/jobs';
import type { ActionState } from '@/lib/http/action-state';
import { machineVacuumKpa, type JobFormValues } from '@/lib/jobs/form-values';
import { HOLD_DOWN_LABELS, HOLD_DOWNS, type HoldDown, type ZZero } from '@/lib/validation/enums';
import { jobCreateSchema } from '@/lib/validation/jobs';

interface Props {
  mode: 'create' | 'edit';
  jobId?: number;
  options: JobFormOptions;
  initial: JobFormValues;
  action: (state: ActionState, form: FormData) => Promise<ActionState>;
}

// the stored value exactly: a prefilled 3.175 mm must not become 3.18
const num = (v: number | null | undefined) => (v === null || v === undefined ? '' : String(v));

export function JobForm({ mode, jobId, options, initial, action }: Props) {
  const { state, fields, pending, onSubmit, formRef } = useValidatedAction(jobCreateSchema, action);
  const [values, setValues] = useState(initial);
  // fields changed since their errors were shown: their old message no longer applies
  const [changed, setChanged] = useState<ReadonlySet<string>>(new Set());
  const set = (patch: Partial<JobFormValues>) => {
    setValues((v) => ({ ...v, ...patch }));
    setChanged((c) => new Set([...c, ...Object.keys(patch)]));
  };
  const errorsOf = (name: keyof JobFormValues) => (changed.has(name) ? undefined : fields[name]);

  // keyboard users land on the first field that needs fixing
  // (fields is a new object on every render; its text says when the errors really changed)
  const [submits, setSubmits] = useState(0);
  const fieldsKey = JSON.stringify(fields);
  useEffect(() => {
    if (fieldsKey === '{}') return;
    // after the render that shows the new errors
    requestAnimationFrame(() => formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());
  }, [fieldsKey, submits, formRef]);

  function submit(event: FormEvent<HTMLFormElement>) {
    setChanged(new Set());
    setSubmits((n) => n + 1);
    onSubmit(event);
  }

  function chooseMaterial(id: string) {
    const material = options.materials.find((m) => String(m.id) === id);
    if (!material) return set({ materialId: id });
    set({ materialId: id, sheetWidthMm: num(material.sheetWidthMm), sheetLengthMm: num(material.sheetLengthMm), sheetThicknessMm: num(material.thicknessMm) });
  }

  function chooseMachine(id: string) {
    const machine = options.machines.find((m) => String(m.id) === id);
    if (!machine) return set({ machineId: id });
    set({ machineId: id, holdDown: machine.defaultHoldDown, vacuumKpa: machine.defaultHoldDown === 'vacuum' ? num(machineVacuumKpa(machine)) : '' });
  }

  const vacuum = values.holdDown === 'vacuum';
  const machine = options.machines.find((m) => String(m.id) === values.machineId);
  const title = mode === 'create' ? 'New job' : 'Edit job';

  return (
    <form ref={formRef} onSubmit={submit} noValidate aria-label={title} className="flex max-w-4xl flex-col gap-6 rounded-md border-2 border-rule bg-panel p-5">
      <ActionNotice state={state} />
      {jobId ? <input type="hidden" name="jobId" value={jobId} /> : null}

      <fieldset className="grid gap-4 md:grid-cols-2">
        <legend className="mb-2 text-lg font-bold">The job</legend>
        <InputField id="job-title" name="title" label="Title" required value={values.title} onChange={(e) => set({ title: e.target.value })} errors={errorsOf('title')} hint="What the shop calls it, e.g. “Window display shelf brackets”." />
        <SelectField
          id="job-customer"
          name="customerId"
          label="Customer"
          required
          value={values.customerId}
          onChange={(e) => set({ customerId: e.target.value })}
          errors={errorsOf('customerId')}
          options={[{ value: '', label: 'Choose a customer' }, ...options.customers.map((c) => ({ value: String(c.id), label: c.name }))]}
        />
        <InputField id="job-quantity" name="quantity" label="Quantity (pieces)" inputMode="numeric" required value={values.quantity} onChange={(e) => set({ quantity: e.target.value })} errors={errorsOf('quantity')} />
        <InputField id="job-due" name="dueDate" type="date" label="Due date" hint="Optional." value={values.dueDate} onChange={(e) => set({ dueDate: e.target.value })} errors={errorsOf('dueDate')} />
      </fieldset>

      <fieldset className="grid gap-4 md:grid-cols-2">
        <legend className="mb-2 text-lg font-bold">Machine and sheet</legend>
        <SelectField
          id="job-machine"
          name="machineId"
          label="Machine"
          value={values.machineId}
          onChange={(e) => chooseMachine(e.target.value)}
          errors={errorsOf('machineId')}
          hint="Estimates on upload are made for this machine; choosing it fills in its usual hold-down."
          options={options.machines.map((m) => ({ value: String(m.id), label: m.archived ? `${m.name} (archived)` : m.name }))}
        />
        <SelectField
          id="job-material"
          name="materialId"
          label="Material"
          value={values.materialId}
          onChange={(e) => chooseMaterial(e.target.value)}
          errors={errorsOf('materialId')}
          hint="Choosing one fills in its sheet size and thickness."
          options={[{ value: '', label: 'Not set' }, ...options.materials.map((m) => ({ value: String(m.id), label: m.name }))]}
        />
        <div className="grid gap-4 sm:grid-cols-3 md:col-span-2">
          <InputField id="job-sheet-x" name="sheetWidthMm" label="Sheet X (mm)" inputMode="decimal" required value={values.sheetWidthMm} onChange={(e) => set({ sheetWidthMm: e.target.value })} errors={errorsOf('sheetWidthMm')} />
          <InputField id="job-sheet-y" name="sheetLengthMm" label="Sheet Y (mm)" inputMode="decimal" required value={values.sheetLengthMm} onChange={(e) => set({ sheetLengthMm: e.target.value })} errors={errorsOf('sheetLengthMm')} />
          <InputField id="job-sheet-t" name="sheetThicknessMm" label="Thickness T (mm)" inputMode="decimal" required value={values.sheetThicknessMm} onChange={(e) => set({ sheetThicknessMm: e.target.value })} errors={errorsOf('sheetThicknessMm')} />
        </div>
        <SelectField
          id="job-zero"
          name="zZero"
          label="Z zero"
          value={values.zZero}
          onChange={(e) => set({ zZero: e.target.value as ZZero })}
          errors={errorsOf('zZero')}
          hint="Where the program's Z 0 is."
          options={[
            { value: 'top', label: 'Top of stock' },
            { value: 'table', label: 'Table surface' },
          ]}
        />
      </fieldset>

      <fieldset className="grid gap-4 md:grid-cols-2">
        <legend className="mb-2 text-lg font-bold">Hold-down</legend>
        <SelectField
          id="job-hold"
          name="holdDown"
          label="Hold-down method"
          value={values.holdDown}
          onChange={(e) => set({ holdDown: e.target.value as HoldDown, vacuumKpa: e.target.value === 'vacuum' ? values.vacuumKpa || num(machineVacuumKpa(machine)) : '' })}
          errors={errorsOf('holdDown')}
          hint={machine ? `${machine.name} usually uses: ${HOLD_DOWN_LABELS[machine.defaultHoldDown].toLowerCase()}.` : undefined}
          options={HOLD_DOWNS.map((h) => ({ value: h, label: HOLD_DOWN_LABELS[h] }))}
        />
        <InputField
          id="job-vacuum"
          name="vacuumKpa"
          label="Vacuum level (kPa below atmosphere)"
          inputMode="decimal"
          disabled={!vacuum}
          value={vacuum ? values.vacuumKpa : ''}
          onChange={(e) => set({ vacuumKpa: e.target.value })}
          errors={errorsOf('vacuumKpa')}
          hint={vacuum ? (machine?.defaultVacuumKpa ? `The level ${machine.name}'s table holds; change it if the gauge reads otherwise.` : machine?.lastVacuumKpa ? `The level last used on ${machine.name}; change it if the gauge reads otherwise.` : 'Read it off the gauge; optional.') : 'Only for vacuum hold-down.'}
        />
      </fieldset>

      <FieldShell id="job-notes" label="Notes" hint="Optional: edge finish, packing, what the customer asked for." errors={errorsOf('notes')}>
        <textarea
          id="job-notes"
          name="notes"
          rows={3}
          value={values.notes}
          onChange={(e) => set({ notes: e.target.value })}
          aria-invalid={errorsOf('notes')?.length ? true : undefined}
          aria-describedby={`job-notes-hint${errorsOf('notes')?.length ? ' job-notes-error' : ''}`}
          className="rounded-md border-2 border-rule bg-panel px-3 py-2 text-base text-ink aria-[invalid=true]:border-3 aria-[invalid=true]:border-fault"
        />
      </FieldShell>

      <div className="flex flex-wrap gap-3">
        <Button type="submit" disabled={pending}>
          {pending ? 'Saving…' : mode === 'create' ? 'Create job' : 'Save changes'}
        </Button>
        <LinkButton href={jobId ? `/jobs/${jobId}` : '/jobs'} variant="secondary">
          Cancel
        </LinkButton>
      </div>
    </form>
  );
}
