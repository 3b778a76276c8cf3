/**
 * `npm run dev`: PostgreSQL, migrations and seed as for `npm start`, then the API in watch
 * mode and Vite with hot reload (proxying /api and /auth to the API).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { prepareDatabase } from './database-roles';
import { appClusterOptions, appDatabaseRoles, loadEnvFile, PROJECT_ROOT } from './local-cluster';
import { startCluster, stopCluster } from './postgres';
import { localIssuer, usesLocalProvider } from './identity/settings';

loadEnvFile();
process.chdir(PROJECT_ROOT);
const cluster = appClusterOptions();
startCluster(cluster);
// two roles, as for npm start (infra/database-roles.ts)
const urls = await prepareDatabase(cluster, appDatabaseRoles(), cluster.database);
if (!process.env.DATABASE_URL) {
  process.env.DATABASE_URL = urls.databaseUrl;
  process.env.MIGRATION_DATABASE_URL ??= urls.migrationDatabaseUrl;
}
process.env.WEB_DIST_DIR ??= '';

const { migrate } = await import('../api/src/db/migrator');
await migrate();
const { seedDemo } = await import('./seed/index');
await seedDemo();
const { sequelize } = await import('../api/src/db/sequelize');
await sequelize.close();

const apiPort = process.env.PORT ?? '3000';
const devPort = process.env.EBBLINE_DEV_PORT ?? '5173';
process.env.APP_URL ??= `http://localhost:${devPort}`;
process.env.EBBLINE_API_URL ??= `http://localhost:${apiPort}`;

// the local identity provider, unless OIDC_ISSUER names the company's (see infra/start.ts)
const localProvider = usesLocalProvider();
if (!process.env.OIDC_ISSUER) process.env.OIDC_ISSUER = localIssuer();
// (this process has closed its database pool, so failed attempts go to the console here)
const { startIdentityProvider } = await import('./identity/index');
const idp = localProvider
  ? await startIdentityProvider({
      onSignInFailed: (f) => console.warn(`[ebbline] dev: failed sign-in as "${f.login}" (${f.reason})`),
    })
  : null;
if (idp) console.log(`[ebbline] dev: sign-in service at ${idp.issuer} (demo accounts: see the README's table)`);

const children: ChildProcess[] = [
  spawn('npx', ['tsx', 'watch', '--clear-screen=false', 'api/src/server.ts'], { stdio: 'inherit' }),
  spawn('npx', ['vite'], { stdio: 'inherit' }),
];
console.log(`[ebbline] dev: open http://localhost:${devPort} (API on port ${apiPort})`);

let stopping = false;
function stop(): void {
  if (stopping) return;
  stopping = true;
  for (const child of children) child.kill('SIGTERM');
  void idp?.close();
  stopCluster(cluster);
  process.exit(0);
}
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
for (const child of children) child.on('exit', stop);
