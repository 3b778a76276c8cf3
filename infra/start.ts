/**
 * `npm start`: builds the web app, starts Ebbline's own PostgreSQL, migrates, seeds the demo
 * scenario and serves the product at one address. Ctrl-C, or SIGTERM to npm or to the whole
 * process group, stops everything it started, letting requests in flight finish.
 *
 * Runs as a plain `node --import tsx` process (no tsx launcher in between, which was seen to
 * end the server mid-request on a group SIGTERM). SKIP_WEB_BUILD=true serves what WEB_DIST_DIR
 * already holds (tests of the start command).
 */
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { build } from 'vite';
import { prepareDatabase } from './database-roles';
import { appClusterOptions, appDatabaseRoles, loadEnvFile, PROJECT_ROOT } from './local-cluster';
import { startCluster, stopCluster } from './postgres';
import { localIssuer, usesLocalProvider } from './identity/settings';

const t0 = performance.now();
const note = (message: string) =>
  process.stdout.write(
    `[ebbline] ${message} (${((performance.now() - t0) / 1000).toFixed(1)} s)\n`,
  );
/** Notes a finished step; a stop that began meanwhile ends the start here (nothing more starts). */
const step = (message: string) => {
  if (stopping) throw new Error('stopped while starting');
  note(message);
};

loadEnvFile();
process.chdir(PROJECT_ROOT);
const cluster = appClusterOptions();
// the local identity provider stands in for the company's unless OIDC_ISSUER names another;
// the app must know its issuer before it first reads its configuration
const localProvider = usesLocalProvider();
if (!process.env.OIDC_ISSUER) process.env.OIDC_ISSUER = localIssuer();
// the server serves the web app from WEB_DIST_DIR, so it is built there
const webDistDir = process.env.WEB_DIST_DIR || 'dist/web';
const flagSet = (value: string | undefined) => ['1', 'true', 'yes'].includes(value ?? '');

const stops: Array<() => Promise<void> | void> = [];
let stopping: Promise<never> | undefined;
/**
 * Stops what was started, newest first: the server (readiness 503 at once, requests in flight
 * finish), then the sign-in service, then PostgreSQL. Runs once: Ctrl-C or a SIGTERM to the
 * process group reaches this process twice (directly, and passed on by npm), and a second
 * signal must not cut the first stop short.
 */
function stopAll(code: number, why: string): Promise<never> {
  if (stopping) {
    process.stdout.write(`[ebbline] ${why}: already stopping\n`);
    return stopping;
  }
  stopping = (async () => {
    process.stdout.write(`\n[ebbline] stopping (${why})…\n`);
    for (const stop of stops.reverse()) {
      try {
        await stop();
      } catch (err) {
        console.error('[ebbline] while stopping:', err);
      }
    }
    note('stopped');
    process.exit(code);
  })();
  return stopping;
}
for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) {
  process.on(signal, () => void stopAll(0, signal));
}
// A parent that ends without passing a signal on (a shell between npm and this process, npm
// killed outright) would leave this process and PostgreSQL running: stop with it.
const parentPid = process.ppid;
setInterval(() => {
  if (process.ppid !== parentPid) void stopAll(0, 'the parent process ended');
}, 500).unref();

try {
  if (flagSet(process.env.SKIP_WEB_BUILD)) {
    step(`serving the web app already built in ${webDistDir}`);
  } else {
    await build({
      configFile: 'vite.config.ts',
      logLevel: 'warn',
      mode: 'production',
      build: { outDir: path.resolve(webDistDir) },
    });
    step(`built the web app into ${webDistDir}`);
  }

  startCluster(cluster);
  stops.push(() => stopCluster(cluster));
  // two roles: migrations as the owner, the app as a role that cannot rewrite the audit trail
  // (a cluster of the one-role days is upgraded here, in place)
  const urls = await prepareDatabase(cluster, appDatabaseRoles(), cluster.database);
  if (!process.env.DATABASE_URL) {
    process.env.DATABASE_URL = urls.databaseUrl;
    process.env.MIGRATION_DATABASE_URL ??= urls.migrationDatabaseUrl;
  }
  process.env.NODE_ENV ??= 'production';
  step(`PostgreSQL on 127.0.0.1:${cluster.port}`);

  const { migrate } = await import('../api/src/db/migrator');
  const applied = await migrate();
  step(applied.length ? `applied ${applied.length} migration(s)` : 'database schema is up to date');

  const { seedDemo } = await import('./seed/index');
  const seeded = await seedDemo();
  const words = (key: string) => key.replace(/[A-Z]/g, (c) => ` ${c.toLowerCase()}`);
  step(
    `demo scenario ready (${Object.entries(seeded)
      .map(([k, v]) => `${v} ${words(k)}`)
      .join(', ')})`,
  );

  if (localProvider) {
    const { startIdentityProvider } = await import('./identity/index');
    const { recordFailureInEbbline } = await import('./identity/sign-in-log');
    const idp = await startIdentityProvider({ onSignInFailed: recordFailureInEbbline });
    stops.push(() => idp.close());
    step(
      `sign-in service (local identity provider) at ${idp.issuer}${idp.keysCreated ? `, new signing keys in ${path.relative(PROJECT_ROOT, idp.keysDir)}` : ''}; demo accounts: see the README's table`,
    );
  } else {
    step(`signing in through ${process.env.OIDC_ISSUER}`);
  }

  const { startServer } = await import('../api/src/server');
  const server = await startServer();
  stops.push(() => server.close());
  step(`Ebbline is running at ${server.url}  (cold start, Ctrl-C stops everything)`);
} catch (err) {
  console.error(`[ebbline] could not start: ${err instanceof Error ? err.message : String(err)}`);
  await stopAll(1, 'start failed');
}
