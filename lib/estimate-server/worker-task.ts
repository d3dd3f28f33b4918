// The body of the estimate worker thread: read the program from object storage, check and
// hash its bytes, run the CLI's engine (runEstimate) on it with the frozen profile and job
// settings, store the report JSON beside the shop's other objects, hand back the figures.
// The polygon library's WebAssembly is loaded once per thread, when the thread starts.
import { createHash } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { loadAnalysis } from '@/lib/analysis';
import { holdMethods } from '@/lib/estimate/hold-methods';
import { runEstimate, type EstimateStage } from '@/lib/estimate/run-estimate';
import { checkProgramBytes } from '@/lib/gcode/program-text';
import { getObject, putObject } from '@/lib/storage/s3';
import { parseMachineProfile } from '@/lib/validation/machine-profile';
import { EstimateInputError, type EstimateTask, type EstimateTaskOutcome } from './task';

const analysisReady = loadAnalysis();

/** Share of the work done when each stage ends (read ≈ 5%, the rest measured roughly on the generated nest). */
const STAGE_PROGRESS: Record<EstimateStage, number> = { interpreted: 0.4, planned: 0.65, checked: 0.9 };

interface CheckCounts {
  errors?: number;
  warnings?: number;
  infos?: number;
}

async function readProgram(task: EstimateTask): Promise<{ text: string; sha256: string }> {
  const stored = await getObject(task.objectKey);
  if (!stored) throw new EstimateInputError(`The program file is missing from storage (${task.objectKey}).`);
  const sha256 = createHash('sha256').update(stored.body).digest('hex');
  if (sha256 !== task.sha256.toLowerCase()) {
    throw new EstimateInputError(`The stored program file no longer matches its SHA-256 (recorded ${task.sha256}, stored ${sha256}).`);
  }
  const program = checkProgramBytes(stored.body);
  if (!program.ok) throw new EstimateInputError(`The program cannot be estimated: ${program.message}`);
  return { text: program.text, sha256 };
}

export async function estimateTask(task: EstimateTask): Promise<EstimateTaskOutcome> {
  const started = performance.now();
  const progress = (share: number) => task.progressPort?.postMessage({ progress: share });
  try {
    const profile = parseMachineProfile(task.profile);
    if (!profile.ok) throw new EstimateInputError(`The machine profile of this version is not valid: ${profile.message}`);
    // the bytes are dropped once decoded: only the text stays while the engine runs
    const { text, sha256 } = await readProgram(task);
    progress(0.05);
    await analysisReady;
    const read = performance.now();
    const run = runEstimate(text, profile.profile, task.settings, { name: task.fileName, sha256 }, (stage) =>
      progress(STAGE_PROGRESS[stage]),
    );
    const { report } = run;
    const computed = performance.now();
    // the hold-down comparison's analyses: the same moves, one analysis per method; a fault
    // here leaves the estimate itself standing, without a comparison
    let methodsBody: string | null = null;
    try {
      const doc = holdMethods({
        moves: run.interpretation.moves,
        profile: profile.profile,
        job: { ...task.settings, machineVacuumKpa: task.settings.machineVacuumKpa ?? null },
        base: run.checks,
        achievedCuttingFeedMmPerMin: report.cuttingFeed.achievedMmPerMin > 0 ? report.cuttingFeed.achievedMmPerMin : null,
        now: () => performance.now(),
      });
      methodsBody = JSON.stringify(doc);
    } catch (err) {
      console.error(`[kerfcast] estimate ${task.estimateId}: the per-method hold-down analysis failed, the estimate is stored without it: ${(err as Error)?.message ?? String(err)}`);
    }
    progress(0.97);
    const methodsDone = performance.now();
    // the CLI's --json output is this string plus a newline
    const body = JSON.stringify(report);
    await putObject(task.reportKey, body, 'application/json');
    if (methodsBody !== null) await putObject(task.holdMethodsKey, methodsBody, 'application/json');
    const storedAt = performance.now();
    const checks = (report.checks ?? {}) as CheckCounts;
    return {
      ok: true,
      reportKey: task.reportKey,
      reportBytes: Buffer.byteLength(body),
      holdMethodsKey: methodsBody !== null ? task.holdMethodsKey : null,
      computeMs: Math.round(storedAt - started),
      phasesMs: {
        read: Math.round(read - started),
        engine: Math.round(computed - read),
        holdMethods: Math.round(methodsDone - computed),
        store: Math.round(storedAt - methodsDone),
      },
      totalSeconds: report.totalSeconds,
      calibratedSeconds: report.calibratedSeconds,
      errorCount: checks.errors ?? 0,
      warningCount: checks.warnings ?? 0,
      infoCount: checks.infos ?? 0,
      partCount: report.parts.length,
    };
  } catch (err) {
    // stored as the estimate's reason; a bug in the engine is named as such, with its message
    if (err instanceof EstimateInputError) return { ok: false, reason: err.message };
    return { ok: false, reason: `The estimate could not be computed: ${(err as Error)?.message ?? String(err)}` };
  } finally {
    task.progressPort?.close();
  }
}
