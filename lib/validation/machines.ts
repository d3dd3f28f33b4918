// Input of the machines, tools and shop-setting routes and forms. The profile itself is
// judged by the CLI's schema (lib/validation/machine-profile.ts), so a form, the JSON API
// and PROFILE.json accept exactly the same machines; this module adds what a machine row
// has beyond its profile (hourly rate, default hold-down and vacuum level), the tool's description, the
// partial update, and turns the schema's issues into sentences about each field.
import { z } from '@/lib/validation/zod';
import { AppError, type FieldErrors } from '@/lib/errors';
import { fieldSentence } from '@/lib/machines/profile-fields';
import { HOLD_DOWNS } from './enums';
import { ATMOSPHERE_KPA } from './jobs';
import { machineProfileSchema, toolSchema, type MachineProfile, type MachineTool } from './machine-profile';
import { LENGTH_UNITS } from '@/lib/units/length';

const INT_MAX = 2_147_483_647;

export const machineSettingsShape = {
  hourlyRateMinor: z
    .number({ error: 'Enter the hourly rate.' })
    .int('Enter the hourly rate in whole minor units (cents).')
    .min(0, 'The hourly rate must be 0 or more.')
    .max(INT_MAX, 'The hourly rate is too large.'),
  defaultHoldDown: z.enum(HOLD_DOWNS, { error: 'Choose a hold-down method.' }),
  // what the pump holds under a covered sheet; null when the machine has no vacuum table or it was never measured
  defaultVacuumKpa: z
    .number({ error: 'Enter the vacuum level in kPa, or leave it empty.' })
    .gt(0, 'The vacuum level must be more than 0 kPa.')
    .max(ATMOSPHERE_KPA, `The vacuum level cannot exceed one atmosphere (${ATMOSPHERE_KPA} kPa).`)
    .nullable(),
};
const machineSettingsSchema = z.object(machineSettingsShape).partial();
export type MachineSettings = z.infer<typeof machineSettingsSchema>;

const { tools: _tools, ...profileShape } = machineProfileSchema.shape;
void _tools;
/** The keys of the profile a PATCH may send; each replaces the stored one whole (an axes object needs x, y and z). */
export const PROFILE_KEYS = Object.keys(profileShape) as (keyof Omit<MachineProfile, 'tools'>)[];

/** PATCH /api/machines/:id: any profile keys but tools (they have their own routes), the settings, and archived. */
export const machinePatchSchema = z
  .object({ ...profileShape, ...machineSettingsShape, archived: z.boolean({ error: 'must be true or false' }) })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change.', path: ['_form'] });
export type MachinePatch = z.infer<typeof machinePatchSchema>;

export const toolDescriptionSchema = z.string({ error: 'must be text' }).trim().max(160, 'The description is too long (160 characters at most).');

export const toolInputSchema = toolSchema.extend({ description: toolDescriptionSchema.default('') });
export const toolPatchSchema = toolSchema
  .extend({ description: toolDescriptionSchema })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change.', path: ['_form'] });
export type ToolInput = MachineTool & { description: string };
export type ToolPatch = z.infer<typeof toolPatchSchema>;

export const shopSettingsSchema = z.object({ lengthUnit: z.enum(LENGTH_UNITS, { error: 'Choose millimetres or inches.' }) });

const TOOL_SUBJECTS: Record<string, string> = { number: 'Tool number', diameterMm: 'Diameter', flutes: 'Flutes', kind: 'Kind' };

/** "Diameter" + "must be greater than 0" → "Diameter must be greater than 0."; a message that is a sentence of its own is kept. */
function sentence(subject: string, message: string): string {
  const text = /^(must|is)\b/.test(message) ? `${subject} ${message}` : message.charAt(0).toUpperCase() + message.slice(1);
  return /[.!?]$/.test(text) ? text : `${text}.`;
}

/** Issues as field errors with sentences: "Corner tolerance must be 0 or more.", and tools[2].number as "tools.2.number". */
export function profileFieldErrors(error: z.ZodError, what: 'machine' | 'tool' = 'machine'): FieldErrors {
  const fields: FieldErrors = {};
  for (const issue of error.issues) {
    const path = issue.path.map(String);
    const key = path.length > 0 ? path.join('.') : '_form';
    let message: string;
    if (path[0] === 'tools' && path.length === 3) message = sentence(TOOL_SUBJECTS[path[2]] ?? 'Tool', issue.message);
    else if (path[0] === 'tools') message = sentence('The tool list', issue.message);
    else if (what === 'tool' && key in TOOL_SUBJECTS) message = sentence(TOOL_SUBJECTS[key], issue.message);
    else message = fieldSentence(key, issue.message);
    (fields[key] ??= []).push(message);
  }
  return fields;
}

function invalid(what: string, fields: FieldErrors): AppError {
  return new AppError(`invalid:${what}`, `Some of the ${what} details need fixing: each one is named at its field.`, fields);
}

/** Parses with the schema or throws the 422 carrying every field's sentence. */
export function parseProfileOrThrow<T extends z.ZodType>(schema: T, input: unknown, what: 'machine' | 'tool'): z.output<T> {
  const r = schema.safeParse(input);
  if (!r.success) throw invalid(what, profileFieldErrors(r.error, what));
  return r.data;
}

/** POST /api/machines: a PROFILE.json (tools optional) plus the row's settings. Both parts are checked, and every issue reported. */
export function parseMachineCreate(body: unknown): { profile: MachineProfile; settings: MachineSettings } {
  const input = typeof body === 'object' && body !== null && !Array.isArray(body) ? (body as Record<string, unknown>) : {};
  const profile = machineProfileSchema.safeParse({ tools: [], ...input });
  const settings = machineSettingsSchema.safeParse({ hourlyRateMinor: input.hourlyRateMinor, defaultHoldDown: input.defaultHoldDown, defaultVacuumKpa: input.defaultVacuumKpa });
  if (profile.success && settings.success) return { profile: profile.data, settings: settings.data };
  const fields = {
    ...(profile.success ? {} : profileFieldErrors(profile.error)),
    ...(settings.success ? {} : profileFieldErrors(settings.error)),
  };
  throw invalid('machine', fields);
}
