import crypto from 'node:crypto';
import { testClusterOptions } from '../../infra/local-cluster';
import { databaseUrl, ensureDatabase } from '../../infra/postgres';

/** Name of the migrated database every test database is copied from (made by test-run). */
export const TEMPLATE_DATABASE = 'ebbline_template';

/**
 * Creates a fresh database copied from the migrated template and returns its URL.
 * Copying a template takes milliseconds, so each test file gets a database of its own.
 */
export async function createTestDatabase(prefix = 'ebbline_t'): Promise<string> {
  const cluster = testClusterOptions();
  const name = `${prefix}_${process.pid}_${crypto.randomBytes(4).toString('hex')}`;
  await ensureDatabase(cluster, name, TEMPLATE_DATABASE);
  return databaseUrl(cluster, name);
}
