import 'server-only';
// A timer per server process that deletes ended sign-in windows and dead sessions, so
// neither table grows without bound. Unref'd: it never keeps a process alive. Several
// processes may each run it; the deletes are idempotent.
import { purgeDeadSessions } from '@/db/queries/sessions';
import { purgeExpiredLimits } from '@/db/queries/sign-in-limits';
import { sessionLimits } from './session-limits';

const EVERY_MS = 10 * 60_000;
const globalForTimer = globalThis as unknown as { kerfcastAuthHousekeeping?: NodeJS.Timeout };

export function startAuthHousekeeping(): void {
  if (globalForTimer.kerfcastAuthHousekeeping) return;
  const timer = setInterval(() => {
    Promise.all([purgeExpiredLimits(), purgeDeadSessions(sessionLimits)]).catch((error: unknown) => {
      console.error('[kerfcast] auth housekeeping failed', { code: (error as { code?: string })?.code ?? 'unknown' });
    });
  }, EVERY_MS);
  timer.unref();
  globalForTimer.kerfcastAuthHousekeeping = timer;
}
