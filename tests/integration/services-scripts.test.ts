// The service scripts themselves: scripts/services-start.sh run again while the services
// are up returns at once and changes nothing (no daemon keeps the start lock), ports and
// the state folder come from the environment, and scripts/services-stop.sh ends only the
// processes its pid files name. The shared services (.data/) are only started again,
// never stopped; stopping is tried on a second set of the two fakes in a scratch folder
// on free ports (KERFCAST_DATA_DIR, KERFCAST_SERVICES, KERFCAST_*_PORT).
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const ROOT = path.resolve(__dirname, '../..');
const SHARED_PIDS = path.join(ROOT, '.data', 'pids');
// The start script waits up to 120 s for the lock; a run that needs a tenth of that has
// waited for it (a healthy second run takes well under a second, a first one ~5 s).
const PROMPT_MS = 30_000;
const SERVICE_ENV_KEYS = ['KERFCAST_DATA_DIR', 'KERFCAST_SERVICES', 'KERFCAST_S3_PORT', 'KERFCAST_SMTP_PORT', 'KERFCAST_MAIL_HTTP_PORT'];

interface Run { code: number | null; output: string; elapsedMs: number }

/** Runs a script; resolves when it exits (not when every pipe closes, so a daemon that
 * kept our stdout cannot hang the test) or is killed at PROMPT_MS. */
function runScript(script: string, env: Record<string, string>, inheritedFd?: number): Promise<Run> {
  const started = Date.now();
  const base = Object.fromEntries(Object.entries(process.env).filter(([k]) => !SERVICE_ENV_KEYS.includes(k))) as NodeJS.ProcessEnv;
  // inheritedFd: an open file the script gets as fd 3, as a caller's `flock FILE cmd` passes its lock
  const stdio: ('ignore' | 'pipe' | number)[] = inheritedFd === undefined ? ['ignore', 'pipe', 'pipe'] : ['ignore', 'pipe', 'pipe', inheritedFd];
  const child = spawn('bash', [path.join(ROOT, 'scripts', script)], { cwd: ROOT, env: { ...base, ...env }, stdio });
  let output = '';
  child.stdout?.on('data', (d: Buffer) => (output += d.toString()));
  child.stderr?.on('data', (d: Buffer) => (output += d.toString()));
  const timer = setTimeout(() => child.kill('SIGKILL'), PROMPT_MS);
  return new Promise((resolve) => {
    child.on('exit', (code) => {
      clearTimeout(timer);
      setTimeout(() => resolve({ code, output, elapsedMs: Date.now() - started }), 50);
    });
  });
}

function readPids(dir: string): Record<string, number> {
  const pids: Record<string, number> = {};
  for (const file of fs.existsSync(dir) ? fs.readdirSync(dir) : []) {
    if (file.endsWith('.pid')) pids[file.replace(/\.pid$/, '')] = Number(fs.readFileSync(path.join(dir, file), 'utf8').trim());
  }
  return pids;
}

/** Alive and not a zombie, per /proc/<pid>/stat (proc(5): field 3 is the state). */
function alive(pid: number): boolean {
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    return stat.slice(stat.lastIndexOf(')') + 2)[0] !== 'Z';
  } catch {
    return false;
  }
}

function cmdline(pid: number): string {
  return fs.readFileSync(`/proc/${pid}/cmdline`, 'utf8').replace(/\0/g, ' ');
}

/** Files a process has open on the start lock (flock(2): the lock belongs to the open
 * file description and is shared by every process that inherited the descriptor). */
function lockFds(pid: number, lockFile: string): string[] {
  const dir = `/proc/${pid}/fd`;
  return fs.readdirSync(dir).filter((fd) => {
    try {
      return fs.readlinkSync(path.join(dir, fd)) === lockFile;
    } catch {
      return false;
    }
  });
}

async function freePort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as net.AddressInfo;
  await new Promise((resolve) => server.close(resolve));
  return port;
}

function portAnswers(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect(port, '127.0.0.1');
    socket.once('connect', () => (socket.destroy(), resolve(true)));
    socket.once('error', () => resolve(false));
  });
}

/** The first line an SMTP server sends: RFC 5321 §4.2, a "220" greeting. */
function smtpGreeting(port: number): Promise<string> {
  return new Promise((resolve, reject) => {
    const socket = net.connect(port, '127.0.0.1');
    socket.setTimeout(5000, () => (socket.destroy(), reject(new Error('no SMTP greeting within 5 s'))));
    socket.once('data', (d: Buffer) => (socket.end('QUIT\r\n'), resolve(d.toString())));
    socket.once('error', reject);
  });
}

describe('services-start.sh against the running shared services', () => {
  it('returns promptly with exit 0 twice in a row and leaves the same pids', { timeout: 2 * PROMPT_MS + 5000 }, async () => {
    const before = readPids(SHARED_PIDS);
    expect(Object.keys(before).sort(), 'the shared services must be up (npm test starts them)').toEqual(['mariadb', 's3-fake', 'smtp-fake']);
    for (let i = 0; i < 2; i++) {
      const run = await runScript('services-start.sh', {});
      expect(run.code, run.output).toBe(0);
      expect(run.elapsedMs).toBeLessThan(PROMPT_MS);
      expect(run.output).not.toMatch(/starting/);
      expect(readPids(SHARED_PIDS)).toEqual(before);
    }
    const lockFile = path.join(ROOT, '.data', 'services.lock');
    for (const [name, pid] of Object.entries(before)) {
      expect(alive(pid), name).toBe(true);
      expect(lockFds(pid, lockFile), `${name} (pid ${pid}) holds ${lockFile} open`).toEqual([]);
    }
  });
});

describe('a second set of the fakes in a scratch folder, ports from the environment', () => {
  let scratch: string;
  let env: Record<string, string>;
  let ports: { s3: number; smtp: number; mailHttp: number };
  let bystander: ChildProcess;
  let sharedBefore: Record<string, number>;

  beforeAll(async () => {
    scratch = fs.mkdtempSync(path.join(os.tmpdir(), 'kerfcast-services-'));
    ports = { s3: await freePort(), smtp: await freePort(), mailHttp: await freePort() };
    env = {
      KERFCAST_DATA_DIR: scratch,
      KERFCAST_SERVICES: 's3-fake smtp-fake',
      KERFCAST_S3_PORT: String(ports.s3),
      KERFCAST_SMTP_PORT: String(ports.smtp),
      KERFCAST_MAIL_HTTP_PORT: String(ports.mailHttp),
    };
    // An unrelated process, and a pid file left naming it (as after a reboot reuses a pid).
    bystander = spawn('sleep', ['300'], { stdio: 'ignore' });
    fs.mkdirSync(path.join(scratch, 'pids'), { recursive: true });
    fs.writeFileSync(path.join(scratch, 'pids', 's3-fake.pid'), `${bystander.pid}\n`);
    sharedBefore = readPids(SHARED_PIDS);
  });

  afterAll(async () => {
    if (scratch) {
      await runScript('services-stop.sh', env);
      fs.rmSync(scratch, { recursive: true, force: true });
    }
    bystander?.kill('SIGKILL');
  });

  it('starts both fakes on the given ports with their state in the given folder', { timeout: PROMPT_MS + 10_000 }, async () => {
    // started the way `flock FILE npm test` starts it: with the caller's lock open as fd 3
    const callerLock = path.join(scratch, 'caller.lock');
    const callerFd = fs.openSync(callerLock, 'w');
    const run = await runScript('services-start.sh', env, callerFd);
    fs.closeSync(callerFd);
    expect(run.code, run.output).toBe(0);
    expect(run.elapsedMs).toBeLessThan(PROMPT_MS);

    const pids = readPids(path.join(scratch, 'pids'));
    expect(Object.keys(pids).sort()).toEqual(['s3-fake', 'smtp-fake']);
    // no daemon keeps the caller's descriptor, so the caller's lock ends with the caller
    for (const pid of Object.values(pids)) expect(lockFds(pid, callerLock)).toEqual([]);
    expect(pids['s3-fake']).not.toBe(bystander.pid); // the stale file was replaced, not trusted
    expect(cmdline(pids['s3-fake'])).toContain('scripts/s3-fake.ts');
    expect(cmdline(pids['smtp-fake'])).toContain('scripts/smtp-fake.ts');
    expect(alive(bystander.pid!)).toBe(true);

    // S3 API reference, ListBuckets: GET / answers a ListAllMyBucketsResult document.
    const buckets = await fetch(`http://127.0.0.1:${ports.s3}/`);
    expect(buckets.status).toBe(200);
    expect(await buckets.text()).toMatch(/<ListAllMyBucketsResult[\s\S]*<Name>kerfcast-programs<\/Name>/);
    expect(fs.existsSync(path.join(scratch, 's3', 'kerfcast-programs'))).toBe(true);

    expect(await smtpGreeting(ports.smtp)).toMatch(/^220 /);
    const mail = await fetch(`http://127.0.0.1:${ports.mailHttp}/messages`);
    expect(mail.status).toBe(200);
    expect(await mail.json()).toEqual([]); // a fresh folder: none of the shared capture's mail
    expect(fs.existsSync(path.join(scratch, 'logs', 's3-fake.log'))).toBe(true);
    expect(readPids(SHARED_PIDS)).toEqual(sharedBefore);
  });

  it('a second start returns promptly and keeps the same pids; no fake holds the lock', { timeout: PROMPT_MS + 5000 }, async () => {
    const pids = readPids(path.join(scratch, 'pids'));
    const run = await runScript('services-start.sh', env);
    expect(run.code, run.output).toBe(0);
    expect(run.elapsedMs).toBeLessThan(PROMPT_MS);
    expect(readPids(path.join(scratch, 'pids'))).toEqual(pids);
    for (const pid of Object.values(pids)) expect(lockFds(pid, path.join(scratch, 'services.lock'))).toEqual([]);
  });

  it('stop ends exactly the fakes it started; the bystander and the shared services live on', { timeout: PROMPT_MS + 5000 }, async () => {
    const pids = readPids(path.join(scratch, 'pids'));
    const run = await runScript('services-stop.sh', env);
    expect(run.code, run.output).toBe(0);
    for (const pid of Object.values(pids)) expect(alive(pid)).toBe(false);
    expect(readPids(path.join(scratch, 'pids'))).toEqual({});
    expect(await portAnswers(ports.s3)).toBe(false);
    expect(await portAnswers(ports.smtp)).toBe(false);
    expect(alive(bystander.pid!)).toBe(true);
    expect(readPids(SHARED_PIDS)).toEqual(sharedBefore);
    for (const pid of Object.values(sharedBefore)) expect(alive(pid)).toBe(true);
  });

  it('stop leaves alone a process whose pid a stale pid file names', async () => {
    const file = path.join(scratch, 'pids', 'smtp-fake.pid');
    fs.writeFileSync(file, `${bystander.pid}\n`);
    const run = await runScript('services-stop.sh', env);
    expect(run.code, run.output).toBe(0);
    expect(run.output).toContain('smtp-fake: stale pid file removed');
    expect(fs.existsSync(file)).toBe(false);
    expect(alive(bystander.pid!)).toBe(true);
  });
});

describe('ports and service names from the environment that cannot be used', () => {
  let scratch: string;
  let listener: net.Server;
  let taken: number;

  beforeAll(async () => {
    scratch = fs.mkdtempSync(path.join(os.tmpdir(), 'kerfcast-services-taken-'));
    // another program already listening on the port the environment names
    listener = net.createServer((socket) => socket.destroy());
    await new Promise<void>((resolve) => listener.listen(0, '127.0.0.1', () => resolve()));
    taken = (listener.address() as net.AddressInfo).port;
  });

  afterAll(async () => {
    if (scratch) {
      await runScript('services-stop.sh', { KERFCAST_DATA_DIR: scratch, KERFCAST_SERVICES: 's3-fake' });
      fs.rmSync(scratch, { recursive: true, force: true });
    }
    await new Promise((resolve) => listener?.close(resolve));
  });

  it('a port taken by another process: start refuses, names the port and the variable, starts nothing', { timeout: PROMPT_MS + 5000 }, async () => {
    const run = await runScript('services-start.sh', { KERFCAST_DATA_DIR: scratch, KERFCAST_SERVICES: 's3-fake', KERFCAST_S3_PORT: String(taken) });
    expect(run.code).not.toBe(0);
    expect(run.output).toContain(`port ${taken} (for s3-fake) is taken`);
    expect(run.output).toContain('KERFCAST_*_PORT');
    expect(readPids(path.join(scratch, 'pids'))).toEqual({});
    expect(await portAnswers(taken)).toBe(true); // the other program still has its port
  });

  it('an unknown service name is refused with exit 2, naming it and the known ones', async () => {
    const run = await runScript('services-start.sh', { KERFCAST_DATA_DIR: scratch, KERFCAST_SERVICES: 's3-fake mailqueue' });
    expect(run.code).toBe(2);
    expect(run.output).toContain('KERFCAST_SERVICES names "mailqueue"; known: mariadb s3-fake smtp-fake');
    const stop = await runScript('services-stop.sh', { KERFCAST_DATA_DIR: scratch, KERFCAST_SERVICES: 'mailqueue' });
    expect(stop.code).toBe(2);
  });
});
