import type { Migration } from '../migrator';

/**
 * The local identity provider's failed sign-in attempts, per key (a login, an address): the
 * recent failures within the window and the end of a lock, so that a restart of the sign-in
 * service does not forget them (infra/identity/rate-limit.ts).
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE identity_sign_in_failures (
      key text PRIMARY KEY,
      failed_at timestamptz[] NOT NULL DEFAULT '{}',
      locked_until timestamptz,
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX identity_sign_in_failures_updated ON identity_sign_in_failures (updated_at);
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable('identity_sign_in_failures');
};
