// Command-line arguments of `npm run estimate`, checked into one typed object or one message.
import { parseArgs } from 'node:util';
import { HOLD_DOWNS } from '@/lib/validation/enums';

/** the hold-down methods --hold takes: the one list in lib/validation/enums.ts */
export const HOLD_METHODS = HOLD_DOWNS;
export type HoldMethod = (typeof HOLD_METHODS)[number];

export interface EstimateArgs {
  file: string;
  machine: string;
  /** along X, along Y, thickness; null when --sheet was not given */
  sheet: { widthMm: number; lengthMm: number; thicknessMm: number } | null;
  zero: 'top' | 'table';
  hold: HoldMethod | null;
  vacuumKpa: number | null;
  json: boolean;
}

export const USAGE =
  'usage: npm run -s estimate -- FILE --machine PROFILE.json [--sheet XxYxT] [--zero top|table] [--hold vacuum|tape-glue|clamps|tabs|skin] [--vacuum-kpa N] [--json]' +
  " (--sheet: the sheet in mm, its size along the machine's X, its size along Y, and its thickness, e.g. 2440x1220x18)";

export type ArgsParse = { ok: true; args: EstimateArgs } | { ok: false; message: string };

export function parseEstimateArgs(argv: string[]): ArgsParse {
  let parsed;
  try {
    parsed = parseArgs({
      args: argv,
      allowPositionals: true,
      options: {
        machine: { type: 'string' },
        sheet: { type: 'string' },
        zero: { type: 'string' },
        hold: { type: 'string' },
        'vacuum-kpa': { type: 'string' },
        json: { type: 'boolean' },
      },
    });
  } catch (err) {
    return { ok: false, message: `${(err as Error).message.split('\n')[0]}; ${USAGE}` };
  }
  const { values, positionals } = parsed;
  if (positionals.length !== 1) return { ok: false, message: `expected one program file, got ${positionals.length}; ${USAGE}` };
  if (!values.machine) return { ok: false, message: `--machine PROFILE.json is required; ${USAGE}` };

  let sheet: EstimateArgs['sheet'] = null;
  if (values.sheet !== undefined) {
    const parts = values.sheet.toLowerCase().split(/[x×]/).map((s) => (s.trim() === '' ? NaN : Number(s.trim())));
    if (parts.length !== 3 || parts.some((n) => !Number.isFinite(n) || n <= 0)) {
      return { ok: false, message: `--sheet must be X×Y×T in mm (size along X, size along Y, thickness), three positive numbers such as 2440x1220x18 (got "${values.sheet}")` };
    }
    sheet = { widthMm: parts[0], lengthMm: parts[1], thicknessMm: parts[2] };
  }
  const zero = values.zero ?? 'top';
  if (zero !== 'top' && zero !== 'table') return { ok: false, message: `--zero must be top or table (got "${zero}")` };
  let hold: HoldMethod | null = null;
  if (values.hold !== undefined) {
    if (!(HOLD_METHODS as readonly string[]).includes(values.hold)) return { ok: false, message: `--hold must be one of ${HOLD_METHODS.join(', ')} (got "${values.hold}")` };
    hold = values.hold as HoldMethod;
  }
  let vacuumKpa: number | null = null;
  if (values['vacuum-kpa'] !== undefined) {
    vacuumKpa = Number(values['vacuum-kpa']);
    if (!Number.isFinite(vacuumKpa) || vacuumKpa <= 0 || vacuumKpa > 101.325) {
      return { ok: false, message: `--vacuum-kpa must be a pressure difference above 0 and at most 101.325 kPa (1 atm) (got "${values['vacuum-kpa']}")` };
    }
  }
  return { ok: true, args: { file: positionals[0], machine: values.machine, sheet, zero, hold, vacuumKpa, json: values.json ?? false } };
}
