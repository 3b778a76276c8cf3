import type { Migration } from '../migrator';

/**
 * The local identity provider's records (its sessions, interactions, grants, codes, tokens),
 * so that a restart of `npm start` does not sign everyone out of the provider. Used only by
 * infra/identity; a company provider keeps its own store.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE identity_provider_records (
      model text NOT NULL,
      id text NOT NULL,
      payload jsonb NOT NULL,
      grant_id text,
      user_code text,
      uid text,
      expires_at timestamptz,
      consumed_at timestamptz,
      PRIMARY KEY (model, id)
    );
    CREATE INDEX identity_provider_records_grant ON identity_provider_records (grant_id) WHERE grant_id IS NOT NULL;
    CREATE INDEX identity_provider_records_uid ON identity_provider_records (model, uid) WHERE uid IS NOT NULL;
    CREATE INDEX identity_provider_records_user_code ON identity_provider_records (model, user_code) WHERE user_code IS NOT NULL;
    CREATE INDEX identity_provider_records_expires ON identity_provider_records (expires_at);
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable('identity_provider_records');
};
