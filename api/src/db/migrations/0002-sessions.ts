import type { Migration } from '../migrator';

/**
 * Sign-in sessions, kept by connect-pg-simple (its documented layout, under our table name).
 * `expire` is the idle deadline, moved on by every request; the store ignores expired rows.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE sessions (
      sid varchar NOT NULL PRIMARY KEY,
      sess json NOT NULL,
      expire timestamptz NOT NULL
    );
    CREATE INDEX sessions_expire ON sessions (expire);
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable('sessions');
};
