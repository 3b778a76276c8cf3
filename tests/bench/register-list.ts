/**
 * `npm run bench:register`: how fast the cabinet list answers on a large fleet.
 *
 * Starts a throwaway PostgreSQL of its own (folder and port of its own, so it runs beside
 * `npm start` and `npm test`), migrates, seeds the demo scenario grown to BENCH_CABINETS
 * cabinets (default 20 000) with the seed's bulk path, starts the API in-process, and times
 * GET /api/cabinets for the list's common queries over HTTP. Prints the median and p95 of each,
 * and the query plans that show which index each query uses.
 *
 *   BENCH_CABINETS=20000 BENCH_RUNS=60 npm run bench:register
 *   BENCH_KEEP=1 npm run bench:register   (leaves the cluster running, to look at it with psql)
 */
import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import pg from 'pg';
import { prepareDatabase } from '../../infra/database-roles';
import { PROJECT_ROOT, testDatabaseRoles } from '../../infra/local-cluster';
import { databaseUrl, startCluster, stopCluster, type ClusterOptions } from '../../infra/postgres';

const CABINETS = Number(process.env.BENCH_CABINETS || 20_000);
const RUNS = Number(process.env.BENCH_RUNS || 60);
const WARMUP = 5;

const cluster: ClusterOptions = {
  dataDir: path.resolve(PROJECT_ROOT, process.env.BENCH_PG_DATA_DIR || '.data/pg-bench'),
  port: Number(process.env.BENCH_PG_PORT || 54359),
  user: 'ebbline',
  password: 'ebbline-bench',
  durable: false,
};

function quantile(sorted: number[], q: number): number {
  const i = (sorted.length - 1) * q;
  const lo = Math.floor(i);
  const hi = Math.ceil(i);
  return sorted[lo]! + (sorted[hi]! - sorted[lo]!) * (i - lo);
}

process.chdir(PROJECT_ROOT);
stopCluster(cluster);
fs.rmSync(cluster.dataDir, { recursive: true, force: true });
startCluster(cluster);
let exitCode = 0;
try {
  // the two roles of npm start: the app's pool is timed, the owner runs migrations and ANALYZE
  const urls = await prepareDatabase(cluster, testDatabaseRoles(), 'ebbline_bench');
  Object.assign(process.env, {
    DATABASE_URL: urls.databaseUrl,
    MIGRATION_DATABASE_URL: urls.migrationDatabaseUrl,
    NODE_ENV: 'test',
    LOG_LEVEL: 'silent',
    WEB_DIST_DIR: '',
  });
  const { migrate } = await import('../../api/src/db/migrator');
  await migrate();
  const { seedDemo } = await import('../../infra/seed/index');
  const t0 = performance.now();
  const seeded = await seedDemo({ cabinets: CABINETS });
  const seedSeconds = (performance.now() - t0) / 1000;
  const { sequelize } = await import('../../api/src/db/sequelize');
  // only a table's owner may ANALYZE it (the app's role would be skipped with a warning)
  const owner = new pg.Client({ connectionString: urls.migrationDatabaseUrl });
  await owner.connect();
  await owner.query('ANALYZE');
  await owner.end();
  console.log(`seeded ${seeded.cabinets} cabinets and ${seeded.banks} banks in ${seedSeconds.toFixed(1)} s`);

  const { createCaller } = await import('../support/auth');
  const { createApp } = await import('../../api/src/app');
  const caller = await createCaller(['technician'], 'bench');
  const server = http.createServer(createApp());
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;

  const [sites] = await sequelize.query(`SELECT id FROM sites WHERE code = 'S'`);
  const siteId = (sites as Array<{ id: string }>)[0]!.id;
  const scenarios: Array<[string, string]> = [
    ['first page, by tag', '/api/cabinets?page=1&pageSize=25'],
    ['page 400 of 800, by tag', '/api/cabinets?page=400&pageSize=25'],
    ['tag search "VFD-01" (any part)', '/api/cabinets?q=VFD-01&pageSize=25'],
    ['tag search "BRK-S14" (start)', '/api/cabinets?q=BRK-S14&pageSize=25'],
    ['one site, sorted by area', `/api/cabinets?siteId=${siteId}&sort=area&pageSize=25`],
    ['critical only, newest commissioned', '/api/cabinets?criticality=critical&sort=-commissionedOn&pageSize=25'],
  ];

  const results: Array<{ scenario: string; total: number; median: number; p95: number }> = [];
  for (const [scenario, url] of scenarios) {
    const times: number[] = [];
    let total = 0;
    for (let i = 0; i < WARMUP + RUNS; i += 1) {
      const start = performance.now();
      const res = await fetch(base + url, { headers: { Authorization: caller.auth } });
      const body = (await res.json()) as { total: number };
      const ms = performance.now() - start;
      if (!res.ok) throw new Error(`${url} answered ${res.status}: ${JSON.stringify(body)}`);
      total = body.total;
      if (i >= WARMUP) times.push(ms);
    }
    times.sort((a, b) => a - b);
    results.push({ scenario, total, median: quantile(times, 0.5), p95: quantile(times, 0.95) });
  }

  console.log(`\nGET /api/cabinets on ${seeded.cabinets} cabinets, ${RUNS} runs each (over HTTP, bearer token):`);
  console.log(`${'query'.padEnd(40)} ${'matches'.padStart(8)} ${'median ms'.padStart(10)} ${'p95 ms'.padStart(8)}`);
  for (const r of results) {
    console.log(`${r.scenario.padEnd(40)} ${String(r.total).padStart(8)} ${r.median.toFixed(1).padStart(10)} ${r.p95.toFixed(1).padStart(8)}`);
  }
  const all = results.map((r) => r.median).sort((a, b) => a - b);
  console.log(`median of the medians: ${quantile(all, 0.5).toFixed(1)} ms`);

  // what the planner does with the list's two kinds of query
  const plans: Array<[string, string]> = [
    ['tag order', `SELECT id FROM cabinets WHERE retired_at IS NULL ORDER BY tag, id LIMIT 25 OFFSET 10000`],
    ['tag search', `SELECT id FROM cabinets WHERE retired_at IS NULL AND tag ILIKE '%VFD-01%' ORDER BY tag, id LIMIT 25`],
    ['tag search count', `SELECT count(*) FROM cabinets WHERE retired_at IS NULL AND tag ILIKE '%VFD-01%'`],
    ['narrow tag search count', `SELECT count(*) FROM cabinets WHERE retired_at IS NULL AND tag ILIKE '%S14%'`],
  ];
  const explain = async (name: string, sql: string) => {
    const [rows] = await sequelize.query(`EXPLAIN (ANALYZE, COSTS OFF) ${sql}`);
    const lines = (rows as Array<Record<string, string>>).map((r) => Object.values(r)[0]);
    console.log(`\nplan, ${name}:\n  ${lines.filter((l) => /Scan|Sort|Limit|Execution/.test(l ?? '')).join('\n  ')}`);
  };
  for (const [name, sql] of plans) await explain(name, sql);
  // at this size a sequential scan of the table is the planner's cheapest way to count a tag
  // search (a few ms); the trigram index (cabinets_tag_trgm) is there for it as the fleet grows
  await new Promise<void>((resolve) => server.close(() => resolve()));
  await sequelize.close();
} catch (err) {
  console.error(err);
  exitCode = 1;
} finally {
  if (process.env.BENCH_KEEP) {
    console.log(`\nleft running: ${databaseUrl(cluster, 'ebbline_bench')} (stop: tsx infra/postgres.ts stop with PG_DATA_DIR=${cluster.dataDir})`);
  } else {
    stopCluster(cluster);
    fs.rmSync(cluster.dataDir, { recursive: true, force: true });
  }
}
process.exit(exitCode);
