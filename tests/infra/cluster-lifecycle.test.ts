import fs from 'node:fs';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { PROJECT_ROOT } from '../../infra/local-cluster';
import { ensureDatabase, isRunning, startCluster, stopCluster, type ClusterOptions } from '../../infra/postgres';

const cluster: ClusterOptions = {
  dataDir: path.join(PROJECT_ROOT, '.data', `pg-lifecycle-${process.pid}`),
  // next to the run's own test cluster, so two test runs on one machine never meet
  port: Number(process.env.PG_LIFECYCLE_PORT || Number(process.env.PG_TEST_PORT || 54329) + 70),
  user: 'ebbline',
  password: 'lifecycle',
  durable: false,
};

// initdb and pg_ctl take seconds on a quiet machine and much longer on a busy one; pg_ctl waits
// on the server's state itself (-w, up to 60 s), so these are ceilings, never measures.
const SLOW_STEP_MS = 180_000;

/** pg_ctl -w returns once the server answers or has gone; polling confirms it from outside. */
async function expectRunning(running: boolean): Promise<void> {
  await expect.poll(() => isRunning(cluster), { timeout: 60_000, interval: 200 }).toBe(running);
}

describe('the project-run PostgreSQL cluster', { timeout: SLOW_STEP_MS }, () => {
  afterAll(() => {
    stopCluster(cluster);
    fs.rmSync(cluster.dataDir, { recursive: true, force: true });
  }, SLOW_STEP_MS);

  it('when started the first time, then it creates the cluster and answers on loopback', async () => {
    startCluster(cluster);
    await expectRunning(true);
    await ensureDatabase(cluster, 'lifecycle');
    const conf = fs.readFileSync(path.join(cluster.dataDir, 'postmaster.opts'), 'utf8');
    expect(conf).toContain('listen_addresses=127.0.0.1');
  });

  it('when stopped and started again, then it reuses the same cluster', async () => {
    const version = fs.statSync(path.join(cluster.dataDir, 'PG_VERSION')).ino;
    stopCluster(cluster);
    await expectRunning(false);
    startCluster(cluster);
    await expectRunning(true);
    expect(fs.statSync(path.join(cluster.dataDir, 'PG_VERSION')).ino).toBe(version);
  });

  it('when a crash left a stale pid file, then a start still succeeds', async () => {
    stopCluster(cluster);
    await expectRunning(false);
    // the pid of this test process: alive, but not a postgres server
    fs.writeFileSync(path.join(cluster.dataDir, 'postmaster.pid'), `${process.pid}\n${cluster.dataDir}\n`);
    startCluster(cluster);
    await expectRunning(true);
    await ensureDatabase(cluster, 'lifecycle');
  });
});
