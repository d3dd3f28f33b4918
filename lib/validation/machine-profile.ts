// Machine profile: the limits the run-time estimate rests on. The same schema validates the
// admin form, the `machines` API and the CLI's PROFILE.json. Lengths mm, feeds mm/min,
// accelerations mm/s², times s, each field named with its unit. `lookaheadBlocks` 0 and
// `maxBlocksPerS` 0 mean unlimited.
import { TOOL_KINDS } from '@/lib/validation/enums';
import { z } from '@/lib/validation/zod';

type Issue = { input?: unknown };
const need = (expected: string) => (iss: Issue) => (iss.input === undefined ? 'is required' : `must be ${expected}`);
const num = () => z.number({ error: need('a number') });
const int = () => num().int({ error: 'must be a whole number' });
const positive = () => num().positive({ error: 'must be greater than 0' });
const nonNegative = () => num().min(0, { error: 'must be 0 or more' });
const axes = (value: () => z.ZodNumber) => z.object({ x: value(), y: value(), z: value() }, { error: need('an object with x, y and z') });

export const toolSchema = z.object({
  number: int().min(0, { error: 'must be 0 or more' }).max(65535, { error: 'must be 65535 or less' }),
  diameterMm: positive(),
  flutes: int().min(1, { error: 'must be 1 or more' }),
  kind: z.enum(TOOL_KINDS, { error: need(`one of ${TOOL_KINDS.join(', ')}`) }),
});

export const machineProfileSchema = z
  .object({
    name: z.string({ error: need('text') }).trim().min(1, { error: 'must not be empty' }).max(120, { error: 'must be 120 characters or fewer' }),
    travelMm: axes(positive),
    homeMm: axes(num), // machine coordinates
    maxFeedMmPerMin: axes(positive),
    rapidMmPerMin: axes(positive),
    accelMmPerS2: axes(positive),
    /** how far the path may pass inside a sharp corner between two straight blocks (lib/kinematics/corner-speed.ts) */
    cornerToleranceMm: nonNegative(),
    lookaheadBlocks: int().min(0, { error: 'must be 0 (unlimited) or more' }).max(100000, { error: 'must be 100000 or less' }),
    maxBlocksPerS: nonNegative(), // 0 = no limit
    /** largest distance between an arc and the chords it is flattened into */
    chordToleranceMm: positive(),
    toolChangeSeconds: nonNegative(),
    spindleSpinUpSeconds: nonNegative(),
    timeFactor: positive(),
    tools: z.array(toolSchema, { error: need('a list') }),
  })
  .superRefine((p, ctx) => {
    const seen = new Set<number>();
    p.tools.forEach((t, i) => {
      if (seen.has(t.number)) ctx.addIssue({ code: 'custom', path: ['tools', i, 'number'], message: `tool ${t.number} is listed twice` });
      seen.add(t.number);
    });
  });

export type MachineProfile = z.infer<typeof machineProfileSchema>;
export type MachineTool = z.infer<typeof toolSchema>;

export type ProfileParse =
  | { ok: true; profile: MachineProfile }
  | { ok: false; message: string; fields: { path: string; message: string }[] };

function pathText(path: readonly PropertyKey[]): string {
  let s = '';
  for (const p of path) s += typeof p === 'number' ? `[${p}]` : s ? `.${String(p)}` : String(p);
  return s || '(profile)';
}

/** Validates unknown input (parsed JSON, a DB row) as a machine profile; the message names the first bad field. */
export function parseMachineProfile(input: unknown): ProfileParse {
  const r = machineProfileSchema.safeParse(input);
  if (r.success) return { ok: true, profile: r.data };
  const fields = r.error.issues.map((i) => ({ path: pathText(i.path), message: i.message }));
  const first = fields[0];
  const more = fields.length > 1 ? ` (and ${fields.length - 1} more)` : '';
  return { ok: false, message: `${first.path}: ${first.message}${more}`, fields };
}
