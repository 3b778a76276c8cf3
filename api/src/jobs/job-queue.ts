/**
 * Ebbline's durable job queue: pg-boss 10 on the app's own PostgreSQL (schema `pgboss`).
 * Started with the server and stopped with it (api/src/server.ts). Jobs survive restarts (they
 * are rows), run once across any number of API instances (workers fetch with SKIP LOCKED, the
 * cron schedule is kept in the database and sent by one instance a minute), and a database
 * outage never ends the process: pg-boss reports every failure as an 'error' event, which is
 * logged here, and carries on polling until PostgreSQL is back.
 *
 * The app's role only reads and writes pg-boss's rows: its tables and queues are made by the
 * owner when migrating (queue-schema.ts), so a queue missing here means the migrations were not run.
 */
import PgBoss from 'pg-boss';
import { getConfig } from '../config/env';
import { isDatabaseUnavailable } from '../db/connection-errors';
import { logger } from '../logger';
import { handleMissedVisitJob } from './missed-visits';
import {
  JOB_QUEUE_SCHEMA,
  JOB_QUEUES,
  MISSED_VISITS_CRON,
  MISSED_VISITS_QUEUE,
  PG_BOSS_CRON_QUEUE,
} from './queues';

export interface RunningJobQueue {
  readonly boss: PgBoss;
  /**
   * Stops fetching new jobs, lets the jobs in hand finish (up to graceMs), then closes the
   * queue's connections. Runs once; later calls wait for the same stop.
   */
  stop(graceMs?: number): Promise<void>;
}

export interface JobQueueOptions {
  /** The app's connection; default DATABASE_URL. */
  databaseUrl?: string;
  /** How often an idle worker asks for work, in seconds (pg-boss's minimum is 0.5). */
  pollingIntervalSeconds?: number;
}

/** How long the same failure stays out of the log after it was logged (an outage repeats it every poll). */
const REPEATED_ERROR_QUIET_MS = 30_000;

/** Logs the queue's failures, each distinct one at most every 30 s. */
function queueErrorLogger(): (err: Error) => void {
  const lastLogged = new Map<string, number>();
  return (err) => {
    const key = `${(err as { code?: string }).code ?? ''} ${err.message}`;
    const at = Date.now();
    if (at - (lastLogged.get(key) ?? 0) < REPEATED_ERROR_QUIET_MS) return;
    lastLogged.set(key, at);
    if (lastLogged.size > 100) lastLogged.clear();
    if (isDatabaseUnavailable(err)) {
      logger.warn(
        { err: err.message },
        'job queue: the database is unavailable; jobs wait until it is back',
      );
    } else {
      logger.error({ err }, 'job queue: a queue operation failed');
    }
  };
}

/**
 * Starts the job queue: connects as the app, checks that the owner made every queue, starts
 * the workers, (re)states the cron schedules and asks for one missed-visit check at once.
 * @throws Error when pg-boss's tables are missing or behind (run `npm run db:migrate`), or a queue is missing
 */
export async function startJobQueue(options: JobQueueOptions = {}): Promise<RunningJobQueue> {
  const config = getConfig();
  const bossOptions: PgBoss.ConstructorOptions & Record<string, unknown> = {
    connectionString: options.databaseUrl ?? config.DATABASE_URL,
    schema: JOB_QUEUE_SCHEMA,
    application_name: 'ebbline-jobs',
    max: 4,
    // the owner makes and upgrades the tables (queue-schema.ts); the app never does DDL
    migrate: false,
    // as the app's pool: a connection that cannot be made in 5 s fails instead of waiting
    connectionTimeoutMillis: 5_000,
    keepAlive: true,
  };
  const boss = new PgBoss(bossOptions);
  // without a listener an 'error' event (a lost connection, a failed poll) ends the process
  boss.on('error', queueErrorLogger());
  await boss.start();
  try {
    for (const name of [PG_BOSS_CRON_QUEUE, ...JOB_QUEUES.map((q) => q.name)]) {
      if (!(await boss.getQueue(name))) {
        throw new Error(`the job queue "${name}" does not exist: run \`npm run db:migrate\``);
      }
    }
    const pollingIntervalSeconds = options.pollingIntervalSeconds ?? 5;
    await boss.work(MISSED_VISITS_QUEUE, { pollingIntervalSeconds }, handleMissedVisitJob);
    await boss.schedule(MISSED_VISITS_QUEUE, MISSED_VISITS_CRON, {}, { tz: 'UTC' });
    // a check at every start too: a server that was down at the quarter hour catches up
    await boss.send(MISSED_VISITS_QUEUE, {});
  } catch (err) {
    await boss.stop({ graceful: false, wait: true }).catch(() => undefined);
    throw err;
  }
  logger.info({ queues: JOB_QUEUES.map((q) => q.name) }, 'job queue started');

  let stopping: Promise<void> | undefined;
  return {
    boss,
    stop(graceMs = 10_000) {
      stopping ??= boss.stop({ graceful: true, wait: true, timeout: Math.max(graceMs, 1_000) });
      return stopping;
    },
  };
}
