/**
 * Ebbline's job queues (pg-boss, schema `pgboss`). The owner role makes each queue when it
 * migrates (queue-schema.ts): a queue is a table of its own, and the app never makes tables.
 * A new job adds its queue here; the next `npm run db:migrate` (or `npm start`) makes it.
 */
import type PgBoss from 'pg-boss';

/** The schema pg-boss keeps its tables in (made by migration 0017). */
export const JOB_QUEUE_SCHEMA = 'pgboss';

/** pg-boss's own queue for cron schedules: made with ours, since the app cannot make it. */
export const PG_BOSS_CRON_QUEUE = '__pgboss__send-it';

/**
 * Marks planned visits missed once their planned end is MISSED_VISIT_AFTER_HOURS past
 * (missed-visits.ts). `short`: at most one run waits at a time, so the 15-minute schedule,
 * the run at every start and a second API instance never pile runs up.
 */
export const MISSED_VISITS_QUEUE = 'missed-visits';

/** Every queue Ebbline uses, with its options. */
export const JOB_QUEUES: readonly PgBoss.Queue[] = [
  {
    name: MISSED_VISITS_QUEUE,
    policy: 'short',
    retryLimit: 3,
    retryDelay: 60,
    retryBackoff: true,
    // a run marks a few visits; one that takes this long is stuck and is tried again
    expireInSeconds: 10 * 60,
    retentionMinutes: 24 * 60,
  },
];

/** The cron schedule of the missed-visit run: every 15 minutes, on the quarter hour (UTC). */
export const MISSED_VISITS_CRON = '*/15 * * * *';
