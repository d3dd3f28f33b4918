// Sliding-window counter of failed sign-ins, kept in this process's memory. That is
// enough for Kerfcast's one `next start` process per shop server; with several
// processes or hosts behind a balancer each would count on its own, and the counts
// would have to move to a shared store (a MariaDB table or Redis).
export interface SlidingWindowOptions {
  windowMs: number;
  maxFailures: number;
}

export class SlidingWindowLimiter {
  private readonly failures = new Map<string, number[]>();

  constructor(private readonly options: SlidingWindowOptions) {}

  private recent(key: string, nowMs: number): number[] {
    const since = nowMs - this.options.windowMs;
    const kept = (this.failures.get(key) ?? []).filter((t) => t > since);
    if (kept.length === 0) this.failures.delete(key);
    else this.failures.set(key, kept);
    return kept;
  }

  /** true while the key has used up its failures in the current window */
  isBlocked(key: string, nowMs = Date.now()): boolean {
    return this.recent(key, nowMs).length >= this.options.maxFailures;
  }

  recordFailure(key: string, nowMs = Date.now()): void {
    const kept = this.recent(key, nowMs);
    kept.push(nowMs);
    this.failures.set(key, kept);
    // Bound memory under a spray of made-up e-mails: forget the oldest keys.
    if (this.failures.size > 50_000) {
      const oldest = this.failures.keys().next().value;
      if (oldest !== undefined) this.failures.delete(oldest);
    }
  }

  reset(key: string): void {
    this.failures.delete(key);
  }

  /** seconds until the oldest failure in the window expires (0 when not blocked) */
  retryAfterS(key: string, nowMs = Date.now()): number {
    const kept = this.recent(key, nowMs);
    if (kept.length < this.options.maxFailures) return 0;
    return Math.ceil((kept[0] + this.options.windowMs - nowMs) / 1000);
  }
}

// Per e-mail: 5 failures in 15 minutes (a common practice for password forms; OWASP's
// authentication cheat sheet recommends a lockout threshold without fixing a number).
// Per IP: more, because a workshop often shares one address behind its router.
export const signInLimits = {
  perEmail: { windowMs: 15 * 60_000, maxFailures: 5 },
  perIp: { windowMs: 15 * 60_000, maxFailures: 50 },
} as const;

const globalForLimits = globalThis as unknown as {
  kerfcastSignInLimiters?: { email: SlidingWindowLimiter; ip: SlidingWindowLimiter };
};

export const signInLimiters = (globalForLimits.kerfcastSignInLimiters ??= {
  email: new SlidingWindowLimiter(signInLimits.perEmail),
  ip: new SlidingWindowLimiter(signInLimits.perIp),
});
