import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { DatabaseRoles } from './database-roles';
import type { ClusterOptions } from './postgres';

/** The project's root folder (where package.json is). */
export const PROJECT_ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

/** Loads .env when present, without overriding what the shell already set. */
export function loadEnvFile(): void {
  try {
    process.loadEnvFile(path.join(PROJECT_ROOT, '.env'));
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== 'ENOENT') throw err;
  }
}

/** The cluster `npm start` and `npm run dev` use: durable, reused between starts. */
export function appClusterOptions(env = process.env): ClusterOptions & { database: string } {
  return {
    dataDir: path.resolve(PROJECT_ROOT, env.PG_DATA_DIR || '.data/pg'),
    port: Number(env.PG_PORT || 5433),
    user: env.PG_USER || 'ebbline',
    password: env.PG_PASSWORD || 'ebbline-local',
    database: env.PG_DATABASE || 'ebbline',
    durable: true,
  };
}

/** The cluster `npm test` uses: its own folder and port, new every run, durability off. */
export function testClusterOptions(env = process.env): ClusterOptions {
  return {
    dataDir: path.resolve(PROJECT_ROOT, env.PG_TEST_DATA_DIR || '.data/pg-test'),
    port: Number(env.PG_TEST_PORT || 54329),
    user: 'ebbline',
    password: 'ebbline-test',
    durable: false,
  };
}

/**
 * The owner and app roles of the `npm start` / `npm run dev` cluster (infra/database-roles.ts).
 * PG_USER stays the cluster's superuser, which only makes roles and databases.
 */
export function appDatabaseRoles(env = process.env): DatabaseRoles {
  return {
    owner: {
      user: env.PG_OWNER_USER || 'ebbline_owner',
      password: env.PG_OWNER_PASSWORD || 'ebbline-owner-local',
    },
    app: {
      user: env.PG_APP_USER || 'ebbline_app',
      password: env.PG_APP_PASSWORD || 'ebbline-app-local',
    },
  };
}

/** The owner and app roles of the `npm test` cluster. */
export function testDatabaseRoles(): DatabaseRoles {
  return {
    owner: { user: 'ebbline_owner', password: 'ebbline-owner-test' },
    app: { user: 'ebbline_app', password: 'ebbline-app-test' },
  };
}
