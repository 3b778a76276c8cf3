/**
 * Runs before each API test file, before it imports the app: points the app at a fresh
 * database of its own (the app reads DATABASE_URL once, at import).
 */
import { afterAll } from 'vitest';
import { createTestDatabase } from './test-cluster';

process.env.NODE_ENV = 'test';
process.env.LOG_LEVEL ??= 'silent';
process.env.WEB_DIST_DIR = '';
process.env.DATABASE_URL = await createTestDatabase();

afterAll(async () => {
  const { sequelize } = await import('../../api/src/db/sequelize');
  await sequelize.close();
});
