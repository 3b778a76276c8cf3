/**
 * Failed sign-in attempts, counted per key (a login, an address): after `maxFailures` within
 * `windowMs` the key is locked for `lockoutMs`, even for the right password. The local
 * provider keeps them in PostgreSQL (table identity_sign_in_failures, migration 0013), so a
 * restart forgets nothing; the in-memory counter is for the provider's unit tests.
 */
import type pg from 'pg';

export interface AttemptLimits {
  maxFailures: number;
  windowMs: number;
  lockoutMs: number;
}

/** The counter of one kind of key (logins, or addresses). */
export interface FailedAttemptCounter {
  /** Milliseconds until the key may try again; 0 when it may now. */
  lockedFor(key: string): Promise<number>;
  /** Counts a failure; returns the lock in ms it caused (0 when none). */
  recordFailure(key: string): Promise<number>;
  /** Failures left before a lock. */
  remaining(key: string): Promise<number>;
  /** A successful sign-in forgets the key's failures. */
  clear(key: string): Promise<void>;
}

/** Makes the counter of one kind of key; `scope` keeps kinds apart in one store. */
export type FailedAttemptStore = (scope: string, limits: AttemptLimits) => FailedAttemptCounter;

/** The counting rule itself, in memory (no I/O), with an injectable clock. */
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

/** Counters in this process's memory: lost at a restart, so only for tests. */
export function memoryFailedAttempts(clock: () => number = Date.now): FailedAttemptStore {
  return (_scope, { maxFailures, windowMs, lockoutMs }) => {
    const limiter = new FailedAttemptLimiter(maxFailures, windowMs, lockoutMs, clock);
    return {
      lockedFor: async (key) => limiter.lockedFor(key),
      recordFailure: async (key) => limiter.recordFailure(key),
      remaining: async (key) => limiter.remaining(key),
      clear: async (key) => limiter.clear(key),
    };
  };
}

/**
 * Counters in PostgreSQL (identity_sign_in_failures), the same rule as FailedAttemptLimiter:
 * each failure trims the key's list to the window and adds itself in one statement, so two
 * failures at once are both counted.
 */
export function postgresFailedAttempts(
  pool: pg.Pool,
  clock: () => number = Date.now,
): FailedAttemptStore {
  return (scope, { maxFailures, windowMs, lockoutMs }) => {
    const id = (key: string) => `${scope}:${key}`;
    const windowStart = () => new Date(clock() - windowMs);
    return {
      async lockedFor(key) {
        const { rows } = await pool.query<{ locked_until: Date | null }>(
          'SELECT locked_until FROM identity_sign_in_failures WHERE key = $1',
          [id(key)],
        );
        const until = rows[0]?.locked_until?.getTime() ?? 0;
        return Math.max(0, until - clock());
      },
      async recordFailure(key) {
        const now = new Date(clock());
        const { rows } = await pool.query<{ n: number }>(
          `INSERT INTO identity_sign_in_failures AS f (key, failed_at, updated_at) VALUES ($1, ARRAY[$2::timestamptz], $2)
           ON CONFLICT (key) DO UPDATE SET
             failed_at = ARRAY(SELECT t FROM unnest(f.failed_at) AS t WHERE t > $3) || $2::timestamptz,
             updated_at = $2
           RETURNING cardinality(failed_at) AS n`,
          [id(key), now, windowStart()],
        );
        if ((rows[0]?.n ?? 0) < maxFailures) return 0;
        await pool.query(
          `UPDATE identity_sign_in_failures SET failed_at = '{}', locked_until = $2, updated_at = $3 WHERE key = $1`,
          [id(key), new Date(now.getTime() + lockoutMs), now],
        );
        return lockoutMs;
      },
      async remaining(key) {
        const { rows } = await pool.query<{ n: number }>(
          `SELECT cardinality(ARRAY(SELECT t FROM unnest(failed_at) AS t WHERE t > $2)) AS n
             FROM identity_sign_in_failures WHERE key = $1`,
          [id(key), windowStart()],
        );
        return Math.max(0, maxFailures - (rows[0]?.n ?? 0));
      },
      async clear(key) {
        await pool.query(
          `UPDATE identity_sign_in_failures SET failed_at = '{}', updated_at = $2 WHERE key = $1`,
          [id(key), new Date(clock())],
        );
      },
    };
  };
}

/** Deletes counters with neither a lock nor a failure left to count (older than `olderThanMs`). */
export async function sweepFailedAttempts(pool: pg.Pool, olderThanMs: number): Promise<void> {
  await pool.query(
    `DELETE FROM identity_sign_in_failures
      WHERE updated_at < now() - make_interval(secs => $1::double precision / 1000)
        AND (locked_until IS NULL OR locked_until < now())`,
    [olderThanMs],
  );
}
