'use client';
// A tool of the machine's library: number, diameter (in the shop's length unit, sent in
// mm), flutes, kind and a free description. Checked in the page with the CLI's tool
// schema; the server action checks again, and the whole profile once more.
import { Button } from '@/components/ui/button';
import { InputField, SelectField } from '@/components/ui/field';
import { ActionNotice } from '@/components/ui/notice';
import { useConvertedAction, type Converted } from '@/components/ui/use-converted-action';
import type { ActionState } from '@/lib/http/action-state';
import { inputText, parseLengthText, toMm, unitSymbol, type LengthUnit } from '@/lib/units/length';
import { TOOL_KINDS, TOOL_KIND_LABELS, type ToolKind } from '@/lib/validation/enums';
import { profileFieldErrors, toolInputSchema } from '@/lib/validation/machines';

interface Props {
  machineId: number;
  unit: LengthUnit;
  tool?: { id: number; number: number; diameterMm: number; flutes: number; kind: ToolKind; description: string };
  /** the next free number, offered for a new tool */
  nextNumber?: number;
  action: (state: ActionState, form: FormData) => Promise<ActionState>;
}

export function ToolForm({ machineId, unit, tool, nextNumber, action }: Props) {
  const startDiameter = tool ? inputText(tool.diameterMm, unit) : '';
  function convert(form: FormData): Converted {
    const text = (k: string) => String(form.get(k) ?? '').trim();
    const num = (t: string) => (t === '' ? undefined : /^[-+]?(\d+\.?\d*|\.\d+)$/.test(t) ? Number(t) : t);
    const typedDiameter = text('diameter');
    let diameterMm: unknown;
    if (tool && typedDiameter === startDiameter) diameterMm = tool.diameterMm;
    else if (typedDiameter === '') diameterMm = undefined;
    else {
      const v = parseLengthText(typedDiameter, unit);
      diameterMm = v === null ? typedDiameter : toMm(v, unit);
    }
    const input = { number: num(text('number')), diameterMm, flutes: num(text('flutes')), kind: text('kind'), description: text('description') };
    const parsed = toolInputSchema.safeParse(input);
    if (!parsed.success) return { ok: false, fields: profileFieldErrors(parsed.error, 'tool') };
    const out = new FormData();
    out.set('machineId', String(machineId));
    if (tool) out.set('toolId', String(tool.id));
    out.set('number', String(parsed.data.number));
    out.set('diameterMm', String(parsed.data.diameterMm));
    out.set('flutes', String(parsed.data.flutes));
    out.set('kind', parsed.data.kind);
    out.set('description', parsed.data.description);
    return { ok: true, form: out };
  }
  const { state, fields, pending, onSubmit, formRef } = useConvertedAction(action, convert, { resetOnSuccess: !tool });
  const title = tool ? `Tool ${tool.number}` : 'Add a tool';
  const p = tool ? `tool-${tool.id}` : 'new-tool';
  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate aria-label={title} className="flex flex-col gap-4 rounded-md border-2 border-rule bg-panel p-5">
      <h2>{title}</h2>
      <ActionNotice state={state} />
      <div className="grid gap-4 sm:grid-cols-2">
        <InputField id={`${p}-number`} name="number" label="Tool number" hint="The T word that calls it in a program." inputMode="numeric" defaultValue={tool?.number ?? nextNumber ?? ''} className="figure text-right" errors={fields.number} />
        <InputField
          id={`${p}-diameter`}
          name="diameter"
          label={`Diameter (${unitSymbol('length', unit)})`}
          hint={unit === 'inch' ? 'Cutting diameter; a fraction such as 1/4 is fine.' : 'Cutting diameter.'}
          inputMode="decimal"
          defaultValue={startDiameter}
          className="figure text-right"
          errors={fields.diameterMm}
        />
        <InputField id={`${p}-flutes`} name="flutes" label="Flutes" hint="Cutting edges, for chip load." inputMode="numeric" defaultValue={tool?.flutes ?? ''} className="figure text-right" errors={fields.flutes} />
        <SelectField
          id={`${p}-kind`}
          name="kind"
          label="Kind"
          hint="Spiral direction or shape of the bit."
          defaultValue={tool?.kind ?? 'upcut'}
          options={TOOL_KINDS.map((k) => ({ value: k, label: TOOL_KIND_LABELS[k] }))}
          errors={fields.kind}
        />
      </div>
      <InputField id={`${p}-description`} name="description" label="Description" hint="Optional: what the shop uses it for. Not part of the profile." defaultValue={tool?.description ?? ''} errors={fields.description} />
      <div>
        <Button type="submit" disabled={pending}>
          {pending ? 'Saving…' : tool ? 'Save tool' : 'Add tool'}
        </Button>
      </div>
    </form>
  );
}
