// Program uploads through the built app (POST/GET /api/jobs/:jobId/programs, GET
// /api/programs/:programId, GET …/versions/:version/file) against the real MariaDB and the S3
// fake: the stored object's SHA-256 read back from the fake, the rows written, versions by
// name, all-or-nothing per request, refusals worded as the CLI words them, an aborted body
// leaving nothing, shop scoping (another shop's ids → 404) and the role rules (lib/auth/roles.ts).
// References: SHA-256 is node:crypto's over the file as read from disk; line counts are
// NISTIR 6556 §3.3's (CR, LF or CRLF end a line), counted here with JavaScript's split on
// /\r\n|\r|\n/; the refusal texts are those `npm run estimate` prints for the same bytes.
import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { DeleteObjectCommand, GetObjectCommand, ListObjectsV2Command, type S3Client } from '@aws-sdk/client-s3';
import bcrypt from 'bcryptjs';
import { and, eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { callApi, DEMO_PASSWORD, signInOverHttp, startAppServer, type AppServer, type CookieJar } from './support/app-server';

// A port of its own: this file starts its server with a small upload limit (8 MiB), and must
// never reuse a server started by another file with the default one.
const PORT = 3102;
const MAX_BYTES = 8 * 1024 * 1024;
process.env.PROGRAM_MAX_BYTES = String(MAX_BYTES);

type DbModule = typeof import('@/db/client');
type Schema = typeof import('@/db/schema');

const ROOT = path.resolve(__dirname, '../..');
const FIXTURE = path.join(ROOT, 'fixtures/programs/shelf-brackets-birch-18mm.nc');
const FIXTURE_NAME = 'shelf-brackets-birch-18mm.nc';
const B_SLUG = 'test-shop-programs-b';
const B_EMAIL = 'admin@test-shop-programs-b.example';

let server: AppServer;
let dbm: DbModule;
let s: Schema;
let s3: S3Client;
let bucket: string;
let baseUrl: string;
let scratch: string;
const jars: Record<string, CookieJar> = {};
const a = { shopId: 0, customerId: 0, machineId: 0, jobIds: [] as number[] };
const b = { shopId: 0, userId: 0, jobId: 0, programId: 0 };

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');
/** NISTIR 6556 §3.3 line count, by the platform's regex split */
const linesOf = (text: string) => text.split(/\r\n|\r|\n/).length - (/[\r\n]$/.test(text) ? 1 : 0);

/** A valid program of about `bytes` bytes (a raster of feed moves), different per seed. */
function bigProgram(bytes: number, seed: number): Buffer {
  const lines = [`(generated raster ${seed})`, 'G21 G90', 'G0 Z5', 'G1 Z-3 F1200'];
  let size = lines.join('\n').length;
  for (let i = 0; size < bytes - 16; i++) {
    const line = `G1 X${(i % 997) + seed} Y${Math.floor(i / 997)} F6000`;
    lines.push(line);
    size += line.length + 1;
  }
  lines.push('M30');
  return Buffer.from(`${lines.join('\n')}\n`);
}

async function createJob(title: string): Promise<number> {
  const [{ id }] = await dbm.db
    .insert(s.jobs)
    .values({
      shopId: a.shopId, title, customerId: a.customerId, machineId: a.machineId,
      sheetWidthMm: 1220, sheetLengthMm: 2440, sheetThicknessMm: 18, holdDown: 'vacuum', vacuumKpa: 70, quantity: 4,
    })
    .$returningId();
  a.jobIds.push(id);
  return id;
}

/** the answers' shapes, as the routes document them; a field is read only where the status says it is there */
interface ErrorAnswer {
  error: { code: string; message: string; fields?: Record<string, string[]> };
}
interface EstimateRef {
  id: number;
  status: string;
}
interface UploadAnswer extends ErrorAnswer {
  programs: { id: number; jobId: number; name: string; version: number; sha256: string; bytes: number; lines: number; estimate: EstimateRef | null }[];
}
interface DetailAnswer {
  program: { id: number; versions: { version: number; sha256: string; estimates: EstimateRef[] }[] };
}
interface ListAnswer {
  programs: { id: number; latestVersion: number; latest: { version: number; sha256: string; estimate: EstimateRef | null } }[];
}

interface PartSpec {
  name: string;
  bytes: Buffer | string;
  field?: string;
}

async function upload(jar: CookieJar | null, jobId: number, parts: PartSpec[]) {
  const form = new FormData();
  for (const p of parts) form.append(p.field ?? 'file', new Blob([new Uint8Array(typeof p.bytes === 'string' ? Buffer.from(p.bytes) : p.bytes)]), p.name);
  const response = await fetch(`${baseUrl}/api/jobs/${jobId}/programs`, {
    method: 'POST',
    headers: jar ? { cookie: jar.header() } : {},
    body: form,
  });
  return { status: response.status, body: (await response.json()) as UploadAnswer };
}

async function objectKeys(prefix: string): Promise<string[]> {
  const keys: string[] = [];
  let token: string | undefined;
  do {
    const out = await s3.send(new ListObjectsV2Command({ Bucket: bucket, Prefix: prefix, ContinuationToken: token }));
    for (const o of out.Contents ?? []) if (o.Key) keys.push(o.Key);
    token = out.IsTruncated ? out.NextContinuationToken : undefined;
  } while (token);
  return keys;
}

async function readObject(key: string): Promise<Buffer> {
  const out = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
  return Buffer.from(await out.Body!.transformToByteArray());
}

/** Everything a job has from uploads: objects in storage and rows. */
async function snapshot(jobId: number) {
  const { db } = dbm;
  const programRows = await db.select().from(s.programs).where(eq(s.programs.jobId, jobId));
  const ids = programRows.map((p) => p.id);
  const versions = ids.length ? await db.select().from(s.programVersions).where(inArray(s.programVersions.programId, ids)) : [];
  const estimateRows = ids.length ? await db.select().from(s.estimates).where(inArray(s.estimates.programId, ids)) : [];
  const events = await db.select().from(s.jobEvents).where(eq(s.jobEvents.jobId, jobId));
  const [job] = await db.select().from(s.jobs).where(eq(s.jobs.id, jobId));
  return {
    objects: (await objectKeys(`shops/${job.shopId}/jobs/${jobId}/`)).sort(),
    programs: programRows.length,
    versions: versions.length,
    estimates: estimateRows.length,
    events: events.length,
    status: job.status,
  };
}

/** `npm run estimate` on these bytes: the text after "cannot use program FILE: ". */
async function cliRefusal(name: string, bytes: Uint8Array): Promise<string> {
  const file = path.join(scratch, name);
  writeFileSync(file, bytes);
  const run = promisify(execFile);
  try {
    await run(process.execPath, ['--require', 'tsx/cjs', 'scripts/estimate.ts', file, '--machine', 'fixtures/machines/router-1.json'], { cwd: ROOT });
  } catch (err) {
    const stderr = String((err as { stderr?: string }).stderr ?? '').trim();
    const prefix = `estimate: cannot use program ${file}: `;
    expect(stderr.startsWith(prefix), stderr).toBe(true);
    return stderr.slice(prefix.length);
  }
  throw new Error(`the CLI took ${name}`);
}

async function removeJobs(jobIds: number[]) {
  const { db } = dbm;
  if (jobIds.length === 0) return;
  const programRows = await db.select({ id: s.programs.id }).from(s.programs).where(inArray(s.programs.jobId, jobIds));
  const ids = programRows.map((p) => p.id);
  if (ids.length) {
    // a worker of the app may still hold an estimate; give it time to let go
    for (let i = 0; i < 120; i++) {
      const running = await db.select({ id: s.estimates.id }).from(s.estimates).where(and(inArray(s.estimates.programId, ids), eq(s.estimates.status, 'running')));
      if (running.length === 0) break;
      await new Promise((r) => setTimeout(r, 500));
    }
    const estimateRows = await db.select().from(s.estimates).where(inArray(s.estimates.programId, ids));
    for (const e of estimateRows) if (e.reportKey) await s3.send(new DeleteObjectCommand({ Bucket: bucket, Key: e.reportKey }));
    await db.delete(s.estimates).where(inArray(s.estimates.programId, ids));
    await db.delete(s.programVersions).where(inArray(s.programVersions.programId, ids));
    await db.delete(s.programs).where(inArray(s.programs.id, ids));
  }
  const jobRows = await db.select().from(s.jobs).where(inArray(s.jobs.id, jobIds));
  for (const job of jobRows) for (const key of await objectKeys(`shops/${job.shopId}/jobs/${job.id}/`)) await s3.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }));
  await db.delete(s.jobEvents).where(inArray(s.jobEvents.jobId, jobIds));
  await db.delete(s.jobs).where(inArray(s.jobs.id, jobIds));
}

async function removeShopB() {
  const { db } = dbm;
  const [shop] = await db.select().from(s.shops).where(eq(s.shops.slug, B_SLUG));
  if (!shop) return;
  const jobRows = await db.select({ id: s.jobs.id }).from(s.jobs).where(eq(s.jobs.shopId, shop.id));
  await removeJobs(jobRows.map((j) => j.id));
  await db.delete(s.customers).where(eq(s.customers.shopId, shop.id));
  await db.delete(s.users).where(eq(s.users.shopId, shop.id));
  await db.delete(s.shops).where(eq(s.shops.id, shop.id));
}

beforeAll(async () => {
  server = await startAppServer(PORT);
  baseUrl = server.baseUrl;
  dbm = await import('@/db/client');
  s = await import('@/db/schema');
  const storage = await import('@/lib/storage/s3');
  s3 = storage.createS3Client();
  bucket = (await import('@/lib/env')).env.S3_BUCKET;
  scratch = mkdtempSync(path.join(tmpdir(), 'kerfcast-programs-'));
  const { db } = dbm;

  const [shopA] = await db.select().from(s.shops).where(eq(s.shops.name, 'Alder & Finch Shopfitting'));
  a.shopId = shopA.id;
  [{ id: a.customerId }] = await db.select({ id: s.customers.id }).from(s.customers).where(eq(s.customers.shopId, a.shopId)).limit(1);
  [{ id: a.machineId }] = await db.select({ id: s.machines.id }).from(s.machines).where(and(eq(s.machines.shopId, a.shopId), eq(s.machines.name, 'Router 1')));

  await removeShopB();
  [{ id: b.shopId }] = await db.insert(s.shops).values({ name: 'Programs Test Shop B', slug: B_SLUG, currency: 'EUR' }).$returningId();
  [{ id: b.userId }] = await db
    .insert(s.users)
    .values({ shopId: b.shopId, email: B_EMAIL, name: 'Bo Test', role: 'admin', passwordHash: await bcrypt.hash(DEMO_PASSWORD, 4) })
    .$returningId();
  const [{ id: bCustomer }] = await db.insert(s.customers).values({ shopId: b.shopId, name: 'B Programs Customer', email: 'orders@b-programs.example' }).$returningId();
  [{ id: b.jobId }] = await db
    .insert(s.jobs)
    .values({ shopId: b.shopId, title: 'B job with a program', customerId: bCustomer, sheetWidthMm: 1220, sheetLengthMm: 2440, sheetThicknessMm: 6, holdDown: 'clamps', quantity: 1 })
    .$returningId();

  for (const [key, email] of [
    ['priya', 'priya@alder-finch.example'],
    ['ada', 'ada@alder-finch.example'],
    ['tomas', 'tomas@alder-finch.example'],
    ['lena', 'lena@alder-finch.example'],
    ['bo', B_EMAIL],
  ] as const) {
    const result = await signInOverHttp(email, DEMO_PASSWORD);
    expect(result.signedIn, `${email} signs in`).toBe(true);
    jars[key] = result.jar;
  }

  // shop B's own program, uploaded the ordinary way (B has no machine: no estimate)
  const bUpload = await upload(jars.bo, b.jobId, [{ name: 'b-secret.nc', bytes: 'G21 G90\nG0 X10 Y10\nM30\n' }]);
  expect(bUpload.status, JSON.stringify(bUpload.body)).toBe(201);
  b.programId = bUpload.body.programs[0].id;
  expect(bUpload.body.programs[0].estimate).toBeNull();
});

afterAll(async () => {
  if (dbm) {
    await removeJobs(a.jobIds);
    await removeShopB();
    await dbm.closeDb();
  }
  if (scratch) rmSync(scratch, { recursive: true, force: true });
  await server?.stop();
});

describe('an upload stores the file, its figures and its rows', () => {
  let jobId: number;
  let programId: number;
  let firstEstimateId: number;
  const fixture = readFileSync(FIXTURE);

  beforeAll(async () => {
    jobId = await createJob('Programs test: shelf brackets');
  });

  it('answers 201 with the SHA-256, bytes and lines of the file', async () => {
    const before = await snapshot(jobId);
    expect(before.status).toBe('draft');
    const r = await upload(jars.priya, jobId, [{ name: FIXTURE_NAME, bytes: fixture }]);
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.programs).toHaveLength(1);
    const p = r.body.programs[0];
    expect(p).toMatchObject({ jobId, name: FIXTURE_NAME, version: 1, sha256: sha256(fixture), bytes: fixture.length, lines: linesOf(fixture.toString('utf8')) });
    expect(['pending', 'running', 'done']).toContain(p.estimate?.status);
    programId = p.id;
    firstEstimateId = p.estimate!.id;
  });

  it('the object in storage has that SHA-256, under a key built from ids, not the name', async () => {
    const [version] = await dbm.db.select().from(s.programVersions).where(eq(s.programVersions.programId, programId));
    expect(version.objectKey).toMatch(new RegExp(`^shops/${a.shopId}/jobs/${jobId}/programs/[0-9a-f-]{36}\\.nc$`));
    expect(version.objectKey).not.toContain('shelf');
    const stored = await readObject(version.objectKey);
    expect(sha256(stored)).toBe(sha256(fixture));
    expect(version).toMatchObject({ version: 1, sha256: sha256(fixture), bytes: fixture.length, shopId: a.shopId });
  });

  it('writes the rows: program, version, history, the estimate request, and moves the job to programmed', async () => {
    const { db } = dbm;
    const [program] = await db.select().from(s.programs).where(eq(s.programs.id, programId));
    expect(program).toMatchObject({ shopId: a.shopId, jobId, name: FIXTURE_NAME, latestVersion: 1 });
    const [estimate] = await db.select().from(s.estimates).where(eq(s.estimates.id, firstEstimateId));
    expect(estimate).toMatchObject({ shopId: a.shopId, programId, programVersion: 1, machineId: a.machineId });
    // with the machine's own vacuum level (the demo's Router 1: 61 kPa, db/seed-data.ts), for the hold-down comparison
    expect(estimate.settings).toEqual({ sheet: { widthMm: 1220, lengthMm: 2440, thicknessMm: 18 }, zero: 'top', hold: 'vacuum', vacuumKpa: 70, machineVacuumKpa: 61 });
    const events = await db.select().from(s.jobEvents).where(eq(s.jobEvents.jobId, jobId));
    expect(events.map((e) => e.kind).sort()).toEqual(['program-uploaded', 'status']);
    expect(events.find((e) => e.kind === 'status')?.detail).toBe('draft>programmed');
    const [job] = await db.select().from(s.jobs).where(eq(s.jobs.id, jobId));
    expect(job.status).toBe('programmed');
  });

  it('streams the text back byte for byte', async () => {
    const response = await fetch(`${baseUrl}/api/programs/${programId}/versions/1/file`, { headers: { cookie: jars.lena.header() } });
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toBe('text/plain; charset=utf-8');
    expect(response.headers.get('etag')).toBe(`"${sha256(fixture)}"`);
    expect(response.headers.get('content-disposition')).toContain(`filename*=UTF-8''${FIXTURE_NAME}`);
    expect(Buffer.from(await response.arrayBuffer()).equals(fixture)).toBe(true);
    const again = await fetch(`${baseUrl}/api/programs/${programId}/versions/1/file`, {
      headers: { cookie: jars.lena.header(), 'if-none-match': `"${sha256(fixture)}"` },
    });
    expect(again.status).toBe(304);
  });

  it('the same name again is version 2 and, with identical text, reuses the stored estimate', async () => {
    const r = await upload(jars.priya, jobId, [{ name: FIXTURE_NAME, bytes: fixture }]);
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.programs[0]).toMatchObject({ id: programId, version: 2, sha256: sha256(fixture) });
    expect(r.body.programs[0].estimate?.id).toBe(firstEstimateId);
  });

  it('changed text under the same name is version 3 with an estimate of its own; older versions stay readable', async () => {
    const changed = Buffer.from(fixture.toString('utf8').replace('F6000', 'F5400'));
    const r = await upload(jars.priya, jobId, [{ name: FIXTURE_NAME.toUpperCase(), bytes: changed }]);
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    // MariaDB compares the names without case: the same program
    expect(r.body.programs[0]).toMatchObject({ id: programId, name: FIXTURE_NAME, version: 3, sha256: sha256(changed) });
    expect(r.body.programs[0].estimate).not.toBeNull();
    expect(r.body.programs[0].estimate?.id).not.toBe(firstEstimateId);

    const detail = await callApi<DetailAnswer>(jars.tomas, 'GET', `/api/programs/${programId}`);
    expect(detail.status).toBe(200);
    expect(detail.body.program.versions.map((v: { version: number }) => v.version)).toEqual([3, 2, 1]);
    const [v3, v2, v1] = detail.body.program.versions;
    expect(v1.estimates.map((e: { id: number }) => e.id)).toEqual([firstEstimateId]);
    expect(v2.estimates.map((e: { id: number }) => e.id)).toEqual([firstEstimateId]);
    expect(v3.estimates.map((e: { id: number }) => e.id)).toEqual([r.body.programs[0].estimate?.id]);
    for (const version of [1, 2]) {
      const file = await fetch(`${baseUrl}/api/programs/${programId}/versions/${version}/file`, { headers: { cookie: jars.tomas.header() } });
      expect(sha256(Buffer.from(await file.arrayBuffer()))).toBe(sha256(fixture));
    }
    const file3 = await fetch(`${baseUrl}/api/programs/${programId}/versions/3/file`, { headers: { cookie: jars.tomas.header() } });
    expect(sha256(Buffer.from(await file3.arrayBuffer()))).toBe(sha256(changed));

    const list = await callApi<ListAnswer>(jars.lena, 'GET', `/api/jobs/${jobId}/programs`);
    expect(list.status).toBe(200);
    expect(list.body.programs).toHaveLength(1);
    expect(list.body.programs[0]).toMatchObject({ id: programId, latestVersion: 3, latest: { version: 3, sha256: sha256(changed) } });
    expect(list.body.programs[0].latest.estimate?.id).toBe(r.body.programs[0].estimate?.id);
  });

  it('the same text in another job with the same settings is answered by the stored estimate, and listed with it', async () => {
    const otherJob = await createJob('Programs test: same brackets, second order');
    const r = await upload(jars.priya, otherJob, [{ name: 'brackets-again.nc', bytes: fixture }]);
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.programs[0].id).not.toBe(programId);
    expect(r.body.programs[0].estimate?.id).toBe(firstEstimateId);
    const list = await callApi<ListAnswer>(jars.priya, 'GET', `/api/jobs/${otherJob}/programs`);
    expect(list.body.programs[0].latest.estimate?.id).toBe(firstEstimateId);
    const detail = await callApi<DetailAnswer>(jars.priya, 'GET', `/api/programs/${r.body.programs[0].id}`);
    expect(detail.body.program.versions[0].estimates.map((e) => e.id)).toEqual([firstEstimateId]);
  });

  it('a version that does not exist answers 404', async () => {
    expect((await callApi(jars.priya, 'GET', `/api/programs/${programId}/versions/4/file`)).status).toBe(404);
    expect((await callApi(jars.priya, 'GET', `/api/programs/${programId}/versions/0/file`)).status).toBe(404);
    expect((await callApi(jars.priya, 'GET', `/api/programs/${programId}/versions/x/file`)).status).toBe(404);
  });
});

describe('several files in one request: all or nothing', () => {
  it('stores every file of a good request, in order', async () => {
    const jobId = await createJob('Programs test: two files');
    const r = await upload(jars.ada, jobId, [
      { name: 'sides.tap', bytes: 'G21\r\nG0 X1\r\nM30\r\n' },
      { name: 'letters.gcode', bytes: 'G21\rG0 X1\rG0 X2\rM30' },
    ]);
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.programs.map((p: { name: string; lines: number }) => [p.name, p.lines])).toEqual([
      ['sides.tap', 3],
      ['letters.gcode', 4],
    ]);
    const after = await snapshot(jobId);
    expect(after).toMatchObject({ programs: 2, versions: 2, status: 'programmed' });
    expect(after.objects).toHaveLength(2);
  });

  it('one binary file refuses the whole request: the good file before it is not kept either', async () => {
    const jobId = await createJob('Programs test: one bad of two');
    const before = await snapshot(jobId);
    const r = await upload(jars.priya, jobId, [
      { name: 'good.nc', bytes: 'G21 G90\nG0 X5\nM30\n' },
      { name: 'bad.nc', bytes: Buffer.from([0x47, 0x30, 0x00, 0x58, 0x31, 0x0a]) },
    ]);
    expect(r.status).toBe(422);
    expect(r.body.error.code).toBe('invalid:file');
    expect(r.body.error.message).toContain('"bad.nc"');
    expect(await snapshot(jobId)).toEqual(before);
  });

  it('a refused first file: the good files after it are read away, never stored', async () => {
    const jobId = await createJob('Programs test: bad first');
    const before = await snapshot(jobId);
    const r = await upload(jars.priya, jobId, [
      { name: 'empty.nc', bytes: '' },
      { name: 'good-1.nc', bytes: 'G21 G90\nG0 X5\nM30\n' },
      { name: 'good-2.nc', bytes: bigProgram(300 * 1024, 5) },
    ]);
    expect(r.status).toBe(422);
    expect(r.body.error.message).toBe('Cannot use program "empty.nc": The file is empty.');
    expect(await snapshot(jobId)).toEqual(before);
  });
});

describe('refused files leave no object and no row', () => {
  let jobId: number;
  let before: Awaited<ReturnType<typeof snapshot>>;

  beforeAll(async () => {
    jobId = await createJob('Programs test: refusals');
    before = await snapshot(jobId);
  });

  it.each([
    ['empty.nc', Buffer.alloc(0)],
    ['blank.nc', Buffer.from('\r\n   \n')],
    ['binary.nc', Buffer.concat([Buffer.from('G21\nG0 X1 '), Buffer.from([0, 1, 2, 3]), Buffer.from('\n')])],
    ['utf16.nc', Buffer.from('\ufeffG21\nG0 X1\n', 'utf16le')],
    ['latin1.nc', Buffer.from('(Fr\xe4sen)\nG0 X1\n', 'latin1')],
  ])('%s: 422 with the message the CLI gives for the same bytes', async (name, bytes) => {
    const r = await upload(jars.priya, jobId, [{ name, bytes }]);
    expect(r.status).toBe(422);
    expect(r.body.error.code).toBe('invalid:file');
    const cli = await cliRefusal(name, bytes);
    expect(r.body.error.message).toBe(`Cannot use program "${name}": ${cli}`);
    expect(await snapshot(jobId)).toEqual(before);
  });

  it('over PROGRAM_MAX_BYTES: 413 too-large:file, nothing stored (the start was already streaming to storage)', async () => {
    const big = bigProgram(MAX_BYTES + 64 * 1024, 1);
    const r = await upload(jars.priya, jobId, [{ name: 'too-big.nc', bytes: big }]);
    expect(r.status).toBe(413);
    expect(r.body.error.code).toBe('too-large:file');
    expect(r.body.error.message).toContain(MAX_BYTES.toLocaleString('en'));
    expect(await snapshot(jobId)).toEqual(before);
  });

  it.each([
    ['bracket.exe', /does not end in/],
    ['notes.pdf', /does not end in/],
    [`${'x'.repeat(198)}.nc`, /at most 200/],
  ])('%s: 422 for the name', async (name, message) => {
    const r = await upload(jars.priya, jobId, [{ name, bytes: 'G0 X1\n' }]);
    expect(r.status).toBe(422);
    expect(r.body.error.message).toMatch(message);
    expect(await snapshot(jobId)).toEqual(before);
  });

  it('a part not named "file", no file at all and a body that is not multipart: 422', async () => {
    const wrongField = await upload(jars.priya, jobId, [{ name: 'a.nc', bytes: 'G0 X1\n', field: 'program' }]);
    expect(wrongField.status).toBe(422);
    const none = await upload(jars.priya, jobId, []);
    expect(none.status).toBe(422);
    expect(none.body.error.code).toBe('invalid:body');
    const json = await callApi<ErrorAnswer>(jars.priya, 'POST', `/api/jobs/${jobId}/programs`, { file: 'G0 X1' });
    expect(json.status).toBe(422);
    expect(json.body.error.code).toBe('invalid:body');
    expect(await snapshot(jobId)).toEqual(before);
  });
});

/** Sends the head of a multipart body (declaring the full length), then destroys the socket. */
function abortedUpload(jar: CookieJar, jobId: number, file: Buffer, sendBytes: number): Promise<void> {
  const boundary = '----kerfcast-test-boundary-7d1f';
  const head = Buffer.from(`--${boundary}\r\ncontent-disposition: form-data; name="file"; filename="aborted.nc"\r\ncontent-type: application/octet-stream\r\n\r\n`);
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
  const url = new URL(`${baseUrl}/api/jobs/${jobId}/programs`);
  return new Promise((resolve) => {
    const req = http.request({
      host: url.hostname,
      port: url.port,
      path: url.pathname,
      method: 'POST',
      headers: { cookie: jar.header(), 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': head.length + file.length + tail.length },
    });
    req.on('error', () => resolve());
    req.on('close', () => resolve());
    req.write(head);
    let sent = 0;
    const step = 256 * 1024;
    const pump = () => {
      if (sent >= sendBytes) {
        // let the server take in what was sent, then break off mid-body
        setTimeout(() => req.destroy(), 500);
        return;
      }
      const piece = file.subarray(sent, Math.min(sent + step, sendBytes));
      sent += piece.length;
      if (req.write(piece)) setImmediate(pump);
      else req.once('drain', pump);
    };
    pump();
  });
}

describe('an upload aborted half-way leaves nothing', () => {
  it.each([
    ['a small file (one PutObject)', 200 * 1024],
    ['a large file (a multipart upload under way)', 7 * 1024 * 1024],
  ])('%s', async (_label, size) => {
    const jobId = await createJob(`Programs test: aborted ${size}`);
    const before = await snapshot(jobId);
    const file = bigProgram(size, 7);
    await abortedUpload(jars.priya, jobId, file, Math.floor(file.length * 0.8));
    // the server sees the end of the socket and cleans up; poll until it has settled
    await new Promise((r) => setTimeout(r, 2000));
    expect(await snapshot(jobId)).toEqual(before);
    // and the job takes the next upload as usual
    const r = await upload(jars.priya, jobId, [{ name: 'after-abort.nc', bytes: 'G21\nG0 X1\nM30\n' }]);
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.programs[0].version).toBe(1);
  });

  it('a large file goes up in parts and comes back with the same SHA-256', async () => {
    const jobId = await createJob('Programs test: multipart');
    const file = bigProgram(6 * 1024 * 1024, 3);
    const r = await upload(jars.priya, jobId, [{ name: 'raster.nc', bytes: file }]);
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.programs[0]).toMatchObject({ sha256: sha256(file), bytes: file.length, lines: linesOf(file.toString('utf8')) });
    const [version] = await dbm.db.select().from(s.programVersions).where(eq(s.programVersions.programId, r.body.programs[0].id));
    expect(sha256(await readObject(version.objectKey))).toBe(sha256(file));
  });
});

describe('shop scoping and roles', () => {
  let aJobId: number;
  let aProgramId: number;

  beforeAll(async () => {
    aJobId = await createJob('Programs test: scoping');
    const r = await upload(jars.priya, aJobId, [{ name: 'a-own.nc', bytes: 'G21\nG0 X1\nM30\n' }]);
    expect(r.status).toBe(201);
    aProgramId = r.body.programs[0].id;
  });

  it("another shop's job and program ids answer 404 on every route, as missing ones do", async () => {
    for (const [jar, jobId, programId] of [
      [jars.priya, b.jobId, b.programId],
      [jars.bo, aJobId, aProgramId],
      [jars.priya, 2_000_000_000, 2_000_000_000],
    ] as const) {
      expect((await callApi(jar, 'GET', `/api/jobs/${jobId}/programs`)).status).toBe(404);
      expect((await upload(jar, jobId, [{ name: 'x.nc', bytes: 'G0 X1\n' }])).status).toBe(404);
      expect((await callApi(jar, 'GET', `/api/programs/${programId}`)).status).toBe(404);
      const file = await callApi<ErrorAnswer>(jar, 'GET', `/api/programs/${programId}/versions/1/file`);
      expect(file.status).toBe(404);
      expect(file.body.error.code).toBe('not-found:program');
    }
    // nothing was written to either shop's job by the refused uploads
    expect((await snapshot(b.jobId)).programs).toBe(1);
    expect((await snapshot(aJobId)).programs).toBe(1);
  });

  it('operators and estimators may read but not upload (403); signed out is 401', async () => {
    for (const who of ['lena', 'tomas'] as const) {
      const r = await upload(jars[who], aJobId, [{ name: 'not-mine.nc', bytes: 'G0 X1\n' }]);
      expect(r.status, who).toBe(403);
      expect(r.body.error.code).toBe('forbidden:program');
      expect((await callApi(jars[who], 'GET', `/api/jobs/${aJobId}/programs`)).status).toBe(200);
      expect((await callApi(jars[who], 'GET', `/api/programs/${aProgramId}`)).status).toBe(200);
    }
    expect((await upload(null, aJobId, [{ name: 'anon.nc', bytes: 'G0 X1\n' }])).status).toBe(401);
    expect((await callApi(null, 'GET', `/api/jobs/${aJobId}/programs`)).status).toBe(401);
    expect((await callApi(null, 'GET', `/api/programs/${aProgramId}/versions/1/file`)).status).toBe(401);
    expect((await snapshot(aJobId)).programs).toBe(1);
  });
});
