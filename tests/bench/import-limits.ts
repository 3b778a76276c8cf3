/**
 * `npm run bench:import`: what a large cabinet import costs, and what it costs everyone else.
 *
 * Starts a throwaway PostgreSQL of its own (folder and port of its own), migrates, starts the API
 * in-process and times, in the same run:
 * - GET /api/health at rest (sequential requests);
 * - the file of a million one-character rows (2 MB, within the size limit) sent to the import
 *   preview and to the import: the answer's status, time and size;
 * - a file at the row limit with wide rows (the most work a file within the limits can ask for);
 * - GET /api/health while each import is being answered, beside its latency at rest (ratio),
 *   and the longest the event loop was held during the import.
 *
 *   BENCH_IMPORT_PG_PORT=54445 npm run bench:import
 */
import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import os from 'node:os';
import { performance } from 'node:perf_hooks';
import { PROJECT_ROOT } from '../../infra/local-cluster';
import { databaseUrl, ensureDatabase, startCluster, stopCluster, type ClusterOptions } from '../../infra/postgres';
import { IMPORT_MAX_ROWS } from '../../shared/constants/register';

const REST_RUNS = Number(process.env.BENCH_REST_RUNS || 200);
/** The report's ceilings: a 4xx within 2 s, an answer under 200 KB, the loop never held much over 100 ms. */
const CEILING = { answerMs: 2000, answerBytes: 200 * 1024, heldMs: 100 };

const cluster: ClusterOptions = {
  dataDir: path.resolve(PROJECT_ROOT, process.env.BENCH_IMPORT_PG_DATA_DIR || '.data/pg-bench-import'),
  port: Number(process.env.BENCH_IMPORT_PG_PORT || 54445),
  user: 'ebbline',
  password: 'ebbline-bench',
  durable: false,
};

const HEADER =
  'site_code,area,tag,location,drive_make,drive_model,supply_volts,dc_bus_volts,rated_power_kw,marked_wait_minutes,criticality,environment_notes,commissioned_on,status';

/**
 * Follows the event loop from one turn to the next until stopped: the longest wall time between
 * two turns, and the most CPU time the process spent between two turns (on a busy machine the
 * wall time also counts the time other programs had the CPU; the CPU time does not).
 */
function watchTurns() {
  let running = true;
  let heldMs = 0;
  let heldCpuMs = 0;
  let last = performance.now();
  let lastCpu = process.cpuUsage();
  const turn = () => {
    if (!running) return;
    const now = performance.now();
    const cpu = process.cpuUsage(lastCpu);
    heldMs = Math.max(heldMs, now - last);
    heldCpuMs = Math.max(heldCpuMs, (cpu.user + cpu.system) / 1000);
    last = now;
    lastCpu = process.cpuUsage();
    setImmediate(turn);
  };
  setImmediate(turn);
  return () => {
    running = false;
    return { heldMs, heldCpuMs };
  };
}

function quantile(sorted: number[], q: number): number {
  const i = (sorted.length - 1) * q;
  const lo = Math.floor(i);
  const hi = Math.ceil(i);
  return sorted[lo]! + (sorted[hi]! - sorted[lo]!) * (i - lo);
}

interface Latencies {
  count: number;
  median: number;
  p95: number;
  max: number;
}

function summarise(times: number[]): Latencies {
  const sorted = [...times].sort((a, b) => a - b);
  return { count: sorted.length, median: quantile(sorted, 0.5), p95: quantile(sorted, 0.95), max: sorted.at(-1)! };
}

process.chdir(PROJECT_ROOT);
stopCluster(cluster);
fs.rmSync(cluster.dataDir, { recursive: true, force: true });
startCluster(cluster);
let exitCode = 0;
try {
  await ensureDatabase(cluster, 'ebbline_bench');
  Object.assign(process.env, {
    DATABASE_URL: databaseUrl(cluster, 'ebbline_bench'),
    NODE_ENV: 'test',
    LOG_LEVEL: 'silent',
    WEB_DIST_DIR: '',
  });
  const { migrate } = await import('../../api/src/db/migrator');
  await migrate();
  const { sequelize } = await import('../../api/src/db/sequelize');
  const { createCaller } = await import('../support/auth');
  const { createApp } = await import('../../api/src/app');
  const planner = await createCaller(['planner'], 'bench');
  const server = http.createServer(createApp());
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;

  const health = async (): Promise<number> => {
    const start = performance.now();
    const res = await fetch(`${base}/api/health`);
    await res.arrayBuffer();
    if (!res.ok) throw new Error(`/api/health answered ${res.status}`);
    return performance.now() - start;
  };

  /** Sends `bytes` as the CSV upload to `route`, asking /api/health over and over until it answers. */
  const importUnderWatch = async (route: string, bytes: Buffer) => {
    const form = new FormData();
    form.append('file', new Blob([new Uint8Array(bytes)], { type: 'text/csv' }), 'bench.csv');
    const stopWatching = watchTurns();
    const start = performance.now();
    let done = false;
    const answer = fetch(`${base}${route}`, { method: 'POST', headers: { Authorization: planner.auth }, body: form }).then(async (res) => {
      const body = Buffer.from(await res.arrayBuffer());
      const ms = performance.now() - start;
      done = true;
      return { status: res.status, ms, bytes: body.length, code: (JSON.parse(body.toString('utf8')) as { error?: { code?: string } }).error?.code };
    });
    const during: number[] = [];
    while (!done) during.push(await health());
    const result = await answer;
    return { ...result, during: summarise(during), ...stopWatching() };
  };

  for (let i = 0; i < 20; i += 1) await health(); // warm the pool and the code paths
  const restTimes: number[] = [];
  for (let i = 0; i < REST_RUNS; i += 1) restTimes.push(await health());
  const rest = summarise(restTimes);

  // a site for the valid file, through the API as a planner would add it
  const site = await fetch(`${base}/api/sites`, {
    method: 'POST',
    headers: { Authorization: planner.auth, 'Content-Type': 'application/json' },
    body: JSON.stringify({ name: 'Bench Works', code: 'BEN', address: '', timeZone: 'Europe/London' }),
  });
  if (!site.ok) throw new Error(`adding the bench site answered ${site.status}: ${await site.text()}`);
  const million = Buffer.from(`${HEADER}\n${'x\n'.repeat(1_000_000)}`);
  const wideRow = (i: number) =>
    `BEN,Line 1,BEN-WIDE-${i},${'l'.repeat(150)},${'w'.repeat(80)},${'w'.repeat(80)},four hundred,x,y,z,unknown,dusty,someday,gone`;
  const validRow = (i: number) => `BEN,Line ${1 + (i % 20)},BEN-L-VFD-${String(i).padStart(5, '0')},Bay ${i},Tarnwick Drives,TW-55,400,540,55,10,high,,2019-04-01,in-service`;
  const validAtLimit = Buffer.from(`${HEADER}\n${Array.from({ length: IMPORT_MAX_ROWS }, (_, i) => validRow(i)).join('\n')}\n`);
  const atLimit = Buffer.from(`${HEADER}\n${Array.from({ length: IMPORT_MAX_ROWS }, (_, i) => wideRow(i)).join('\n')}\n`);

  const runs = [
    { name: `a million one-character rows (${(million.length / 1024 / 1024).toFixed(2)} MiB), preview`, route: '/api/cabinets/import/preview', bytes: million, limits: true },
    { name: 'the same file, import', route: '/api/cabinets/import', bytes: million, limits: true },
    { name: `${IMPORT_MAX_ROWS} wide rows at the limit (${(atLimit.length / 1024 / 1024).toFixed(2)} MiB), preview`, route: '/api/cabinets/import/preview', bytes: atLimit, limits: false },
    { name: `${IMPORT_MAX_ROWS} good rows at the limit (${(validAtLimit.length / 1024).toFixed(0)} KB), import (every row stored)`, route: '/api/cabinets/import', bytes: validAtLimit, limits: false },
  ];
  console.log(`machine load (1 min average) ${os.loadavg()[0]!.toFixed(1)} on ${os.cpus().length} cores`);
  console.log(`\nGET /api/health at rest (${rest.count} sequential): median ${rest.median.toFixed(1)} ms, p95 ${rest.p95.toFixed(1)} ms, max ${rest.max.toFixed(1)} ms`);
  for (const run of runs) {
    const r = await importUnderWatch(run.route, run.bytes);
    console.log(`\n${run.name}:`);
    const ofCeiling = (value: number, ceiling: number, unit: string) => (run.limits ? ` (${(value / ceiling).toFixed(3)} of the ${ceiling} ${unit} ceiling)` : '');
    console.log(
      `  answer: ${r.status}${r.code ? ` ${r.code}` : ''} in ${r.ms.toFixed(0)} ms${ofCeiling(r.ms, CEILING.answerMs, 'ms')}, ${(r.bytes / 1024).toFixed(1)} KB${ofCeiling(r.bytes / 1024, CEILING.answerBytes / 1024, 'KB')}`,
    );
    console.log(
      `  GET /api/health meanwhile (${r.during.count} answered): median ${r.during.median.toFixed(1)} ms, p95 ${r.during.p95.toFixed(1)} ms, max ${r.during.max.toFixed(1)} ms; p95 ${(r.during.p95 / rest.p95).toFixed(1)}× its p95 at rest`,
    );
    console.log(
      `  longest between two turns of the event loop: ${r.heldMs.toFixed(0)} ms wall, ${r.heldCpuMs.toFixed(0)} ms CPU (${(r.heldCpuMs / CEILING.heldMs).toFixed(2)} of the ${CEILING.heldMs} ms ceiling)`,
    );
  }
  await new Promise<void>((resolve) => server.close(() => resolve()));
  await sequelize.close();
} catch (err) {
  console.error(err);
  exitCode = 1;
} finally {
  stopCluster(cluster);
  fs.rmSync(cluster.dataDir, { recursive: true, force: true });
}
process.exit(exitCode);
