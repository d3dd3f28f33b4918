// Sliding-window limiter of failed sign-ins, driven with explicit clock values.
import { describe, expect, it } from 'vitest';
import { signInLimits, SlidingWindowLimiter } from '@/lib/auth/rate-limit';

const MIN = 60_000;

describe('SlidingWindowLimiter', () => {
  it('blocks at the limit and frees the key as the oldest failure leaves the window', () => {
    const limiter = new SlidingWindowLimiter({ windowMs: 15 * MIN, maxFailures: 3 });
    limiter.recordFailure('k', 0);
    limiter.recordFailure('k', 5 * MIN);
    expect(limiter.isBlocked('k', 6 * MIN)).toBe(false);
    limiter.recordFailure('k', 10 * MIN);
    expect(limiter.isBlocked('k', 10 * MIN)).toBe(true);
    // the first failure (t=0) leaves the window at t=15 min; a fixed window would not slide
    expect(limiter.retryAfterS('k', 10 * MIN)).toBe(5 * 60);
    expect(limiter.isBlocked('k', 15 * MIN - 1)).toBe(true);
    expect(limiter.isBlocked('k', 15 * MIN)).toBe(false);
    expect(limiter.retryAfterS('k', 15 * MIN)).toBe(0);
  });

  it('keeps keys apart and forgets a key on reset', () => {
    const limiter = new SlidingWindowLimiter({ windowMs: MIN, maxFailures: 1 });
    limiter.recordFailure('a', 0);
    expect(limiter.isBlocked('a', 1)).toBe(true);
    expect(limiter.isBlocked('b', 1)).toBe(false);
    limiter.reset('a');
    expect(limiter.isBlocked('a', 2)).toBe(false);
  });

  it('allows fewer failures per e-mail than per address', () => {
    expect(signInLimits.perEmail.maxFailures).toBe(5);
    expect(signInLimits.perIp.maxFailures).toBeGreaterThan(signInLimits.perEmail.maxFailures);
  });
});
