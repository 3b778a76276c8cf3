/**
 * The local sign-in service counts failed attempts in PostgreSQL (identity_sign_in_failures,
 * migration 0013): a restart of the service neither forgets the failures nor lifts a lock.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { postgresStore, type ProviderStore } from '../../../infra/identity/stores';
import { startTestIdentityProvider } from '../../support/identity';
import { startSignIn, submitSignInForm } from '../../support/oidc-flow';

const app = createApp();
const databaseUrl = process.env.DATABASE_URL as string;
const limits = { maxFailures: 3, windowMs: 60_000, lockoutMs: 300_000 };
const opened: ProviderStore[] = [];

/** A new store, as a restarted sign-in service makes one: a new pool, nothing in memory. */
function restartedStore(): ProviderStore {
  const store = postgresStore(databaseUrl);
  opened.push(store);
  return store;
}

afterAll(async () => {
  await Promise.all(opened.map((s) => s.close()));
});

describe('failed attempts across a restart', () => {
  it('when failures were counted before a restart, then they still count after it and the lock holds through the next restart', async () => {
    const first = restartedStore().failedAttempts('login', limits);
    expect(await first.recordFailure('maren')).toBe(0);
    expect(await first.recordFailure('maren')).toBe(0);
    await opened.shift()!.close();

    const second = restartedStore().failedAttempts('login', limits);
    expect(await second.remaining('maren')).toBe(1);
    expect(await second.recordFailure('maren')).toBe(300_000);

    const third = restartedStore().failedAttempts('login', limits);
    const left = await third.lockedFor('maren');
    expect(left).toBeGreaterThan(290_000);
    expect(left).toBeLessThanOrEqual(300_000);
    // the other kind of key and other logins are counted apart
    expect(await restartedStore().failedAttempts('address', limits).lockedFor('maren')).toBe(0);
    expect(await third.lockedFor('tomas')).toBe(0);
  });

  it('when two failures arrive at once, then both are counted', async () => {
    const counter = restartedStore().failedAttempts('login', { ...limits, maxFailures: 10 });
    await Promise.all(Array.from({ length: 6 }, () => counter.recordFailure('ines')));
    expect(await counter.remaining('ines')).toBe(4);
  });

  it('when a sign-in succeeds, then the login’s failures are forgotten', async () => {
    const counter = restartedStore().failedAttempts('login', limits);
    await counter.recordFailure('lucia');
    await counter.recordFailure('lucia');
    await counter.clear('lucia');
    expect(await restartedStore().failedAttempts('login', limits).remaining('lucia')).toBe(3);
  });

  it('when the sign-in service restarts between wrong passwords, then the limit is reached anyway and the right password is paused too', async () => {
    await startTestIdentityProvider({ maxFailedAttempts: 3 });
    for (let i = 0; i < 2; i++) {
      const { authorizeUrl } = await startSignIn(app);
      expect((await submitSignInForm(authorizeUrl, 'rurik', 'not-his-password')).status).toBe(401);
    }
    // a restart: new store, new provider, new counters in memory
    await startTestIdentityProvider({ maxFailedAttempts: 3 });
    const third = await submitSignInForm((await startSignIn(app)).authorizeUrl, 'rurik', 'wrong-again');
    expect(third.status).toBe(429);
    expect(third.page).toContain('Too many failed attempts.');

    await startTestIdentityProvider({ maxFailedAttempts: 3 });
    const right = await submitSignInForm((await startSignIn(app)).authorizeUrl, 'rurik', 'tidewater-rel');
    expect(right.status).toBe(429);
  });
});
