import type { Migration } from '../migrator';

/**
 * Calendar feeds: a person's secret address (GET /feeds/visits/:token.ics) that calendar apps
 * subscribe to. Only the SHA-256 of the secret is stored; a person has at most one address in
 * use (making a new one revokes the old).
 *
 * And the schema of the job queue (pg-boss): made here by the owner, so it is the owner's like
 * every table. Its tables are made and brought to the installed pg-boss's version after every
 * migration run (api/src/jobs/queue-schema.ts, called by the migrator), and the app gets
 * ordinary rights on them (db/app-role.ts): the app never makes or changes tables.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE calendar_feeds (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users (id) ON DELETE CASCADE,
      -- sha-256 (hex) of the secret in the address; the secret itself is shown once
      token_hash text NOT NULL UNIQUE,
      created_at timestamptz NOT NULL,
      revoked_at timestamptz CHECK (revoked_at IS NULL OR revoked_at >= created_at),
      last_used_at timestamptz
    );
    -- one address in use per person
    CREATE UNIQUE INDEX calendar_feeds_one_active_per_user ON calendar_feeds (user_id) WHERE revoked_at IS NULL;
    CREATE SCHEMA IF NOT EXISTS pgboss;
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP SCHEMA IF EXISTS pgboss CASCADE;
    DROP TABLE calendar_feeds;
  `);
};
