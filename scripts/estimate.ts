// `npm run -s estimate -- FILE --machine PROFILE.json [...]`: run-time estimate of a G-code
// program on a machine profile, as a short table or (--json) one JSON object. Exit 0 when an
// estimate was made, whatever its findings; 2 with one line on stderr for a bad argument, an
// unreadable, empty or binary program file or a bad profile.
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { loadAnalysis } from '@/lib/analysis';
import { checkProgramBytes } from '@/lib/gcode/program-text';
import { runEstimate } from '@/lib/estimate/run-estimate';
import { parseMachineProfile } from '@/lib/validation/machine-profile';
import { parseEstimateArgs } from './estimate-args';
import { formatEstimateTable } from './estimate-table';

function fail(message: string, code = 2): never {
  process.stderr.write(`estimate: ${message.replace(/\s+/g, ' ').trim()}\n`);
  process.exit(code);
}

function readOrFail(file: string, what: string): Buffer {
  try {
    return readFileSync(file);
  } catch (err) {
    const e = err as NodeJS.ErrnoException;
    fail(`cannot read ${what} ${file}: ${e.code === 'ENOENT' ? 'no such file' : e.code === 'EISDIR' ? 'is a directory' : e.message}`);
  }
}

async function main(): Promise<void> {
  // started first: the WebAssembly compiles while the files are read and hashed
  const analysisReady = loadAnalysis();
  const parsed = parseEstimateArgs(process.argv.slice(2));
  if (!parsed.ok) fail(parsed.message);
  const args = parsed.args;

  const profileBytes = readOrFail(args.machine, 'machine profile');
  let profileJson: unknown;
  try {
    profileJson = JSON.parse(profileBytes.toString('utf8'));
  } catch (err) {
    fail(`bad machine profile ${args.machine}: not JSON (${(err as Error).message})`);
  }
  const profile = parseMachineProfile(profileJson);
  if (!profile.ok) fail(`bad machine profile ${args.machine}: ${profile.message}`);

  const bytes = readOrFail(args.file, 'program');
  // an empty, blank or binary file is refused like an unreadable one (the upload's rule too)
  const program = checkProgramBytes(bytes);
  if (!program.ok) fail(`cannot use program ${args.file}: ${program.message}`);
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  await analysisReady;
  const { report } = runEstimate(program.text, profile.profile, args, { name: path.basename(args.file), sha256 });
  process.stdout.write(args.json ? `${JSON.stringify(report)}\n` : `${formatEstimateTable(report, profile.profile.name, profile.profile.timeFactor)}\n`);
}

main().catch((err: unknown) => fail(`internal error: ${(err as Error).message}`, 1));
