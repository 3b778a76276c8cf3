import { Sequelize } from 'sequelize';
import { getConfig } from '../config/env';
import { logger } from '../logger';

const config = getConfig();

/** The one connection pool of the process. */
export const sequelize = new Sequelize(config.DATABASE_URL, {
  dialect: 'postgres',
  logging: (sql) => logger.trace({ sql }, 'sql'),
  pool: { max: config.DATABASE_POOL_MAX, min: 0, idle: 10_000, acquire: 30_000 },
  // a connection that cannot be made in 5 s fails the request (503) instead of holding it;
  // keep-alive notices a database that vanished without closing the socket
  dialectOptions: { connectionTimeoutMillis: 5_000, keepAlive: true },
  define: { underscored: true },
});

/** True when the database answers a trivial query within the timeout. */
export async function databaseAnswers(timeoutMs = 2000): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  try {
    await Promise.race([
      sequelize.query('SELECT 1'),
      new Promise((_, reject) => {
        timer = setTimeout(() => reject(new Error('database timeout')), timeoutMs);
      }),
    ]);
    return true;
  } catch {
    return false;
  } finally {
    clearTimeout(timer);
  }
}
