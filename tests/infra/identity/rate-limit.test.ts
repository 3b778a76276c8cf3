import { describe, expect, it } from 'vitest';
import { FailedAttemptLimiter } from '../../../infra/identity/rate-limit';

function limiter() {
  let now = 1_000_000;
  const l = new FailedAttemptLimiter(3, 60_000, 300_000, () => now);
  return { l, tick: (ms: number) => (now += ms) };
}

describe('FailedAttemptLimiter', () => {
  it('when failures stay under the limit, then the key is not locked', () => {
    const { l } = limiter();
    expect(l.recordFailure('maren')).toBe(0);
    expect(l.recordFailure('maren')).toBe(0);
    expect(l.lockedFor('maren')).toBe(0);
    expect(l.remaining('maren')).toBe(1);
  });

  it('when the limit is reached within the window, then the key is locked for the lockout', () => {
    const { l, tick } = limiter();
    l.recordFailure('maren');
    l.recordFailure('maren');
    expect(l.recordFailure('maren')).toBe(300_000);
    expect(l.lockedFor('maren')).toBe(300_000);
    tick(299_000);
    expect(l.lockedFor('maren')).toBe(1_000);
    tick(1_000);
    expect(l.lockedFor('maren')).toBe(0);
  });

  it('when failures are further apart than the window, then they do not add up', () => {
    const { l, tick } = limiter();
    l.recordFailure('maren');
    l.recordFailure('maren');
    tick(61_000);
    expect(l.recordFailure('maren')).toBe(0);
  });

  it('when one key is locked, then another is not', () => {
    const { l } = limiter();
    for (let i = 0; i < 3; i++) l.recordFailure('maren');
    expect(l.lockedFor('tomas')).toBe(0);
  });

  it('when a sign-in succeeds, then earlier failures are forgotten', () => {
    const { l } = limiter();
    l.recordFailure('maren');
    l.recordFailure('maren');
    l.clear('maren');
    expect(l.remaining('maren')).toBe(3);
  });
});
