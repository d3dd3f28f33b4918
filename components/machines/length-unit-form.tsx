'use client';
// The shop's length unit, set by an admin: forms and pages show and take lengths, feeds
// and accelerations in it; stored values stay in mm.
import { useActionState } from 'react';
import { Button } from '@/components/ui/button';
import { SelectField } from '@/components/ui/field';
import { ActionNotice } from '@/components/ui/notice';
import { IDLE, type ActionState } from '@/lib/http/action-state';
import { LENGTH_UNITS, LENGTH_UNIT_LABELS, type LengthUnit } from '@/lib/units/length';

export function LengthUnitForm({ unit, action }: { unit: LengthUnit; action: (state: ActionState, form: FormData) => Promise<ActionState> }) {
  const [state, dispatch, pending] = useActionState(action, IDLE);
  return (
    <form action={dispatch} aria-label="Length unit" className="flex flex-col gap-3 rounded-md border-2 border-rule bg-panel p-5">
      <h2>Length unit</h2>
      <ActionNotice state={state} />
      <SelectField
        id="shop-length-unit"
        name="lengthUnit"
        label="Show lengths in"
        hint="For the whole shop: machine, tool and material forms and pages. Values are stored in mm either way."
        defaultValue={unit}
        options={LENGTH_UNITS.map((u) => ({ value: u, label: LENGTH_UNIT_LABELS[u] }))}
        errors={state.status === 'error' ? state.fields?.lengthUnit : undefined}
      />
      <div>
        <Button type="submit" variant="secondary" disabled={pending}>
          {pending ? 'Saving…' : 'Save length unit'}
        </Button>
      </div>
    </form>
  );
}
