// Fixtures of the estimate tests and the server benchmark: a shop of their own (users of
// every role, a customer, a machine from a fixture profile, a job), programs put straight
// into object storage and the tables the way an upload leaves them, the CLI run on the same
// file and profile, and polling an estimate until it ends.
import { execFile } from 'node:child_process';
import { createHash, randomBytes } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import bcrypt from 'bcryptjs';
import { and, eq, inArray } from 'drizzle-orm';
import type { Db } from '@/db/client';
import { profileToMachineColumns } from '@/db/queries/machines';
import { readProfileFile } from '@/db/seed-machines';
import * as s from '@/db/schema';
import { deleteObject, putObject } from '@/lib/storage/s3';
import type { MachineProfile } from '@/lib/validation/machine-profile';

const run = promisify(execFile);
export const ROOT = path.resolve(__dirname, '../../..');
export const PASSWORD = 'kerfcast-estimates-test';

export interface EstimateShop {
  shopId: number;
  slug: string;
  users: Record<'programmer' | 'estimator' | 'operator', { id: number; email: string }>;
  customerId: number;
  machineId: number;
  jobId: number;
  profile: MachineProfile;
  job: { sheetWidthMm: number; sheetLengthMm: number; sheetThicknessMm: number; zZero: 'top' | 'table'; holdDown: 'vacuum'; vacuumKpa: number };
}

/** A shop with its own machine (a copy of fixtures/machines/router-1.json) and one vacuum job on 18 mm birch. */
export async function createEstimateShop(db: Db, label: string, options: { shopId?: number } = {}): Promise<EstimateShop> {
  const slug = `est-${label}-${randomBytes(3).toString('hex')}`;
  // an id of its own keeps a scratch database's object keys (shops/{shopId}/…) apart from another database's in the shared bucket
  const [{ id: shopId }] = await db
    .insert(s.shops)
    .values({ ...(options.shopId !== undefined ? { id: options.shopId } : {}), name: `Estimates ${label}`, slug, currency: 'EUR' })
    .$returningId();
  const hash = await bcrypt.hash(PASSWORD, 4);
  const users = {} as EstimateShop['users'];
  for (const role of ['programmer', 'estimator', 'operator'] as const) {
    const email = `${role}@${slug}.example`;
    const [{ id }] = await db.insert(s.users).values({ shopId, email, name: `${role} of ${label}`, role, passwordHash: hash }).$returningId();
    users[role] = { id, email };
  }
  const [{ id: customerId }] = await db.insert(s.customers).values({ shopId, name: 'Pellow Lane Florist', email: 'orders@pellow-lane.example' }).$returningId();
  const profile = readProfileFile(path.join(ROOT, 'fixtures/machines/router-1.json'));
  const [{ id: machineId }] = await db.insert(s.machines).values({ shopId, ...profileToMachineColumns(profile), defaultHoldDown: 'vacuum' }).$returningId();
  await db.insert(s.tools).values(profile.tools.map((t) => ({ shopId, machineId, number: t.number, diameterMm: t.diameterMm, flutes: t.flutes, kind: t.kind })));
  const job = { sheetWidthMm: 2440, sheetLengthMm: 1220, sheetThicknessMm: 18, zZero: 'top' as const, holdDown: 'vacuum' as const, vacuumKpa: 61 };
  const [{ id: jobId }] = await db
    .insert(s.jobs)
    .values({ shopId, title: 'Shelf brackets for the spring window', customerId, machineId, quantity: 40, ...job })
    .$returningId();
  return { shopId, slug, users, customerId, machineId, jobId, profile, job };
}

export interface StoredProgram {
  programId: number;
  programVersionId: number;
  version: number;
  sha256: string;
  objectKey: string;
}

/** A program version as an upload stores it: the object first, then the rows. `store: false` leaves the object out. */
export async function addProgramVersion(
  db: Db,
  shop: Pick<EstimateShop, 'shopId' | 'jobId'>,
  name: string,
  bytes: Buffer,
  options: { store?: boolean } = {},
): Promise<StoredProgram> {
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  let [program] = await db
    .select()
    .from(s.programs)
    .where(and(eq(s.programs.shopId, shop.shopId), eq(s.programs.jobId, shop.jobId), eq(s.programs.name, name)));
  let version = 1;
  if (program) {
    version = program.latestVersion + 1;
    await db.update(s.programs).set({ latestVersion: version }).where(eq(s.programs.id, program.id));
  } else {
    const [{ id }] = await db.insert(s.programs).values({ shopId: shop.shopId, jobId: shop.jobId, name, latestVersion: 1 }).$returningId();
    [program] = await db.select().from(s.programs).where(eq(s.programs.id, id));
  }
  const objectKey = `shops/${shop.shopId}/jobs/${shop.jobId}/programs/${program.id}/v${version}-${sha256.slice(0, 16)}.nc`;
  if (options.store !== false) await putObject(objectKey, bytes, 'text/plain; charset=utf-8');
  const lines = bytes.toString('utf8').split('\n').length;
  const [{ id: programVersionId }] = await db
    .insert(s.programVersions)
    .values({ shopId: shop.shopId, programId: program.id, version, objectKey, sha256, bytes: bytes.length, lines })
    .$returningId();
  return { programId: program.id, programVersionId, version, sha256, objectKey };
}

/** Removes everything the shop has, objects included. */
export async function removeEstimateShop(db: Db, shopId: number): Promise<void> {
  const ests = await db.select({ reportKey: s.estimates.reportKey }).from(s.estimates).where(eq(s.estimates.shopId, shopId));
  const versions = await db.select({ objectKey: s.programVersions.objectKey }).from(s.programVersions).where(eq(s.programVersions.shopId, shopId));
  for (const key of [...ests.map((e) => e.reportKey), ...versions.map((v) => v.objectKey)]) {
    if (key) await deleteObject(key).catch(() => {});
  }
  await db.delete(s.estimates).where(eq(s.estimates.shopId, shopId));
  await db.delete(s.jobEvents).where(eq(s.jobEvents.shopId, shopId));
  await db.delete(s.programVersions).where(eq(s.programVersions.shopId, shopId));
  await db.delete(s.programs).where(eq(s.programs.shopId, shopId));
  await db.delete(s.jobs).where(eq(s.jobs.shopId, shopId));
  await db.delete(s.machineVersions).where(eq(s.machineVersions.shopId, shopId));
  await db.delete(s.tools).where(eq(s.tools.shopId, shopId));
  await db.delete(s.machines).where(eq(s.machines.shopId, shopId));
  await db.delete(s.customers).where(eq(s.customers.shopId, shopId));
  const userIds = (await db.select({ id: s.users.id }).from(s.users).where(eq(s.users.shopId, shopId))).map((u) => u.id);
  if (userIds.length > 0) await db.delete(s.users).where(inArray(s.users.id, userIds));
  await db.delete(s.shops).where(eq(s.shops.id, shopId));
}

export interface CliSettings {
  sheet: { widthMm: number; lengthMm: number; thicknessMm: number };
  zero: 'top' | 'table';
  hold: string;
  vacuumKpa: number | null;
}

function rssOf(pid: number | undefined): number {
  try {
    const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
    return m ? Number(m[1]) * 1024 : 0;
  } catch {
    return 0; // ended, or no /proc
  }
}

/**
 * `npm run estimate -- FILE --machine PROFILE.json … --json`, the way a programmer runs it:
 * the parsed output, the wall time and the process's peak resident memory (sampled, Linux).
 */
export async function runCli(file: string, profile: unknown, settings: CliSettings): Promise<{ json: unknown; stdout: string; wallMs: number; peakRssBytes: number }> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'kerfcast-cli-'));
  try {
    const profileFile = path.join(dir, 'profile.json');
    writeFileSync(profileFile, JSON.stringify(profile));
    const args = [
      '--require', 'tsx/cjs', path.join(ROOT, 'scripts/estimate.ts'), file,
      '--machine', profileFile,
      '--sheet', `${settings.sheet.widthMm}x${settings.sheet.lengthMm}x${settings.sheet.thicknessMm}`,
      '--zero', settings.zero,
      '--hold', settings.hold,
      ...(settings.vacuumKpa !== null ? ['--vacuum-kpa', String(settings.vacuumKpa)] : []),
      '--json',
    ];
    const started = performance.now();
    const running = run(process.execPath, args, { cwd: ROOT, maxBuffer: 512 * 1024 * 1024 });
    let peakRssBytes = 0;
    const sampler = setInterval(() => (peakRssBytes = Math.max(peakRssBytes, rssOf(running.child.pid))), 50);
    try {
      const { stdout } = await running;
      const wallMs = performance.now() - started;
      return { json: JSON.parse(stdout), stdout, wallMs, peakRssBytes };
    } finally {
      clearInterval(sampler);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
