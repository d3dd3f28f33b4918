#!/usr/bin/env node
// `npm run serve:cluster -- N [--port FIRST] [--host HOST] [--app-url URL]`: serves the
// production build with N `next start` processes on N consecutive ports (3000, 3001, … by
// default), all against the same services: the one database (DATABASE_URL), the one bucket
// (S3_*), the one AUTH_SECRET (in local mode .data/auth-secret, read by every process).
// Each process runs its own estimate queue; they share the work through the estimates table.
// Needs a build (`npm run build`, or `npm start` once); without one it says so and stops.
// The services must be running (`bash scripts/services-start.sh`, as npm start does).
//
// Each process's output is printed with a prefix naming it (`[app 2 :3001]`). A process
// that ends on its own is reported and the others keep serving; the launcher ends when all
// have ended. Ctrl-C (SIGINT), SIGTERM or SIGHUP stop every process (SIGTERM, then SIGKILL
// for one still running after 10 s; a second signal kills at once) and the launcher exits 0.
//
// APP_URL and NEXTAUTH_URL: each process gets its own address, so sign-in and links work
// when a browser talks to one process directly. Behind a proxy that spreads requests over
// the processes, pass the proxy's public address with --app-url: every process then uses it.
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const STOP_GRACE_MS = 10_000;
const READY_TIMEOUT_MS = 90_000;

function usage(message) {
  if (message) console.error(`serve:cluster: ${message}`);
  console.error('usage: npm run serve:cluster -- N [--port FIRST_PORT] [--host HOST] [--app-url URL]   (N from 1 to 16; first port 3000)');
  process.exit(2);
}

function parseArgs(argv) {
  const options = { count: 2, port: 3000, host: '127.0.0.1', appUrl: null };
  const rest = [...argv];
  let countSeen = false;
  while (rest.length > 0) {
    const arg = rest.shift();
    const value = () => {
      const v = rest.shift();
      if (v === undefined) usage(`${arg} needs a value`);
      return v;
    };
    if (arg === '--port' || arg === '-p') options.port = Number(value());
    else if (arg === '--host' || arg === '-H') options.host = value();
    else if (arg === '--app-url') options.appUrl = value();
    else if (arg === '--help' || arg === '-h') usage();
    else if (/^\d+$/.test(arg) && !countSeen) {
      options.count = Number(arg);
      countSeen = true;
    } else usage(`unknown argument "${arg}"`);
  }
  if (!Number.isInteger(options.count) || options.count < 1 || options.count > 16) usage(`the number of processes must be 1 to 16, not ${options.count}`);
  if (!Number.isInteger(options.port) || options.port < 1 || options.port + options.count - 1 > 65535) usage(`--port must be a port number, not ${options.port}`);
  if (options.appUrl !== null) {
    try {
      new URL(options.appUrl);
    } catch {
      usage(`--app-url must be a URL, not "${options.appUrl}"`);
    }
  }
  return options;
}

/** true when something accepts connections on host:port */
function portTaken(host, port) {
  return new Promise((resolve) => {
    const socket = net.connect({ host, port });
    socket.setTimeout(1000);
    socket.once('connect', () => (socket.destroy(), resolve(true)));
    socket.once('timeout', () => (socket.destroy(), resolve(false)));
    socket.once('error', () => resolve(false));
  });
}

async function answers(url) {
  try {
    const response = await fetch(`${url}/api/auth/csrf`, { signal: AbortSignal.timeout(3000) });
    return response.ok;
  } catch {
    return false;
  }
}

/** Copies a stream to out line by line, each line prefixed. */
function prefixLines(stream, out, prefix) {
  let pending = '';
  stream.setEncoding('utf8');
  stream.on('data', (chunk) => {
    pending += chunk;
    let at;
    while ((at = pending.indexOf('\n')) !== -1) {
      out.write(`${prefix} ${pending.slice(0, at)}\n`);
      pending = pending.slice(at + 1);
    }
  });
  stream.on('end', () => {
    if (pending) out.write(`${prefix} ${pending}\n`);
    pending = '';
  });
}

async function main() {
  const options = parseArgs(process.argv.slice(2));
  const buildId = path.join(ROOT, '.next', 'BUILD_ID');
  const workerBundle = path.join(ROOT, '.next', 'kerfcast', 'estimate-worker.cjs');
  if (!existsSync(buildId)) {
    console.error('serve:cluster: no production build in .next (no .next/BUILD_ID). Build first: `npm run build` (next build and the estimate worker bundle), then run this again.');
    process.exit(1);
  }
  if (!existsSync(workerBundle)) {
    // one process would build it at start; N at once would race on the same file
    console.error('serve:cluster: the estimate worker bundle .next/kerfcast/estimate-worker.cjs is missing. Run `node scripts/build-estimate-worker.mjs` (or `npm run build`), then run this again.');
    process.exit(1);
  }
  const ports = Array.from({ length: options.count }, (_, i) => options.port + i);
  for (const port of ports) {
    if (await portTaken(options.host, port)) {
      console.error(`serve:cluster: port ${port} on ${options.host} is already in use. Stop what runs there or pick other ports with --port.`);
      process.exit(1);
    }
  }

  const baseEnv = {
    ...process.env,
    NODE_ENV: 'production',
    NEXT_TELEMETRY_DISABLED: '1',
    AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true',
    // served on loopback from this checkout, like npm start: local mode unless told otherwise
    KERFCAST_LOCAL: process.env.KERFCAST_LOCAL ?? '1',
  };
  let stopping = false;
  const nextBin = path.join(ROOT, 'node_modules', 'next', 'dist', 'bin', 'next');
  const children = ports.map((port, i) => {
    const own = `http://${options.host.includes(':') ? `[${options.host}]` : options.host}:${port}`;
    const appUrl = options.appUrl ?? own;
    const child = spawn(process.execPath, [nextBin, 'start', '-H', options.host, '-p', String(port)], {
      cwd: ROOT,
      env: { ...baseEnv, APP_URL: appUrl, NEXTAUTH_URL: appUrl },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    const label = `[app ${i + 1} :${port}]`;
    prefixLines(child.stdout, process.stdout, label);
    prefixLines(child.stderr, process.stderr, label);
    const entry = { child, port, label, url: own, ended: false };
    entry.exited = new Promise((resolve) => {
      child.once('exit', (code, signal) => {
        entry.ended = true;
        if (!stopping) {
          const still = children.filter((c) => !c.ended).length;
          console.log(`[serve:cluster] ${label} pid ${child.pid} ended (${signal ? `signal ${signal}` : `exit code ${code}`}); ${still} of ${children.length} still serving`);
          if (still === 0) process.exit(1);
        }
        resolve();
      });
    });
    console.log(`[serve:cluster] ${label} pid ${child.pid} starting on ${own}${options.appUrl ? ` (APP_URL ${appUrl})` : ''}`);
    return entry;
  });

  const stopAll = async (signal, exitCode = 0) => {
    if (stopping) {
      // a second signal: no more waiting
      for (const c of children) if (!c.ended) c.child.kill('SIGKILL');
      return;
    }
    stopping = true;
    console.log(`[serve:cluster] ${signal}: stopping ${children.filter((c) => !c.ended).length} process(es)`);
    for (const c of children) if (!c.ended) c.child.kill('SIGTERM');
    const timer = setTimeout(() => {
      for (const c of children) {
        if (!c.ended) {
          console.log(`[serve:cluster] ${c.label} pid ${c.child.pid} still running after ${STOP_GRACE_MS / 1000} s: SIGKILL`);
          c.child.kill('SIGKILL');
        }
      }
    }, STOP_GRACE_MS);
    await Promise.all(children.map((c) => c.exited));
    clearTimeout(timer);
    console.log('[serve:cluster] all processes stopped');
    process.exit(exitCode);
  };
  for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP']) process.on(signal, () => void stopAll(signal));

  const deadline = Date.now() + READY_TIMEOUT_MS;
  const pending = new Set(children);
  while (pending.size > 0 && !stopping) {
    for (const c of [...pending]) {
      if (c.ended) pending.delete(c);
      else if (await answers(c.url)) {
        pending.delete(c);
        console.log(`[serve:cluster] ${c.label} pid ${c.child.pid} answering on ${c.url}`);
      }
    }
    if (pending.size === 0) break;
    if (Date.now() > deadline) {
      console.error(`[serve:cluster] not answering after ${READY_TIMEOUT_MS / 1000} s: ${[...pending].map((c) => c.label).join(', ')}; stopping all`);
      await stopAll('timeout', 1);
      return;
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  if (!stopping) {
    const live = children.filter((c) => !c.ended);
    console.log(`[serve:cluster] ${live.length} of ${children.length} process(es) answering: ${live.map((c) => c.url).join(' ')}. Ctrl-C stops them all.`);
  }
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
