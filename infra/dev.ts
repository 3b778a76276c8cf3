/**
 * `npm run dev`: PostgreSQL, migrations and seed as for `npm start`, then the API in watch
 * mode and Vite with hot reload (proxying /api and /auth to the API).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { appClusterOptions, loadEnvFile, PROJECT_ROOT } from './local-cluster';
import { databaseUrl, ensureDatabase, startCluster, stopCluster } from './postgres';

loadEnvFile();
process.chdir(PROJECT_ROOT);
const cluster = appClusterOptions();
startCluster(cluster);
await ensureDatabase(cluster, cluster.database);
process.env.DATABASE_URL ??= databaseUrl(cluster, cluster.database);
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
  stopCluster(cluster);
  process.exit(0);
}
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
for (const child of children) child.on('exit', stop);
