// The machine profile as a form sees it: every field of lib/validation/machine-profile.ts
// with its label (the unit in the label), a one-line explanation in our own words, what
// its number measures (so inch display converts the right ones), and the flat keys the
// inputs use ("travelMm.x"), which are also the paths zod names in its issues. Pure:
// the client form, the machine page and the server action share it.
import type { MachineProfile } from '@/lib/validation/machine-profile';
import { unitSymbol, type LengthQuantity, type LengthUnit } from '@/lib/units/length';

/** What a number of the profile measures: a length-based quantity (converted for inch shops) or a unit of its own. */
export type FieldMeasure = LengthQuantity | 'seconds' | 'blocks' | 'blocks-per-s' | 'factor';

export const AXES = ['x', 'y', 'z'] as const;
export type Axis = (typeof AXES)[number];

export type ScalarKey = 'cornerToleranceMm' | 'lookaheadBlocks' | 'maxBlocksPerS' | 'chordToleranceMm' | 'toolChangeSeconds' | 'spindleSpinUpSeconds' | 'timeFactor';
export type AxesKey = 'travelMm' | 'homeMm' | 'maxFeedMmPerMin' | 'rapidMmPerMin' | 'accelMmPerS2';

export interface ProfileFieldDef<K extends string = ScalarKey | AxesKey> {
  key: K;
  /** the label without its unit: "Corner tolerance" */
  title: string;
  /** the unit's text in the label when it is not a plain length symbol ("blocks; 0 = unlimited") */
  unitNote?: (unit: LengthUnit) => string;
  measure: FieldMeasure;
  integer?: boolean;
  explanation: string;
  /** how a field error begins: "Corner tolerance", and for an axis "Travel X" */
  subject: string;
  /** the smallest step an input offers (the browser's spinner; typing is free) */
  step?: string;
}

export const AXES_FIELDS: ProfileFieldDef<AxesKey>[] = [
  {
    key: 'travelMm',
    title: 'Travel X × Y × Z',
    measure: 'length',
    subject: 'Travel',
    explanation: 'How far each axis can move; a program that goes past it gets a finding.',
  },
  {
    key: 'homeMm',
    title: 'Home position',
    unitNote: (u) => `machine coordinates, ${unitSymbol('length', u)}`,
    measure: 'length',
    subject: 'Home position',
    explanation: 'Where the tool stands when a program starts, so the first move is timed from there.',
  },
  {
    key: 'maxFeedMmPerMin',
    title: 'Fastest cutting feed per axis',
    measure: 'feed',
    subject: 'Fastest cutting feed',
    explanation: 'The highest feed each axis cuts at; a faster feed in the program is slowed to it.',
  },
  {
    key: 'rapidMmPerMin',
    title: 'Rapid speed per axis',
    measure: 'feed',
    subject: 'Rapid speed',
    explanation: 'How fast each axis travels on a rapid (G0), when the tool is not cutting.',
  },
  {
    key: 'accelMmPerS2',
    title: 'Acceleration per axis',
    measure: 'accel',
    subject: 'Acceleration',
    explanation: 'How quickly each axis gains or loses speed; lower values make corners and short moves slower.',
  },
];

export const SCALAR_FIELDS: ProfileFieldDef<ScalarKey>[] = [
  {
    key: 'cornerToleranceMm',
    title: 'Corner tolerance',
    measure: 'length',
    subject: 'Corner tolerance',
    step: 'any',
    explanation: 'How far the path may cut inside a sharp corner between two straight moves, so the tool keeps some speed through it.',
  },
  {
    key: 'lookaheadBlocks',
    title: 'Look-ahead',
    unitNote: () => 'blocks; 0 = unlimited',
    measure: 'blocks',
    integer: true,
    subject: 'Look-ahead',
    explanation: 'How many blocks ahead the controller plans its speed; a short look-ahead slows dense paths down.',
  },
  {
    key: 'maxBlocksPerS',
    title: 'Block rate limit',
    unitNote: () => 'blocks per second; 0 = none',
    measure: 'blocks-per-s',
    subject: 'Block rate limit',
    explanation: 'The most blocks the controller can work through in a second; many tiny moves are slowed to this rate.',
  },
  {
    key: 'chordToleranceMm',
    title: 'Arc chord tolerance',
    measure: 'length',
    subject: 'Arc chord tolerance',
    step: 'any',
    explanation: 'How far the straight pieces an arc is broken into may stray from the true arc.',
  },
  {
    key: 'toolChangeSeconds',
    title: 'Tool change time',
    measure: 'seconds',
    subject: 'Tool change time',
    explanation: 'Time added for every tool change (M6), from the old tool up to the new one cutting.',
  },
  {
    key: 'spindleSpinUpSeconds',
    title: 'Spindle spin-up time',
    measure: 'seconds',
    subject: 'Spindle spin-up time',
    explanation: 'Time added each time the spindle is started (M3 or M4) before the tool moves on.',
  },
  {
    key: 'timeFactor',
    title: 'Time factor',
    unitNote: () => '× the computed time',
    measure: 'factor',
    subject: 'Time factor',
    step: 'any',
    explanation: 'Multiplies the computed run time to match what this machine really takes; 1 until it is calibrated.',
  },
];

export const NAME_FIELD = { key: 'name', title: 'Name', subject: 'Name', explanation: 'How lists, job forms and estimates name this machine.' } as const;

const MEASURE_UNITS: Record<Exclude<FieldMeasure, LengthQuantity>, string> = {
  seconds: 's',
  blocks: 'blocks',
  'blocks-per-s': 'blocks per second',
  factor: '×',
};

export function isLengthMeasure(m: FieldMeasure): m is LengthQuantity {
  return m === 'length' || m === 'feed' || m === 'accel';
}

/** The label with its unit: "Corner tolerance (mm)", "Rapid speed per axis (in/min)", "Look-ahead (blocks; 0 = unlimited)". */
export function fieldLabel(def: ProfileFieldDef, unit: LengthUnit): string {
  const u = def.unitNote ? def.unitNote(unit) : isLengthMeasure(def.measure) ? unitSymbol(def.measure, unit) : MEASURE_UNITS[def.measure];
  return `${def.title} (${u})`;
}

/** The unit of a measure alone, for table columns and read-only views. */
export function measureUnit(measure: FieldMeasure, unit: LengthUnit): string {
  return isLengthMeasure(measure) ? unitSymbol(measure, unit) : MEASURE_UNITS[measure];
}

/** Every numeric input's flat key in form order: travelMm.x … timeFactor. */
export const NUMERIC_KEYS: string[] = [...AXES_FIELDS.flatMap((f) => AXES.map((a) => `${f.key}.${a}`)), ...SCALAR_FIELDS.map((f) => f.key)];

const DEFS = new Map<string, { def: ProfileFieldDef; axis?: Axis }>([
  ...AXES_FIELDS.flatMap((def) => AXES.map((axis) => [`${def.key}.${axis}`, { def, axis }] as [string, { def: ProfileFieldDef; axis?: Axis }])),
  ...SCALAR_FIELDS.map((def) => [def.key, { def }] as [string, { def: ProfileFieldDef }]),
]);

/** The definition of a flat key ("accelMmPerS2.z"), or undefined for name and unknown keys. */
export function fieldOf(key: string): { def: ProfileFieldDef; axis?: Axis } | undefined {
  return DEFS.get(key);
}

/** The profile's fields (tools aside) as flat key → number or text, in mm. */
export function profileToFlat(p: Omit<MachineProfile, 'tools'>): Record<string, number | string> {
  const flat: Record<string, number | string> = { name: p.name };
  for (const def of AXES_FIELDS) for (const a of AXES) flat[`${def.key}.${a}`] = p[def.key][a];
  for (const def of SCALAR_FIELDS) flat[def.key] = p[def.key];
  return flat;
}

/**
 * Flat form values (mm, as text) back into the profile's shape, for the CLI's zod schema to
 * judge. A text that is not a plain number stays text, so the schema says "must be a
 * number" at its field; an empty one is left out ("is required").
 */
export function flatToProfileInput(flat: Record<string, string | undefined>, tools: MachineProfile['tools']): Record<string, unknown> {
  const num = (key: string): unknown => {
    const t = flat[key]?.trim();
    if (t === undefined || t === '') return undefined;
    return /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(t) ? Number(t) : t;
  };
  const out: Record<string, unknown> = { name: flat.name, tools };
  for (const def of AXES_FIELDS) out[def.key] = { x: num(`${def.key}.x`), y: num(`${def.key}.y`), z: num(`${def.key}.z`) };
  for (const def of SCALAR_FIELDS) out[def.key] = num(def.key);
  return out;
}

/** A zod message of the profile schema ("must be greater than 0") as a sentence about its field: "Travel Y must be greater than 0." */
export function fieldSentence(key: string, message: string): string {
  const found = fieldOf(key);
  const subject = key === 'name' ? NAME_FIELD.subject : found ? `${found.def.subject}${found.axis ? ` ${found.axis.toUpperCase()}` : ''}` : key;
  const text = /^(must|is)\b/.test(message) ? `${subject} ${message}` : message;
  return /[.!?]$/.test(text) ? text : `${text}.`;
}
