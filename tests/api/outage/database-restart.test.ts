/**
 * PostgreSQL stops under load and comes back: the server (a process of its own, as `npm start`
 * runs it) lives through it, answers 503 with Retry-After while the database is away, never
 * 500, and within 5 s of PostgreSQL accepting connections again the same signed-in session
 * works. Every write it acknowledged is in the database afterwards.
 *
 * The cluster is this file's own (PG_TEST_PORT + 1, a folder beside PG_TEST_DATA_DIR), durable
 * like the start command's, because the shared test cluster must not be stopped.
 */
import fs from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it, onTestFailed } from 'vitest';
import { prepareDatabase } from '../../../infra/database-roles';
import { PROJECT_ROOT, testDatabaseRoles } from '../../../infra/local-cluster';
import { isRunning, startCluster, stopCluster, type ClusterOptions } from '../../../infra/postgres';
import { DATABASE_UNAVAILABLE_MESSAGE } from '../../../shared/constants/availability';
import { freePort, startProcess, waitUntil, type RunningProcess } from '../../support/processes';

const cluster: ClusterOptions = {
  dataDir: path.resolve(PROJECT_ROOT, `${process.env.PG_TEST_DATA_DIR || '.data/pg-test'}-outage`),
  port: Number(process.env.PG_TEST_PORT || 54329) + 1,
  user: 'ebbline',
  password: 'ebbline-outage',
  durable: true,
};

// this file's app talks to its own cluster: set before anything reads the configuration
fs.rmSync(cluster.dataDir, { recursive: true, force: true });
stopCluster(cluster);
startCluster(cluster);
const urls = await prepareDatabase(cluster, testDatabaseRoles(), 'ebbline_outage');
const appPort = await freePort();
const baseUrl = `http://localhost:${appPort}`;
Object.assign(process.env, {
  DATABASE_URL: urls.databaseUrl,
  MIGRATION_DATABASE_URL: urls.migrationDatabaseUrl,
  PORT: String(appPort),
  APP_URL: baseUrl,
});
const { startTestIdentityProvider } = await import('../../support/identity');
const { signInOverHttp } = await import('../../support/oidc-flow');

/** One answer seen by the load: what was asked, when, and what came back (0: no answer). */
interface Answer {
  name: string;
  startedAt: number;
  /** When the test had the whole answer (set once answered). */
  finishedAt?: number;
  status: number;
  retryAfter: string | null;
  code?: string;
  message?: string;
  siteName?: string;
}

let server: RunningProcess | undefined;

beforeAll(async () => {
  // as npm start and npm test do it: the migrations load .ts files, which need tsx's loader
  const migration = startProcess(
    process.execPath,
    ['--import', 'tsx', 'api/src/db/migrate-cli.ts'],
    {
      cwd: PROJECT_ROOT,
      env: { ...process.env, LOG_LEVEL: 'warn' },
    },
  );
  if ((await migration.exited) !== 0) throw new Error(`migrating failed:\n${migration.output()}`);
  server = startProcess(process.execPath, ['--import', 'tsx', 'api/src/server.ts'], {
    cwd: PROJECT_ROOT,
    env: { ...process.env, NODE_ENV: 'test', LOG_LEVEL: 'warn', WEB_DIST_DIR: '' },
  });
  await waitUntil(
    async () => server!.alive() && (await fetch(`${baseUrl}/api/health`)).status === 200,
    {
      timeoutMs: 60_000,
      what: 'the server answering /api/health',
    },
  ).catch((err: Error) => {
    throw new Error(`${err.message}\n${server!.output()}`);
  });
  await startTestIdentityProvider();
}, 90_000);

afterAll(async () => {
  if (server?.alive()) {
    server.child.kill('SIGTERM');
    await server.exited;
  }
  stopCluster(cluster);
  fs.rmSync(cluster.dataDir, { recursive: true, force: true });
}, 60_000);

describe('when PostgreSQL stops and starts again under load', () => {
  it('then the server lives, answers 503 with Retry-After meanwhile, recovers the same session within 5 s and keeps every acknowledged write', async () => {
    onTestFailed(() => {
      console.error(`the server's output:\n${server!.output().slice(-6000)}`);
    });
    const session = await signInOverHttp(baseUrl, 'tomas', 'tidewater-plan');
    const headers = { cookie: session.cookie, origin: baseUrl };
    const writeHeaders = {
      ...headers,
      'content-type': 'application/json',
      'x-csrf-token': session.csrfToken,
    };
    let written = 0;
    const requests: Array<{
      name: string;
      send: () => { sent: Promise<Response>; siteName?: string };
    }> = [
      { name: 'GET /api/me', send: () => ({ sent: fetch(`${baseUrl}/api/me`, { headers }) }) },
      {
        name: 'GET /api/sites',
        send: () => ({ sent: fetch(`${baseUrl}/api/sites`, { headers }) }),
      },
      { name: 'GET /api/health', send: () => ({ sent: fetch(`${baseUrl}/api/health`) }) },
      {
        name: 'POST /api/sites',
        send: () => {
          written += 1;
          const siteName = `Outage works ${written}`;
          const body = {
            name: siteName,
            code: `W${written.toString(36).toUpperCase()}`,
            address: '',
            timeZone: 'Europe/London',
          };
          return {
            sent: fetch(`${baseUrl}/api/sites`, {
              method: 'POST',
              headers: writeHeaders,
              body: JSON.stringify(body),
            }),
            siteName,
          };
        },
      },
    ];

    const answers: Answer[] = [];
    let loadRunning = true;
    const worker = async (offset: number) => {
      for (let i = offset; loadRunning; i++) {
        const request = requests[i % requests.length]!;
        const startedAt = Date.now();
        const answer: Answer = { name: request.name, startedAt, status: 0, retryAfter: null };
        try {
          const { sent, siteName } = request.send();
          answer.siteName = siteName;
          const res = await sent;
          answer.status = res.status;
          answer.retryAfter = res.headers.get('retry-after');
          const body = (await res.json().catch(() => undefined)) as
            { error?: { code?: string; message?: string }; name?: string } | undefined;
          answer.code = body?.error?.code;
          answer.message = body?.error?.message;
        } catch (err) {
          answer.message = String(err);
        }
        answer.finishedAt = Date.now();
        answers.push(answer);
      }
    };
    const workers = [0, 1, 2, 3].map(worker);
    const answered = (after: number, check: (a: Answer) => boolean) =>
      answers.filter((a) => a.startedAt >= after && check(a));

    // some writes acknowledged before the stop
    await waitUntil(() => answered(0, (a) => a.status === 201).length >= 3, {
      timeoutMs: 20_000,
      what: 'writes before the stop',
    });

    stopCluster(cluster); // pg_ctl stop -m fast, with four requests in flight
    const downSince = Date.now();
    expect(isRunning(cluster)).toBe(false);
    // every kind of request is answered at least twice while the database is away
    await waitUntil(
      () => requests.every((r) => answered(downSince, (a) => a.name === r.name).length >= 2),
      { timeoutMs: 30_000, what: 'answers while PostgreSQL is stopped' },
    );
    const health = await fetch(`${baseUrl}/api/health`);
    expect(health.status).toBe(503);
    expect(health.headers.get('retry-after')).toMatch(/^\d+$/);
    expect(server!.alive()).toBe(true);

    const downUntil = Date.now();
    startCluster(cluster); // returns once PostgreSQL accepts connections
    const back = await waitUntil(
      async () => {
        const me = await fetch(`${baseUrl}/api/me`, { headers });
        return me.status === 200 ? Date.now() : false;
      },
      {
        timeoutMs: 5_000,
        what: 'the same session working again within 5 s of PostgreSQL accepting connections',
        intervalMs: 25,
      },
    );
    // keep the load on a little after recovery, then stop it
    await waitUntil(
      () => answered(back, (a) => a.name === 'POST /api/sites' && a.status === 201).length >= 2,
      {
        timeoutMs: 20_000,
        what: 'writes acknowledged after the restart',
      },
    );
    loadRunning = false;
    await Promise.all(workers);

    // sent and answered while PostgreSQL was stopped: on a busy machine a request sent just
    // before the restart may reach the server after it, and rightly be answered normally
    const during = answers.filter(
      (a) => a.startedAt >= downSince && a.finishedAt !== undefined && a.finishedAt < downUntil,
    );
    expect(during.length).toBeGreaterThan(0);
    for (const answer of during) {
      expect(
        answer,
        `${answer.name} while PostgreSQL was stopped (${answer.message}); server output:\n${server!.output().slice(-3000)}`,
      ).toMatchObject({ status: 503, retryAfter: expect.stringMatching(/^\d+$/) });
      if (answer.name !== 'GET /api/health') {
        expect(answer).toMatchObject({
          code: 'database-unavailable',
          message: DATABASE_UNAVAILABLE_MESSAGE,
        });
      }
    }
    // around the stop and the start: the normal answer or 503, never a 500 and never a cut connection
    const unexpected = answers.filter((a) => ![200, 201, 503].includes(a.status));
    expect(unexpected).toEqual([]);
    expect(server!.alive()).toBe(true);

    // every acknowledged write is in the database
    const acknowledged = answers.filter((a) => a.status === 201).map((a) => a.siteName!);
    expect(acknowledged.length).toBeGreaterThanOrEqual(5);
    const db = new pg.Client({ connectionString: urls.databaseUrl });
    await db.connect();
    try {
      const { rows } = await db.query<{ name: string }>(
        'SELECT name FROM sites WHERE name = ANY($1)',
        [acknowledged],
      );
      expect(rows.map((r) => r.name).sort()).toEqual([...acknowledged].sort());
    } finally {
      await db.end();
    }
  }, 180_000);
});
