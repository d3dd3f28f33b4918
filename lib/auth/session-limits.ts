// The idle and absolute session limits, in seconds, from SESSION_IDLE_MINUTES and
// SESSION_MAX_HOURS (ASVS 4.0.3 V3.3.1, V3.3.2; defaults 30 minutes and 12 hours).
import type { SessionLimits } from '@/db/queries/sessions';
import { env } from '@/lib/env';

export const sessionLimits: SessionLimits = {
  idleS: env.SESSION_IDLE_MINUTES * 60,
  maxS: env.SESSION_MAX_HOURS * 60 * 60,
};
