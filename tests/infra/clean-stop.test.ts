/**
 * `npm start` stops cleanly on SIGTERM, sent to its whole process group (as a terminal's Ctrl-C
 * or a service manager does) or to npm alone, and when npm dies outright: readiness answers 503 at once, the requests in
 * flight finish while PostgreSQL still answers them, then everything ends and nothing is left:
 * no server, no sign-in service, no PostgreSQL.
 *
 * The real start command on ports and folders of this file's own; the web build is skipped
 * (SKIP_WEB_BUILD) to keep the test short.
 */
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { afterAll, describe, expect, it, onTestFailed } from 'vitest';
import { PROJECT_ROOT } from '../../infra/local-cluster';
import { isRunning, stopCluster } from '../../infra/postgres';
import { holdRequest } from '../support/held-request';
import {
  freePorts,
  processExists,
  startProcess,
  waitUntil,
  type RunningProcess,
} from '../support/processes';

const dataDir = path.resolve(
  PROJECT_ROOT,
  `${process.env.PG_TEST_DATA_DIR || '.data/pg-test'}-stop`,
);
const identityDir = `${dataDir}-identity`;
const [appPort, idpPort, pgPort] = await freePorts(3);
const ports = { app: appPort!, idp: idpPort!, pg: pgPort! };
const baseUrl = `http://localhost:${ports.app}`;

/** The start command's environment: its own ports and folders, nothing of the test run's database. */
function startEnv(): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = { ...process.env };
  // the browser tests' global setup puts its own sign-in service's settings (IDP_ISSUER, …) into
  // the run's environment: none of them may reach this start command
  for (const name of Object.keys(env)) if (name.startsWith('IDP_')) delete env[name];
  for (const name of [
    'DATABASE_URL',
    'MIGRATION_DATABASE_URL',
    'OIDC_ISSUER',
    'APP_URL',
    'NODE_ENV',
    'PORT',
  ])
    delete env[name];
  return {
    ...env,
    PORT: String(ports.app),
    IDP_PORT: String(ports.idp),
    IDP_DATA_DIR: identityDir,
    IDP_BCRYPT_ROUNDS: '4',
    PG_PORT: String(ports.pg),
    PG_DATA_DIR: dataDir,
    SKIP_WEB_BUILD: 'true',
    WEB_DIST_DIR: `${dataDir}-web`,
    LOG_LEVEL: 'warn',
  };
}

/**
 * The held requests carry an unknown API token, so the server must ask PostgreSQL before it
 * can answer: 401 invalid-token proves PostgreSQL still answered, 503 that it was gone.
 */
const holdSiteRequest = () =>
  holdRequest(
    `${baseUrl}/api/sites`,
    { name: 'Held works', code: 'HW', address: '', timeZone: 'Europe/London' },
    { authorization: 'Bearer not-a-token' },
  );

function portAccepts(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect({ port, host: '127.0.0.1' });
    socket.once('connect', () => {
      socket.destroy();
      resolve(true);
    });
    socket.once('error', () => resolve(false));
  });
}

/** Pids of the processes in a process group (from /proc). */
function processGroupMembers(pgid: number): number[] {
  return fs
    .readdirSync('/proc')
    .filter((name) => /^\d+$/.test(name))
    .map(Number)
    .filter((pid) => {
      try {
        const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
        const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
        return fields[0] !== 'Z' && Number(fields[2]) === pgid;
      } catch {
        return false;
      }
    });
}

/** The pid of npm's child (the start orchestrator, a plain node process). */
function childOf(pid: number): number | undefined {
  const children = fs
    .readFileSync(`/proc/${pid}/task/${pid}/children`, 'utf8')
    .trim()
    .split(/\s+/)
    .filter(Boolean)
    .map(Number);
  return children[0];
}

let running: RunningProcess | undefined;
const started: number[] = [];

afterAll(() => {
  // only if a test failed half-way: end what it started, by pid
  for (const pid of started) if (processExists(pid)) process.kill(pid, 'SIGKILL');
  stopCluster({ dataDir });
  for (const dir of [dataDir, identityDir]) fs.rmSync(dir, { recursive: true, force: true });
}, 60_000);

describe('npm start, stopped by a signal', () => {
  it.each([
    [
      'SIGTERM goes to the whole process group',
      (npmPid: number) => process.kill(-npmPid, 'SIGTERM'),
    ],
    ['SIGTERM goes to npm alone', (npmPid: number) => process.kill(npmPid, 'SIGTERM')],
    // npm gone without passing anything on: the orchestrator notices that its parent is gone
    ['npm is killed outright (SIGKILL)', (npmPid: number) => process.kill(npmPid, 'SIGKILL')],
  ])(
    'when %s, then readiness turns 503, the requests in flight finish, and nothing is left running',
    async (_target, sendSigterm) => {
      running = startProcess('npm', ['start'], {
        cwd: PROJECT_ROOT,
        env: startEnv(),
        detached: true,
      });
      const npm = running;
      onTestFailed(() => {
        console.error(`npm start's output:\n${npm.output().slice(-6000)}`);
      });
      const npmPid = npm.child.pid!;
      started.push(npmPid);
      await Promise.race([
        waitUntil(async () => (await fetch(`${baseUrl}/api/health`)).status === 200, {
          timeoutMs: 150_000,
          what: 'npm start serving /api/health',
          intervalMs: 200,
        }),
        npm.exited.then((code) => {
          throw new Error(`npm start ended (${code}) before it served /api/health`);
        }),
      ]);
      const serverPid = childOf(npmPid)!;
      started.push(serverPid);
      const postmasterPid = Number(
        fs.readFileSync(path.join(dataDir, 'postmaster.pid'), 'utf8').split('\n')[0],
      );
      expect(processExists(serverPid) && processExists(postmasterPid)).toBe(true);

      const held = await Promise.all([holdSiteRequest(), holdSiteRequest(), holdSiteRequest()]);
      sendSigterm(npmPid);

      // readiness goes 503 while the held requests are still open
      const health = await waitUntil(
        async () => {
          const res = await fetch(`${baseUrl}/api/health`);
          return res.status === 503
            ? {
                body: (await res.json()) as { status: string },
                retryAfter: res.headers.get('retry-after'),
              }
            : false;
        },
        { timeoutMs: 30_000, what: 'readiness answering 503' },
      );
      expect(health.body.status).toBe('stopping');
      expect(health.retryAfter).toMatch(/^\d+$/);
      // new work is turned away with a clean 503 meanwhile
      const late = await fetch(`${baseUrl}/api/sites`);
      expect(late.status).toBe(503);
      expect(((await late.json()) as { error: { code: string } }).error.code).toBe('stopping');

      // the held requests finish, answered with PostgreSQL still up (401: the token is unknown)
      const answers = await Promise.all(held.map((h) => h.finish()));
      expect(answers).toEqual(Array(held.length).fill({ status: 401, code: 'invalid-token' }));

      // then everything ends: npm, the server with its sign-in service, PostgreSQL
      await waitUntil(() => !npm.alive(), { timeoutMs: 60_000, what: 'npm start ending' });
      await waitUntil(() => !processExists(serverPid) && !processExists(postmasterPid), {
        timeoutMs: 30_000,
        what: 'the server and PostgreSQL ending',
      });
      expect(processGroupMembers(npmPid)).toEqual([]);
      expect(isRunning({ dataDir })).toBe(false);
      expect(await portAccepts(ports.app)).toBe(false);
      expect(await portAccepts(ports.idp)).toBe(false);
      expect(await portAccepts(ports.pg)).toBe(false);
      expect(npm.output()).toContain('[ebbline] stopped');
    },
    240_000,
  );
});
