import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { QueryInterface } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';
import { sequelize } from './sequelize';

const migrationsDir = path.join(path.dirname(fileURLToPath(import.meta.url)), 'migrations');

/** Migrations are api/src/db/migrations/NNNN-name.ts, applied in name order and recorded. */
export const migrator = new Umzug({
  migrations: { glob: ['*.ts', { cwd: migrationsDir, ignore: ['*.d.ts'] }] },
  context: sequelize.getQueryInterface(),
  storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
  logger: undefined,
});

export type Migration = typeof migrator._types.migration;
export type MigrationContext = QueryInterface;

/** Applies every pending migration; returns the names applied. */
export async function migrate(): Promise<string[]> {
  const applied = await migrator.up();
  return applied.map((m) => m.name);
}
