// Several app processes for one test, started the way a developer starts them: `node
// scripts/serve-cluster.mjs N --port FIRST` (npm run serve:cluster), against whatever
// DATABASE_URL and bucket the caller's environment names. Keeps each process's output apart
// (the launcher prefixes every line with `[app i :port]`) and learns each one's pid from
// the launcher's own lines, so a test can kill one process outright and read who logged
// what. Needs the production build (npm test makes it first).
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';

const ROOT = path.resolve(__dirname, '../../..');

export interface ClusterProcess {
  index: number;
  port: number;
  pid: number;
  url: string;
  /** everything this process printed so far (stdout and stderr, prefix removed) */
  log(): string;
}

export interface Cluster {
  launcherPid: number;
  processes: ClusterProcess[];
  /** everything the launcher printed so far, its children's prefixed lines included */
  output(): string;
  /** SIGTERM to the launcher, as Ctrl-C or a service manager would; its exit code and signal */
  stop(): Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
}

export function pidAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** Runs the launcher to its end (for refusals): exit code and output. */
export function runLauncher(args: string[], env: Record<string, string> = {}): Promise<{ code: number | null; output: string }> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, [path.join(ROOT, 'scripts/serve-cluster.mjs'), ...args], { cwd: ROOT, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
    let output = '';
    child.stdout.on('data', (d) => (output += d));
    child.stderr.on('data', (d) => (output += d));
    child.once('exit', (code) => resolve({ code, output }));
  });
}

export async function startCluster(count: number, firstPort: number, env: Record<string, string> = {}): Promise<Cluster> {
  const launcher: ChildProcess = spawn(process.execPath, [path.join(ROOT, 'scripts/serve-cluster.mjs'), String(count), '--port', String(firstPort)], {
    cwd: ROOT,
    env: { ...process.env, KERFCAST_LOCAL: '1', NEXT_TELEMETRY_DISABLED: '1', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  const take = (chunk: Buffer) => (output += chunk.toString('utf8'));
  launcher.stdout!.on('data', take);
  launcher.stderr!.on('data', take);
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    launcher.once('exit', (code, signal) => resolve({ code, signal })),
  );
  let ended: { code: number | null; signal: NodeJS.Signals | null } | null = null;
  void exited.then((e) => (ended = e));

  /** the lines one process printed, without the launcher's prefix */
  const linesOf = (port: number) => {
    const own = new RegExp(`^\\[app \\d+ :${port}\\] (.*)$`, 'gm');
    return [...output.matchAll(own)].map((m) => `${m[1]}\n`).join('');
  };

  const deadline = Date.now() + 120_000;
  const ready = new RegExp(`^\\[serve:cluster\\] \\[app (\\d+) :(\\d+)\\] pid (\\d+) answering on (\\S+)$`, 'gm');
  for (;;) {
    const found = [...output.matchAll(ready)];
    if (found.length === count) {
      const processes = found
        .map((m) => {
          const port = Number(m[2]);
          return { index: Number(m[1]), port, pid: Number(m[3]), url: m[4], log: () => linesOf(port) };
        })
        .sort((a, b) => a.index - b.index);
      return {
        launcherPid: launcher.pid!,
        processes,
        output: () => output,
        async stop() {
          if (ended) return ended;
          launcher.kill('SIGTERM');
          return exited;
        },
      };
    }
    if (ended) throw new Error(`serve-cluster ended before ${count} processes answered (${JSON.stringify(ended)}):\n${output.slice(-3000)}`);
    if (Date.now() > deadline) {
      launcher.kill('SIGTERM');
      throw new Error(`serve-cluster: not ${count} processes answering within 120 s:\n${output.slice(-3000)}`);
    }
    await new Promise((r) => setTimeout(r, 200));
  }
}
