'use client';
// A sheet material: name, thickness and sheet size in the shop's length unit (sent in mm),
// cost per sheet in the shop's currency (sent in minor units). Checked in the page with
// the shared schema; the server action checks again.
import { Button } from '@/components/ui/button';
import { InputField } from '@/components/ui/field';
import { ActionNotice } from '@/components/ui/notice';
import { useConvertedAction, type Converted } from '@/components/ui/use-converted-action';
import type { FieldErrors } from '@/lib/errors';
import type { ActionState } from '@/lib/http/action-state';
import { inputText, parseLengthText, toMm, unitSymbol, type LengthUnit } from '@/lib/units/length';
import { minorToInput, parseMajorToMinor } from '@/lib/units/money';
import { fieldErrors } from '@/lib/validation/form';
import { materialInputSchema } from '@/lib/validation/materials';

interface Props {
  unit: LengthUnit;
  currency: string;
  material?: { id: number; name: string; thicknessMm: number; sheetWidthMm: number; sheetLengthMm: number; costPerSheetMinor: number };
  action: (state: ActionState, form: FormData) => Promise<ActionState>;
}

const LENGTHS = ['thicknessMm', 'sheetWidthMm', 'sheetLengthMm'] as const;

export function MaterialForm({ unit, currency, material, action }: Props) {
  const u = unitSymbol('length', unit);
  const start = Object.fromEntries(LENGTHS.map((k) => [k, material ? inputText(material[k], unit) : ''])) as Record<(typeof LENGTHS)[number], string>;
  const startCost = material ? minorToInput(material.costPerSheetMinor, currency) : '';

  function convert(form: FormData): Converted {
    const text = (k: string) => String(form.get(k) ?? '').trim();
    const input: Record<string, unknown> = { name: text('name') || undefined };
    for (const k of LENGTHS) {
      const typed = text(k);
      if (material && typed === start[k]) input[k] = material[k];
      else if (typed === '') input[k] = undefined;
      else {
        const v = parseLengthText(typed, unit);
        input[k] = v === null ? typed : toMm(v, unit);
      }
    }
    const fields: FieldErrors = {};
    const cost = parseMajorToMinor(text('cost'), currency);
    if (cost.ok) input.costPerSheetMinor = cost.minor;
    else fields.costPerSheetMinor = [`Cost per sheet: ${cost.message}`];
    const parsed = materialInputSchema.safeParse(input);
    if (!parsed.success) Object.assign(fields, Object.fromEntries(Object.entries(fieldErrors(parsed.error)).filter(([k]) => !(k in fields))));
    if (Object.keys(fields).length > 0 || !parsed.success) return { ok: false, fields };
    const out = new FormData();
    if (material) out.set('materialId', String(material.id));
    for (const [k, v] of Object.entries(parsed.data)) out.set(k, String(v));
    return { ok: true, form: out };
  }

  const { state, fields, pending, onSubmit, formRef } = useConvertedAction(action, convert, { resetOnSuccess: !material });
  const title = material ? 'Details' : 'New material';
  const p = material ? `material-${material.id}` : 'new-material';
  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate aria-label={material ? 'Edit material' : 'New material'} className="flex flex-col gap-4 rounded-md border-2 border-rule bg-panel p-5">
      <h2>{title}</h2>
      <ActionNotice state={state} />
      <InputField id={`${p}-name`} name="name" label="Name" hint="As job forms offer it, for example “Birch plywood 18 mm”." defaultValue={material?.name ?? ''} errors={fields.name} autoComplete="off" />
      <InputField id={`${p}-thickness`} name="thicknessMm" label={`Thickness (${u})`} hint="Nominal sheet thickness; a job copies it as its sheet thickness." inputMode="decimal" defaultValue={start.thicknessMm} className="figure text-right" errors={fields.thicknessMm} />
      <div className="grid gap-4 sm:grid-cols-2">
        <InputField id={`${p}-width`} name="sheetWidthMm" label={`Sheet width (${u})`} hint="The shorter side, along X." inputMode="decimal" defaultValue={start.sheetWidthMm} className="figure text-right" errors={fields.sheetWidthMm} />
        <InputField id={`${p}-length`} name="sheetLengthMm" label={`Sheet length (${u})`} hint="The longer side, along Y." inputMode="decimal" defaultValue={start.sheetLengthMm} className="figure text-right" errors={fields.sheetLengthMm} />
      </div>
      <InputField id={`${p}-cost`} name="cost" label={`Cost per sheet (${currency})`} hint="What one sheet costs the shop; quotes count sheets from it." inputMode="decimal" defaultValue={startCost} className="figure text-right" errors={fields.costPerSheetMinor} />
      <div>
        <Button type="submit" disabled={pending}>
          {pending ? 'Saving…' : material ? 'Save material' : 'Add material'}
        </Button>
      </div>
    </form>
  );
}
