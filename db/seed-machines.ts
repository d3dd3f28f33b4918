// Fixture machine profiles for the seed: fixtures/machines/*.json read and validated with
// the CLI's schema. The converter between a profile and the `machines` + `tools` columns
// lives with the other machine queries, in db/queries/machines.ts.
import fs from 'node:fs';
import path from 'node:path';
import { parseMachineProfile, type MachineProfile } from '@/lib/validation/machine-profile';

/** Reads and validates a fixture profile; the error names the file and the bad field. */
export function readProfileFile(file: string): MachineProfile {
  let raw: unknown;
  try {
    raw = JSON.parse(fs.readFileSync(file, 'utf8'));
  } catch (err) {
    throw new Error(`${path.relative(process.cwd(), file)}: not readable JSON (${(err as Error).message})`);
  }
  const parsed = parseMachineProfile(raw);
  if (!parsed.ok) throw new Error(`${path.relative(process.cwd(), file)}: ${parsed.message}`);
  return parsed.profile;
}
