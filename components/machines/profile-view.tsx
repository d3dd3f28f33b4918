// A machine profile read-only, field by field with units in the shop's length unit and the
// one-line explanation beside each: what every role sees on the machine page, and what
// an archived machine keeps showing.
import { AXES, AXES_FIELDS, fieldLabel, SCALAR_FIELDS } from '@/lib/machines/profile-fields';
import { formatLength, type LengthUnit } from '@/lib/units/length';
import type { MachineProfile } from '@/lib/validation/machine-profile';

export function ProfileView({ profile, unit }: { profile: MachineProfile; unit: LengthUnit }) {
  const lengthLike = (m: string) => m === 'length' || m === 'feed' || m === 'accel';
  return (
    <dl className="divide-y divide-rule-light rounded-md border-2 border-rule bg-panel" data-testid="profile-view">
      {AXES_FIELDS.map((def) => (
        <div key={def.key} className="grid gap-1 px-4 py-3 md:grid-cols-[2fr_2fr_3fr] md:gap-4">
          <dt className="font-bold">{fieldLabel(def, unit)}</dt>
          <dd className="figure" data-field={def.key}>
            {AXES.map((a) => formatLength(profile[def.key][a], lengthLike(def.measure) ? unit : 'mm')).join(' × ')}
          </dd>
          <dd className="text-sm text-ink-soft">{def.explanation}</dd>
        </div>
      ))}
      {SCALAR_FIELDS.map((def) => (
        <div key={def.key} className="grid gap-1 px-4 py-3 md:grid-cols-[2fr_2fr_3fr] md:gap-4">
          <dt className="font-bold">{fieldLabel(def, unit)}</dt>
          <dd className="figure" data-field={def.key}>
            {lengthLike(def.measure) ? formatLength(profile[def.key], unit) : String(profile[def.key])}
          </dd>
          <dd className="text-sm text-ink-soft">{def.explanation}</dd>
        </div>
      ))}
    </dl>
  );
}
