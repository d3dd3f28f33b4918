// What changed between two machine profiles: the rule behind machine versions. A save
// that alters a profile field (tools included) makes a new version; one that alters
// nothing, or only what is not part of the profile (hourly rate, default hold-down, a
// tool's description), makes none. Pure, so the rule is tested without a database.
import type { MachineProfile } from '@/lib/validation/machine-profile';
import { AXES, AXES_FIELDS, SCALAR_FIELDS } from './profile-fields';

export type ProfileChange =
  | { kind: 'field'; key: string; before: number | string; after: number | string }
  | { kind: 'tool-added'; number: number }
  | { kind: 'tool-removed'; number: number }
  | { kind: 'tool-changed'; number: number; fields: ('diameterMm' | 'flutes' | 'kind')[] };

// Object.is, so that 0 and −0 count as different only if someone typed −0 into a home
// position (a stored difference all the same), and NaN never reaches here (zod refuses it).
const same = (a: unknown, b: unknown) => Object.is(a, b);

/** The changes from `before` to `after`, in form order, tools by number. Empty when nothing differs. */
export function profileChanges(before: MachineProfile, after: MachineProfile): ProfileChange[] {
  const changes: ProfileChange[] = [];
  if (before.name !== after.name) changes.push({ kind: 'field', key: 'name', before: before.name, after: after.name });
  for (const def of AXES_FIELDS) {
    for (const a of AXES) {
      const b = before[def.key][a];
      const n = after[def.key][a];
      if (!same(b, n)) changes.push({ kind: 'field', key: `${def.key}.${a}`, before: b, after: n });
    }
  }
  for (const def of SCALAR_FIELDS) {
    if (!same(before[def.key], after[def.key])) changes.push({ kind: 'field', key: def.key, before: before[def.key], after: after[def.key] });
  }
  const old = new Map(before.tools.map((t) => [t.number, t]));
  const now = new Map(after.tools.map((t) => [t.number, t]));
  const numbers = [...new Set([...old.keys(), ...now.keys()])].sort((x, y) => x - y);
  for (const number of numbers) {
    const o = old.get(number);
    const n = now.get(number);
    if (!o && n) changes.push({ kind: 'tool-added', number });
    else if (o && !n) changes.push({ kind: 'tool-removed', number });
    else if (o && n) {
      const fields = (['diameterMm', 'flutes', 'kind'] as const).filter((f) => !same(o[f], n[f]));
      if (fields.length > 0) changes.push({ kind: 'tool-changed', number, fields: [...fields] });
    }
  }
  return changes;
}

export function profileDiffers(before: MachineProfile, after: MachineProfile): boolean {
  return profileChanges(before, after).length > 0;
}
