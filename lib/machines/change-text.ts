// A machine version's changes as a person reads them in the versions table:
// "Corner tolerance 0.02 → 0.03 mm", "Tool 7 added". Values in the shop's length unit.
import type { ProfileChange } from './profile-diff';
import { fieldOf, measureUnit } from './profile-fields';
import { formatLength, type LengthUnit } from '@/lib/units/length';

const TOOL_FIELD_WORDS = { diameterMm: 'diameter', flutes: 'flutes', kind: 'kind' } as const;

export function changeText(change: ProfileChange, unit: LengthUnit): string {
  switch (change.kind) {
    case 'tool-added':
      return `Tool ${change.number} added`;
    case 'tool-removed':
      return `Tool ${change.number} removed`;
    case 'tool-changed':
      return `Tool ${change.number}: ${change.fields.map((f) => TOOL_FIELD_WORDS[f]).join(', ')} changed`;
    case 'field': {
      if (change.key === 'name') return `Name “${change.before}” → “${change.after}”`;
      const found = fieldOf(change.key);
      if (!found) return `${change.key} changed`;
      const { def, axis } = found;
      const subject = `${def.subject}${axis ? ` ${axis.toUpperCase()}` : ''}`;
      const show = (v: number | string) =>
        typeof v === 'number' && (def.measure === 'length' || def.measure === 'feed' || def.measure === 'accel') ? formatLength(v, unit) : String(v);
      const u = measureUnit(def.measure, unit);
      return `${subject} ${show(change.before)} → ${show(change.after)}${u === '×' ? '' : ` ${u}`}`;
    }
  }
}
