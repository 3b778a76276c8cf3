/**
 * `npm test`: builds the web app, starts a fresh PostgreSQL of the tests' own (own folder and
 * port, so it runs beside `npm start`), migrates a template database, runs every vitest
 * project (unit, api, e2e), stops PostgreSQL whatever happened, and ends with the plain line
 * `N passed, N failed`. Extra arguments go to vitest, e.g. `npm test -- tests/shared`.
 */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { build } from 'vite';
import { prepareDatabase } from './database-roles';
import { PROJECT_ROOT, testClusterOptions, testDatabaseRoles } from './local-cluster';
import { startCluster, stopCluster } from './postgres';

process.chdir(PROJECT_ROOT);
process.env.TZ = 'UTC';
const cluster = testClusterOptions();
// per cluster port, so that two test runs on one machine never share a file
const reportFile = path.resolve(`.data/test-report-${cluster.port}.json`);
const webDistDir = path.resolve(`dist/test-web-${cluster.port}`);

interface VitestReport {
  numPassedTests: number;
  numFailedTests: number;
  numPendingTests?: number;
  testResults: Array<{ name: string; status: string; message?: string; assertionResults: Array<{ status: string }> }>;
}

/** Counts every test of every project; a file that failed to load counts as one failure. */
function summarise(): { passed: number; failed: number; skipped: number } {
  if (!fs.existsSync(reportFile)) return { passed: 0, failed: 1, skipped: 0 };
  const report = JSON.parse(fs.readFileSync(reportFile, 'utf8')) as VitestReport;
  // a file that failed without a failed test (it did not load, or a hook failed and its tests
  // were skipped) still failed: it counts as one
  const brokenFiles = report.testResults.filter(
    (f) => f.status === 'failed' && !f.assertionResults.some((a) => a.status === 'failed'),
  );
  for (const file of brokenFiles) console.error(`[test] could not run ${path.relative(PROJECT_ROOT, file.name)}: ${file.message ?? ''}`);
  return {
    passed: report.numPassedTests,
    failed: report.numFailedTests + brokenFiles.length,
    skipped: report.numPendingTests ?? 0,
  };
}

let exitCode = 1;
let closingLine = '0 passed, 1 failed';
try {
  await build({ configFile: 'vite.config.ts', logLevel: 'warn', mode: 'production', build: { outDir: webDistDir } });

  stopCluster(cluster);
  fs.rmSync(cluster.dataDir, { recursive: true, force: true });
  startCluster(cluster);
  // owned by the owner role, the app's rights given after migrating; copies keep both
  const template = await prepareDatabase(cluster, testDatabaseRoles(), 'ebbline_template');
  const migrated = spawnSync('npx', ['tsx', 'api/src/db/migrate-cli.ts'], {
    stdio: 'inherit',
    env: {
      ...process.env,
      DATABASE_URL: template.databaseUrl,
      MIGRATION_DATABASE_URL: template.migrationDatabaseUrl,
      LOG_LEVEL: 'warn',
    },
  });
  if (migrated.status !== 0) throw new Error('migrating the template database failed');

  fs.rmSync(reportFile, { force: true });
  const vitest = spawnSync(
    'npx',
    ['vitest', 'run', '--reporter=default', '--reporter=json', `--outputFile.json=${reportFile}`, ...process.argv.slice(2)],
    { stdio: 'inherit', env: { ...process.env, TZ: 'UTC', PG_TEST_PORT: String(cluster.port), E2E_WEB_DIST_DIR: webDistDir } },
  );
  const { passed, failed, skipped } = summarise();
  exitCode = vitest.status === 0 && failed === 0 ? 0 : 1;
  closingLine = `${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`;
} catch (err) {
  console.error(`[test] ${err instanceof Error ? err.message : String(err)}`);
} finally {
  stopCluster(cluster);
  fs.rmSync(cluster.dataDir, { recursive: true, force: true });
  fs.rmSync(webDistDir, { recursive: true, force: true });
}
// CI reads the last line of the output: nothing may follow it
console.log(`\n${closingLine}`);
process.exit(exitCode);
