// The rule behind machine versions (lib/machines/profile-diff.ts): a change of any profile
// field, tools included, is a change; a save that alters nothing is not. And the form's
// view of the profile (lib/machines/profile-fields.ts): every field of the CLI's schema has
// an input, a label with its unit and an explanation, and flat form values go back to a
// profile that the CLI's schema accepts exactly as PROFILE.json would be.
import { describe, expect, it } from 'vitest';
import fs from 'node:fs';
import path from 'node:path';
import { changeText } from '@/lib/machines/change-text';
import { profileChanges, profileDiffers } from '@/lib/machines/profile-diff';
import { AXES_FIELDS, fieldLabel, fieldSentence, flatToProfileInput, NUMERIC_KEYS, profileToFlat, SCALAR_FIELDS } from '@/lib/machines/profile-fields';
import { machineProfileSchema, parseMachineProfile, type MachineProfile } from '@/lib/validation/machine-profile';
import { machinePatchSchema, parseMachineCreate, PROFILE_KEYS } from '@/lib/validation/machines';

const fixture = (name: string): MachineProfile => {
  const parsed = parseMachineProfile(JSON.parse(fs.readFileSync(path.resolve(__dirname, '../../../fixtures/machines', name), 'utf8')));
  if (!parsed.ok) throw new Error(parsed.message);
  return parsed.profile;
};
const router1 = fixture('router-1.json');
const clone = (p: MachineProfile): MachineProfile => JSON.parse(JSON.stringify(p));

describe('profile changes', () => {
  it('finds none between a profile and its copy, nor when the tools come in another order', () => {
    const copy = clone(router1);
    copy.tools.reverse();
    expect(profileChanges(router1, copy)).toEqual([]);
    expect(profileDiffers(router1, copy)).toBe(false);
  });

  it('names a changed corner tolerance with both values', () => {
    const next = { ...clone(router1), cornerToleranceMm: 0.03 };
    expect(profileChanges(router1, next)).toEqual([{ kind: 'field', key: 'cornerToleranceMm', before: 0.02, after: 0.03 }]);
  });

  it('names one axis of an axes field', () => {
    const next = clone(router1);
    next.accelMmPerS2.z = 600;
    expect(profileChanges(router1, next)).toEqual([{ kind: 'field', key: 'accelMmPerS2.z', before: 800, after: 600 }]);
  });

  it('counts the name and the time factor as profile fields (both are in the CLI profile)', () => {
    expect(profileChanges(router1, { ...clone(router1), name: 'Router 1b' })[0]).toMatchObject({ key: 'name' });
    expect(profileChanges(router1, { ...clone(router1), timeFactor: 1.08 })[0]).toMatchObject({ key: 'timeFactor' });
  });

  it('sees tools added, removed and changed, by tool number', () => {
    const next = clone(router1);
    next.tools = next.tools.filter((t) => t.number !== 2);
    next.tools.push({ number: 7, diameterMm: 3, flutes: 1, kind: 'upcut' });
    next.tools.find((t) => t.number === 1)!.diameterMm = 6;
    expect(profileChanges(router1, next)).toEqual([
      { kind: 'tool-changed', number: 1, fields: ['diameterMm'] },
      { kind: 'tool-removed', number: 2 },
      { kind: 'tool-added', number: 7 },
    ]);
  });

  it('tells a home position of −0 from 0 (a stored difference, rare as it is)', () => {
    const next = clone(router1);
    next.homeMm.x = -0;
    expect(profileDiffers(router1, next)).toBe(true);
  });
});

describe('version history wording', () => {
  it('names a change with its values in the shop unit (0.02 mm ÷ 25.4 = 0.000787 in)', () => {
    const next = { ...clone(router1), cornerToleranceMm: 0.03, lookaheadBlocks: 128 };
    const [corner, lookahead] = profileChanges(router1, next);
    expect(changeText(corner, 'mm')).toBe('Corner tolerance 0.02 → 0.03 mm');
    expect(changeText(corner, 'inch')).toBe('Corner tolerance 0.000787 → 0.00118 in');
    expect(changeText(lookahead, 'inch')).toBe('Look-ahead 64 → 128 blocks');
    expect(changeText({ kind: 'tool-changed', number: 2, fields: ['diameterMm', 'kind'] }, 'mm')).toBe('Tool 2: diameter, kind changed');
  });
});

describe('the form fields', () => {
  it('cover every key of the CLI profile schema but tools, and nothing else', () => {
    const formKeys = ['name', ...AXES_FIELDS.map((f) => f.key), ...SCALAR_FIELDS.map((f) => f.key)].sort();
    expect(formKeys).toEqual([...PROFILE_KEYS].sort());
    expect(Object.keys(machineProfileSchema.shape).filter((k) => k !== 'tools').sort()).toEqual(formKeys);
  });

  it('carry the labels issue 11 set, with the unit in the label', () => {
    const label = (key: string, unit: 'mm' | 'inch' = 'mm') => fieldLabel([...AXES_FIELDS, ...SCALAR_FIELDS].find((f) => f.key === key)!, unit);
    expect(label('travelMm')).toBe('Travel X × Y × Z (mm)');
    expect(label('homeMm')).toBe('Home position (machine coordinates, mm)');
    expect(label('accelMmPerS2')).toBe('Acceleration per axis (mm/s²)');
    expect(label('cornerToleranceMm')).toBe('Corner tolerance (mm)');
    expect(label('lookaheadBlocks')).toBe('Look-ahead (blocks; 0 = unlimited)');
    expect(label('maxBlocksPerS')).toBe('Block rate limit (blocks per second; 0 = none)');
    expect(label('chordToleranceMm')).toBe('Arc chord tolerance (mm)');
    expect(label('cornerToleranceMm', 'inch')).toBe('Corner tolerance (in)');
    expect(label('rapidMmPerMin', 'inch')).toBe('Rapid speed per axis (in/min)');
    for (const f of [...AXES_FIELDS, ...SCALAR_FIELDS]) expect(f.explanation.length).toBeGreaterThan(20);
  });

  it('go from a profile to flat values and back to the same profile, through the CLI schema', () => {
    const flat = Object.fromEntries(Object.entries(profileToFlat(router1)).map(([k, v]) => [k, String(v)]));
    expect(Object.keys(flat).filter((k) => k !== 'name')).toEqual(NUMERIC_KEYS);
    const back = machineProfileSchema.parse(flatToProfileInput(flat, router1.tools));
    expect(back).toEqual(router1);
  });

  it('leave a word in a number field as text, so the schema names that field', () => {
    const flat = Object.fromEntries(Object.entries(profileToFlat(router1)).map(([k, v]) => [k, String(v)]));
    const r = machineProfileSchema.safeParse(flatToProfileInput({ ...flat, 'travelMm.y': 'wide', cornerToleranceMm: '' }, []));
    expect(r.success).toBe(false);
    const paths = r.error!.issues.map((i) => `${i.path.join('.')}: ${fieldSentence(i.path.join('.'), i.message)}`);
    expect(paths).toEqual(['travelMm.y: Travel Y must be a number.', 'cornerToleranceMm: Corner tolerance is required.']);
  });
});

describe('machine input', () => {
  it('takes a PROFILE.json as it is for a new machine, tools included', () => {
    const { profile, settings } = parseMachineCreate({ ...router1, hourlyRateMinor: 9500 });
    expect(profile).toEqual(router1);
    expect(settings).toEqual({ hourlyRateMinor: 9500 });
  });

  it('reports every bad field of a new machine at once, as sentences', () => {
    try {
      parseMachineCreate({ ...router1, lookaheadBlocks: 2.5, chordToleranceMm: 0, hourlyRateMinor: -1 });
      expect.unreachable();
    } catch (err) {
      expect((err as { fields: Record<string, string[]> }).fields).toEqual({
        lookaheadBlocks: ['Look-ahead must be a whole number.'],
        chordToleranceMm: ['Arc chord tolerance must be greater than 0.'],
        hourlyRateMinor: ['The hourly rate must be 0 or more.'],
      });
    }
  });

  it('refuses unknown keys and tools in a PATCH (tools have their own routes)', () => {
    expect(machinePatchSchema.safeParse({ cornerToleranceMm: 0.03 }).success).toBe(true);
    expect(machinePatchSchema.safeParse({ tools: [] }).success).toBe(false);
    expect(machinePatchSchema.safeParse({ cornerTolerance: 1 }).success).toBe(false); // an unknown key: the field is named with its unit (cornerToleranceMm)
    expect(machinePatchSchema.safeParse({}).success).toBe(false);
  });
});
