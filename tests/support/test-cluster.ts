import crypto from 'node:crypto';
import { roleUrl } from '../../infra/database-roles';
import { testClusterOptions, testDatabaseRoles } from '../../infra/local-cluster';
import { ensureDatabase } from '../../infra/postgres';

/** Name of the migrated database every test database is copied from (made by test-run). */
export const TEMPLATE_DATABASE = 'ebbline_template';

/**
 * Creates a fresh database copied from the migrated template and returns its URL for the app's
 * role (owner: the owner role; the copy keeps the template's rights). Copying a template takes
 * milliseconds, so each test file gets a database of its own.
 */
export async function createTestDatabase(prefix = 'ebbline_t'): Promise<string> {
  const cluster = testClusterOptions();
  const roles = testDatabaseRoles();
  const name = `${prefix}_${process.pid}_${crypto.randomBytes(4).toString('hex')}`;
  await ensureDatabase(cluster, name, TEMPLATE_DATABASE, roles.owner.user);
  return roleUrl(cluster, roles.app, name);
}

/** The owner role's URL for a test database (for tests of what only the owner may do). */
export function ownerUrlOf(appDatabaseUrl: string): string {
  const database = new URL(appDatabaseUrl).pathname.slice(1);
  return roleUrl(testClusterOptions(), testDatabaseRoles().owner, database);
}
