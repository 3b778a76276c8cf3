/**
 * The job queue's tables, made and upgraded by the owner role after the migrations
 * (api/src/db/migrator.ts). pg-boss installs its tables in the schema `pgboss` (migration 0017)
 * and brings them to the installed pg-boss's version itself, under an advisory lock, so two
 * instances migrating at once are safe. The app then starts pg-boss with `migrate: false`: it
 * only reads and writes rows (its rights: db/app-role.ts).
 */
import PgBoss from 'pg-boss';
import { JOB_QUEUE_SCHEMA, JOB_QUEUES, PG_BOSS_CRON_QUEUE } from './queues';

/**
 * Installs or upgrades pg-boss's tables and makes every queue of {@link JOB_QUEUES}, connected
 * as the owner. Idempotent: an existing queue keeps its table and rows.
 * @param ownerUrl the owner role's connection (MIGRATION_DATABASE_URL)
 */
export async function prepareJobQueueSchema(ownerUrl: string): Promise<void> {
  const boss = new PgBoss({
    connectionString: ownerUrl,
    schema: JOB_QUEUE_SCHEMA,
    application_name: 'ebbline-migrate-jobs',
    max: 1,
    migrate: true,
    supervise: false,
    schedule: false,
  });
  let failure: unknown;
  boss.on('error', (err) => {
    failure ??= err;
  });
  await boss.start();
  try {
    await boss.createQueue(PG_BOSS_CRON_QUEUE);
    for (const queue of JOB_QUEUES) {
      const existing = await boss.getQueue(queue.name);
      if (existing) await boss.updateQueue(queue.name, queue);
      else await boss.createQueue(queue.name, queue);
    }
  } finally {
    await boss.stop({ graceful: false, wait: true });
  }
  if (failure) throw failure;
}
