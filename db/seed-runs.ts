// Demo history for the runs pages and the calibration (issue 15 point 6): for each demo router
// one program of a demo job (a committed fixture program, stored the way an upload stores it),
// its estimate queued for the server to compute, and a few dozen invented past runs by Lena
// over the last two months. The actual times are the engine's own estimate of the program on
// that machine (lib/kinematics, the number the queued estimate will store) times a ratio
// drawn around a machine-typical figure: Router 1 runs about 12 % over its estimates, Router 2
// about 6 % under (invented figures, in the range shops see between computed and real
// times; common practice, not a measurement). The draws are a fixed pseudo-random sequence,
// so every seed gives the same history. Two runs per machine are interrupted and one is
// voided, as the statistics must leave them out. Idempotent: a program that already has runs
// is left as it is.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { and, count, eq } from 'drizzle-orm';
import { interpret } from '@/lib/gcode';
import { estimate, stockTopZ } from '@/lib/kinematics';
import { ensureMachineVersion, jobEstimateSettings, requestEstimate } from '@/lib/estimate-server/request';
import type { Tx } from './queries/machines';
import { storeSeedVersion } from './seed-program';
import { jobs, machines, programs, programVersions, runChanges, runEvents, runs, users } from './schema';

interface History {
  job: string;
  machine: string;
  fixture: string;
  /** the machine's typical actual ÷ estimate (invented) */
  ratio: number;
  /** spread of the log ratio (invented: a few per cent run to run) */
  sigma: number;
  count: number;
}

const HISTORY: History[] = [
  { job: 'Window display shelf brackets', machine: 'Router 1', fixture: 'shelf-brackets-birch-18mm.nc', ratio: 1.12, sigma: 0.05, count: 20 },
  { job: 'Cutting-board blanks', machine: 'Router 2', fixture: 'cutting-boards-hdpe-12mm-inch.nc', ratio: 0.94, sigma: 0.04, count: 16 },
];

const NOTES = ['Swapped the spoilboard halfway.', 'One sheet bowed at a corner; held it with two extra clamps.', 'Dust hood knocked loose, stopped to refit it.', '', '', '', ''];

/** A fixed pseudo-random sequence (mulberry32), so the demo is the same on every install. */
function sequence(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A standard normal draw (Box–Muller) from two uniform ones. */
const normal = (next: () => number) => Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next());

const fixturesDir = path.resolve(__dirname, '..', 'fixtures', 'programs');

/** The demo runs of both routers; returns how many runs it added (0 when they were there). */
export async function seedRuns(tx: Tx, shopId: number, today: Date = new Date()): Promise<number> {
  const [lena] = await tx.select({ id: users.id }).from(users).where(and(eq(users.shopId, shopId), eq(users.role, 'operator')));
  const [ada] = await tx.select({ id: users.id }).from(users).where(and(eq(users.shopId, shopId), eq(users.role, 'admin')));
  if (!lena || !ada) return 0;
  let added = 0;
  for (const [h, history] of HISTORY.entries()) {
    const [job] = await tx.select().from(jobs).where(and(eq(jobs.shopId, shopId), eq(jobs.title, history.job)));
    const [machine] = await tx.select().from(machines).where(and(eq(machines.shopId, shopId), eq(machines.name, history.machine)));
    if (!job || !machine) continue;

    const bytes = readFileSync(path.join(fixturesDir, history.fixture));
    let [program] = await tx.select().from(programs).where(and(eq(programs.jobId, job.id), eq(programs.name, history.fixture)));
    if (!program) {
      const [{ id }] = await tx.insert(programs).values({ shopId, jobId: job.id, name: history.fixture, latestVersion: 1 }).$returningId();
      [program] = await tx.select().from(programs).where(eq(programs.id, id));
    }
    let [version] = await tx.select().from(programVersions).where(and(eq(programVersions.programId, program.id), eq(programVersions.version, 1)));
    if (!version) {
      const { versionId } = await storeSeedVersion(tx, { shopId, jobId: job.id, programId: program.id, name: history.fixture, bytes, uploadedBy: null });
      [version] = await tx.select().from(programVersions).where(eq(programVersions.id, versionId));
    }
    const sha256 = version.sha256;
    const [{ n }] = await tx.select({ n: count() }).from(runs).where(eq(runs.programId, program.id));
    if (Number(n) > 0) continue;

    // the estimate the runs ran against: queued here, computed by the server's queue on start
    const settings = jobEstimateSettings(job);
    const requested = await requestEstimate(tx, {
      shopId,
      programId: program.id,
      programVersionId: version.id,
      programVersion: 1,
      sha256,
      machineId: machine.id,
      requestedBy: null,
      settings,
    });
    const { profile } = await ensureMachineVersion(tx, machine);
    const moves = interpret(bytes.toString('utf8'), { home: profile.homeMm }).moves;
    const perSheetS = estimate(moves, profile, { stockTopZ: stockTopZ(settings.zero, settings.sheet?.thicknessMm) }).totalSeconds;

    const next = sequence(20261204 + h);
    for (let i = 0; i < history.count; i++) {
      // every third working day or so, going back from yesterday, between 07:00 and 13:00 UTC
      const day = new Date(Date.UTC(today.getUTCFullYear(), today.getUTCMonth(), today.getUTCDate() - 1 - Math.floor(i * 2.9)));
      if (day.getUTCDay() === 0) day.setUTCDate(day.getUTCDate() - 2);
      if (day.getUTCDay() === 6) day.setUTCDate(day.getUTCDate() - 1);
      const startMs = day.getTime() + (7 * 3600 + Math.floor(next() * 6 * 3600)) * 1000;
      const sheets = 1 + Math.floor(next() * 4);
      const interrupted = i === 4 || i === 11;
      const ratio = history.ratio * Math.exp(history.sigma * normal(next));
      const runS = perSheetS * sheets * ratio * (interrupted ? 0.35 + next() * 0.3 : 1);
      // the timer is paused while each next sheet is loaded (a few minutes each)
      const events: { kind: 'start' | 'pause' | 'resume' | 'finish'; at: Date }[] = [{ kind: 'start', at: new Date(startMs) }];
      let at = startMs;
      const sheetsTimed = interrupted ? 1 : sheets;
      for (let s = 0; s < sheetsTimed; s++) {
        at += (runS / sheetsTimed) * 1000;
        if (s < sheetsTimed - 1) {
          events.push({ kind: 'pause', at: new Date(at) });
          at += (150 + next() * 180) * 1000;
          events.push({ kind: 'resume', at: new Date(at) });
        }
      }
      events.push({ kind: 'finish', at: new Date(at) });
      const voided = i === 7;
      const [{ id: runId }] = await tx
        .insert(runs)
        .values({
          shopId,
          jobId: job.id,
          programId: program.id,
          programVersion: 1,
          machineId: machine.id,
          machineVersion: machine.version,
          estimateId: requested.id,
          operatorId: lena.id,
          status: voided ? 'voided' : 'finished',
          startedAt: new Date(startMs),
          finishedAt: new Date(at),
          actualSeconds: Math.round(runS * 1000) / 1000,
          sheetsCut: interrupted ? Math.max(0, sheets - 2) : sheets,
          interrupted,
          notes: (interrupted ? 'Stopped: the vacuum dropped and a part shifted.' : NOTES[Math.floor(next() * NOTES.length)]) || null,
          ...(voided ? { voidedAt: new Date(at + 3600_000), voidedBy: ada.id, voidReason: 'Started on the wrong program version.' } : {}),
        })
        .$returningId();
      await tx.insert(runEvents).values(events.map((e) => ({ shopId, runId, kind: e.kind, at: e.at, userId: lena.id })));
      if (voided) {
        await tx.insert(runChanges).values({ shopId, runId, userId: ada.id, field: 'status', before: 'finished', after: 'voided', reason: 'Started on the wrong program version.', createdAt: new Date(at + 3600_000) });
      }
      added++;
    }
  }
  return added;
}
