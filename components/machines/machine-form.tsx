'use client';
// The machine profile form (create and edit): every field of the CLI's profile schema with
// its unit in the label and one line on what it does, plus the hourly rate and the default
// hold-down. Lengths, feeds and accelerations are shown and typed in the shop's unit and
// sent in mm; a field left as it was sends its stored value unchanged, so saving an
// untouched form in inches makes no new version. Checked in the page with the CLI's zod
// schema, and again by the server action.
import { Button } from '@/components/ui/button';
import { FieldShell, InputField, SelectField } from '@/components/ui/field';
import { ActionNotice, Notice } from '@/components/ui/notice';
import { useConvertedAction, type Converted } from '@/components/ui/use-converted-action';
import type { FieldErrors } from '@/lib/errors';
import type { ActionState } from '@/lib/http/action-state';
import {
  AXES,
  AXES_FIELDS,
  fieldLabel,
  fieldOf,
  flatToProfileInput,
  isLengthMeasure,
  NAME_FIELD,
  NUMERIC_KEYS,
  SCALAR_FIELDS,
  type ProfileFieldDef,
  type ScalarKey,
} from '@/lib/machines/profile-fields';
import { inputText, parseLengthText, toMm, type LengthUnit } from '@/lib/units/length';
import { minorToInput, parseMajorToMinor } from '@/lib/units/money';
import { HOLD_DOWNS, HOLD_DOWN_LABELS, type HoldDown } from '@/lib/validation/enums';
import { machineProfileSchema, type MachineProfile } from '@/lib/validation/machine-profile';
import { profileFieldErrors } from '@/lib/validation/machines';

export interface MachineFormValues {
  /** flat profile values in mm (profileToFlat), empty for a new machine */
  flat: Record<string, number | string>;
  hourlyRateMinor: number | null;
  defaultVacuumKpa: number | null;
  defaultHoldDown: HoldDown;
}

interface Props {
  machineId?: number;
  unit: LengthUnit;
  currency: string;
  initial: MachineFormValues;
  tools: MachineProfile['tools'];
  action: (state: ActionState, form: FormData) => Promise<ActionState>;
}

const idOf = (key: string) => `machine-${key.replace('.', '-')}`;

/** The text an input starts with: lengths in the shop's unit, other numbers as stored. */
function startText(key: string, value: number | string | undefined, unit: LengthUnit): string {
  if (value === undefined || value === '') return '';
  const found = fieldOf(key);
  if (typeof value === 'number' && found && isLengthMeasure(found.def.measure)) return inputText(value, unit);
  return String(value);
}

const GROUPS: { title: string; lead: string; axes: (typeof AXES_FIELDS)[number]['key'][]; scalars: ScalarKey[] }[] = [
  { title: 'Size and position', lead: 'The working area and where a program starts from.', axes: ['travelMm', 'homeMm'], scalars: [] },
  { title: 'Speeds', lead: 'Limits per axis; the estimate never lets a move go faster.', axes: ['maxFeedMmPerMin', 'rapidMmPerMin', 'accelMmPerS2'], scalars: [] },
  {
    title: 'Controller',
    lead: 'How the controller plans motion through corners, arcs and dense paths.',
    axes: [],
    scalars: ['cornerToleranceMm', 'lookaheadBlocks', 'maxBlocksPerS', 'chordToleranceMm'],
  },
  { title: 'Time added', lead: 'Fixed times and the calibration factor.', axes: [], scalars: ['toolChangeSeconds', 'spindleSpinUpSeconds', 'timeFactor'] },
];

function AxesInputs({ def, unit, start, fields }: { def: ProfileFieldDef; unit: LengthUnit; start: Record<string, string>; fields: FieldErrors }) {
  const legendId = `${idOf(def.key)}-legend`;
  const hintId = `${idOf(def.key)}-hint`;
  return (
    <fieldset className="flex flex-col gap-1" aria-describedby={hintId}>
      <legend id={legendId} className="font-bold">
        {fieldLabel(def, unit)}
      </legend>
      <p id={hintId} className="text-sm text-ink-soft">
        {def.explanation}
      </p>
      <div className="grid grid-cols-3 gap-3">
        {AXES.map((axis) => {
          const key = `${def.key}.${axis}`;
          const id = idOf(key);
          const errors = fields[key];
          return (
            <div key={axis} className="flex flex-col gap-1">
              <label htmlFor={id} className="text-sm font-bold">
                <span className="sr-only">{def.subject} </span>
                {axis.toUpperCase()}
              </label>
              <input
                id={id}
                name={key}
                inputMode="decimal"
                autoComplete="off"
                defaultValue={start[key]}
                aria-invalid={errors?.length ? true : undefined}
                aria-describedby={errors?.length ? `${id}-error` : undefined}
                className="figure min-h-target w-full rounded-md border-2 border-rule bg-panel px-3 text-right text-base text-ink aria-[invalid=true]:border-3 aria-[invalid=true]:border-fault"
              />
              {errors?.length ? (
                <p id={`${id}-error`} className="text-sm font-bold text-fault" aria-live="polite">
                  <span aria-hidden="true">▲ </span>
                  {errors[0]}
                </p>
              ) : null}
            </div>
          );
        })}
      </div>
    </fieldset>
  );
}

export function MachineForm({ machineId, unit, currency, initial, tools, action }: Props) {
  const start: Record<string, string> = { name: String(initial.flat.name ?? '') };
  for (const key of NUMERIC_KEYS) start[key] = startText(key, initial.flat[key], unit);
  const startRate = initial.hourlyRateMinor === null ? '' : minorToInput(initial.hourlyRateMinor, currency);

  function convert(form: FormData): Converted {
    const text = (key: string) => String(form.get(key) ?? '').trim();
    const flat: Record<string, string | undefined> = { name: text('name') || undefined };
    for (const key of NUMERIC_KEYS) {
      const typed = text(key);
      const found = fieldOf(key);
      if (typed === start[key] && initial.flat[key] !== undefined) flat[key] = String(initial.flat[key]);
      else if (typed === '') flat[key] = undefined;
      else if (found && isLengthMeasure(found.def.measure)) {
        const value = parseLengthText(typed, unit);
        flat[key] = value === null ? typed : String(toMm(value, unit));
      } else flat[key] = typed;
    }
    const fields: FieldErrors = {};
    const parsed = machineProfileSchema.safeParse(flatToProfileInput(flat, tools));
    if (!parsed.success) Object.assign(fields, profileFieldErrors(parsed.error));
    const rate = parseMajorToMinor(text('hourlyRate'), currency);
    if (!rate.ok) fields.hourlyRateMinor = [`Hourly rate: ${rate.message}`];
    if (Object.keys(fields).length > 0) return { ok: false, fields };

    const out = new FormData();
    if (machineId !== undefined) out.set('machineId', String(machineId));
    for (const [key, value] of Object.entries(flat)) if (value !== undefined) out.set(key, value);
    if (rate.ok) out.set('hourlyRateMinor', String(rate.minor));
    out.set('defaultHoldDown', text('defaultHoldDown'));
    out.set('defaultVacuumKpa', text('defaultVacuumKpa'));
    return { ok: true, form: out };
  }

  const { state, fields, pending, onSubmit, formRef } = useConvertedAction(action, convert);
  const hasFieldErrors = Object.keys(fields).length > 0;
  const title = machineId === undefined ? 'New machine' : 'Machine profile';

  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate aria-label={title} className="flex flex-col gap-6">
      <ActionNotice state={state} />
      {hasFieldErrors && state.status === 'idle' ? (
        <Notice tone="fault" title="Some fields need fixing." role="alert">
          Each one is named at its field below. Nothing has been saved.
        </Notice>
      ) : null}
      <section className="flex flex-col gap-4 rounded-md border-2 border-rule bg-panel p-5" aria-labelledby="machine-group-general">
        <h2 id="machine-group-general">Machine</h2>
        <div className="grid gap-4 md:grid-cols-2">
          <InputField id={idOf('name')} name="name" label="Name" hint={NAME_FIELD.explanation} defaultValue={start.name} required errors={fields.name} autoComplete="off" />
          <InputField
            id="machine-hourly-rate"
            name="hourlyRate"
            label={`Hourly rate (${currency} per hour)`}
            hint="What an hour of this machine is sold at; quotes start from it."
            defaultValue={startRate}
            inputMode="decimal"
            className="figure text-right"
            errors={fields.hourlyRateMinor}
          />
          <SelectField
            id="machine-default-hold-down"
            name="defaultHoldDown"
            label="Default hold-down"
            hint="Offered first when a job is planned on this machine."
            defaultValue={initial.defaultHoldDown}
            options={HOLD_DOWNS.map((h) => ({ value: h, label: HOLD_DOWN_LABELS[h] }))}
            errors={fields.defaultHoldDown}
          />
          <InputField
            id="machine-default-vacuum"
            name="defaultVacuumKpa"
            label="Vacuum level (kPa)"
            hint="What the pump holds under a covered sheet on this table; a vacuum job starts from it. Empty: no vacuum table, or not measured."
            defaultValue={initial.defaultVacuumKpa === null ? '' : String(initial.defaultVacuumKpa)}
            inputMode="decimal"
            className="figure text-right"
            errors={fields.defaultVacuumKpa}
          />
        </div>
      </section>
      {GROUPS.map((g, i) => (
        <section key={g.title} className="flex flex-col gap-4 rounded-md border-2 border-rule bg-panel p-5" aria-labelledby={`machine-group-${i}`}>
          <div>
            <h2 id={`machine-group-${i}`}>{g.title}</h2>
            <p className="text-sm text-ink-soft">{g.lead}</p>
          </div>
          <div className="grid gap-6 md:grid-cols-2">
            {g.axes.map((key) => (
              <AxesInputs key={key} def={AXES_FIELDS.find((f) => f.key === key)!} unit={unit} start={start} fields={fields} />
            ))}
            {g.scalars.map((key) => {
              const def = SCALAR_FIELDS.find((f) => f.key === key)!;
              return (
                <FieldShell key={key} id={idOf(key)} label={fieldLabel(def, unit)} hint={def.explanation} errors={fields[key]}>
                  <input
                    id={idOf(key)}
                    name={key}
                    inputMode={def.integer ? 'numeric' : 'decimal'}
                    autoComplete="off"
                    defaultValue={start[key]}
                    aria-invalid={fields[key]?.length ? true : undefined}
                    aria-describedby={[`${idOf(key)}-hint`, fields[key]?.length ? `${idOf(key)}-error` : ''].filter(Boolean).join(' ')}
                    className="figure min-h-target max-w-xs rounded-md border-2 border-rule bg-panel px-3 text-right text-base text-ink aria-[invalid=true]:border-3 aria-[invalid=true]:border-fault"
                  />
                </FieldShell>
              );
            })}
          </div>
        </section>
      ))}
      <div className="flex flex-wrap items-center gap-4">
        <Button type="submit" disabled={pending}>
          {pending ? 'Saving…' : machineId === undefined ? 'Add machine' : 'Save profile'}
        </Button>
        <p className="text-sm text-ink-soft">
          {machineId === undefined
            ? 'The new machine starts at version 1; add its tools on the next page.'
            : 'A change to any profile field saves a new version; estimates made before keep the version they used.'}
        </p>
      </div>
    </form>
  );
}
