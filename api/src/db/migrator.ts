import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Sequelize, type QueryInterface } from 'sequelize';
import { SequelizeStorage, Umzug, type MigrationFn } from 'umzug';
import { getConfig } from '../config/env';
import { logger } from '../logger';
import { prepareJobQueueSchema } from '../jobs/queue-schema';
import { appRoleProblems, grantAppRole, roleOf } from './app-role';

const migrationsDir = path.join(path.dirname(fileURLToPath(import.meta.url)), 'migrations');

export type MigrationContext = QueryInterface;
export type Migration = MigrationFn<MigrationContext>;

/** Migrations are api/src/db/migrations/NNNN-name.ts, applied in name order and recorded. */
function createMigrator(owner: Sequelize) {
  return new Umzug({
    migrations: { glob: ['*.ts', { cwd: migrationsDir, ignore: ['*.d.ts'] }] },
    context: owner.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize: owner, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}

/**
 * Runs `work` connected as the owner role (MIGRATION_DATABASE_URL), never through the app's
 * pool: the tables belong to the owner, the app only gets rights on them.
 */
async function asOwner<T>(work: (owner: Sequelize) => Promise<T>): Promise<T> {
  const config = getConfig();
  const owner = new Sequelize(config.MIGRATION_DATABASE_URL, {
    dialect: 'postgres',
    logging: (sql) => logger.trace({ sql }, 'migration sql'),
    pool: { max: 1, min: 0 },
    define: { underscored: true },
  });
  try {
    return await work(owner);
  } finally {
    await owner.close();
  }
}

/**
 * Applies every pending migration as the owner, then gives the app's role its rights again
 * (app-role.ts), so tables added since are covered. Refuses when the app's role is a superuser
 * or owns tables: the audit trail would not be append-only.
 * @returns the names applied
 */
export async function migrate(): Promise<string[]> {
  const config = getConfig();
  return asOwner(async (owner) => {
    const applied = await createMigrator(owner).up();
    // the job queue's tables, at the installed pg-boss's version, made by the owner
    const [queueSchema] = (await owner.query(
      `SELECT 1 FROM pg_namespace WHERE nspname = 'pgboss'`,
    )) as [unknown[], unknown];
    if (queueSchema.length > 0) await prepareJobQueueSchema(config.MIGRATION_DATABASE_URL);
    const appRole = roleOf(config.DATABASE_URL);
    if (appRole === roleOf(config.MIGRATION_DATABASE_URL)) {
      logger.warn(
        'DATABASE_URL and MIGRATION_DATABASE_URL name one role: the app owns its tables and can rewrite the audit trail. Give the app a role of its own.',
      );
    } else {
      const problems = await appRoleProblems(owner, appRole);
      if (problems.length) throw new Error(`Cannot give the app its rights: ${problems.join('; ')}`);
      await grantAppRole(owner, appRole);
    }
    return applied.map((m) => m.name);
  });
}

/** Undoes the last applied migration, as the owner; returns its name (empty when none). */
export async function undoLastMigration(): Promise<string[]> {
  return asOwner(async (owner) => (await createMigrator(owner).down()).map((m) => m.name));
}
