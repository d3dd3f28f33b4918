// Pid files for the local fakes: written once the server listens, removed on exit, so
// scripts/services-stop.sh ends exactly the node process that serves the port.
import fs from 'node:fs';
import path from 'node:path';

// KERFCAST_DATA_DIR (set by scripts/lib/common.sh) moves the state folder for a second set.
export const dataDir = process.env.KERFCAST_DATA_DIR
  ? path.resolve(process.env.KERFCAST_DATA_DIR)
  : path.resolve(__dirname, '..', '..', '.data');

export function writePidFile(name: string, onStop: () => Promise<void>): void {
  const file = path.join(dataDir, 'pids', `${name}.pid`);
  fs.mkdirSync(path.dirname(file), { recursive: true });
  fs.writeFileSync(file, `${process.pid}\n`);
  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`${name}: ${signal}, closing`);
    onStop()
      .catch((err: unknown) => console.error(`${name}: error while closing`, err))
      .finally(() => {
        // Only remove the file if it is still ours (a newer instance may have replaced it).
        try {
          if (fs.readFileSync(file, 'utf8').trim() === String(process.pid)) fs.unlinkSync(file);
        } catch {
          /* already gone */
        }
        process.exit(0);
      });
  };
  process.on('SIGTERM', () => stop('SIGTERM'));
  process.on('SIGINT', () => stop('SIGINT'));
}

export function portFromEnv(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const port = Number(raw);
  if (!Number.isInteger(port) || port < 1 || port > 65535) {
    console.error(`${name} must be a port number 1-65535, got "${raw}"`);
    process.exit(2);
  }
  return port;
}
