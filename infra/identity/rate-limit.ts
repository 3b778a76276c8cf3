/**
 * Failed sign-in attempts, counted per key (a login, an address) in memory: after
 * `maxFailures` within `windowMs` the key is locked for `lockoutMs`, even for the right
 * password. One process serves the local provider, so memory is enough; a restart forgets.
 */
export class FailedAttemptLimiter {
  private readonly failures = new Map<string, number[]>();
  private readonly lockedUntil = new Map<string, number>();

  constructor(
    private readonly maxFailures: number,
    private readonly windowMs: number,
    private readonly lockoutMs: number,
    private readonly clock: () => number = Date.now,
  ) {}

  /** Milliseconds until the key may try again; 0 when it may now. */
  lockedFor(key: string): number {
    const until = this.lockedUntil.get(key) ?? 0;
    const left = until - this.clock();
    if (left <= 0 && until) this.lockedUntil.delete(key);
    return Math.max(0, left);
  }

  /** Counts a failure; returns the lock in ms it caused (0 when none). */
  recordFailure(key: string): number {
    const now = this.clock();
    const recent = (this.failures.get(key) ?? []).filter((t) => now - t < this.windowMs);
    recent.push(now);
    if (recent.length >= this.maxFailures) {
      this.failures.delete(key);
      this.lockedUntil.set(key, now + this.lockoutMs);
      return this.lockoutMs;
    }
    this.failures.set(key, recent);
    return 0;
  }

  /** Failures left before a lock. */
  remaining(key: string): number {
    const now = this.clock();
    const recent = (this.failures.get(key) ?? []).filter((t) => now - t < this.windowMs);
    return Math.max(0, this.maxFailures - recent.length);
  }

  /** A successful sign-in forgets the key's failures. */
  clear(key: string): void {
    this.failures.delete(key);
  }
}
