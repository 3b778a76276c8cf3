import type { Migration } from '../migrator';

/**
 * Spares in store with their reforming due date, and the register's audit trail (who, when,
 * before and after, for every create, change and retirement).
 */
export const up: Migration = async ({ context: qi }) => {
  const sql = (text: string) => qi.sequelize.query(text);
  await sql(`
    CREATE TABLE spares (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      code text NOT NULL,
      kind text NOT NULL CHECK (kind IN ('bank', 'drive')),
      description text NOT NULL,
      site_id uuid NOT NULL REFERENCES sites (id),
      bank_design_id uuid REFERENCES bank_designs (id),
      storage_location text NOT NULL DEFAULT '',
      storage_started_on date NOT NULL,
      last_reformed_on date,
      reforming_interval_days integer NOT NULL CHECK (reforming_interval_days > 0),
      -- (last_reformed_on or storage_started_on) + interval, kept by the service for sorting
      reforming_due_on date NOT NULL,
      status text NOT NULL DEFAULT 'in-store' CHECK (status IN ('in-store', 'issued')),
      notes text NOT NULL DEFAULT '',
      version integer NOT NULL DEFAULT 1,
      retired_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    )`);
  await sql('CREATE UNIQUE INDEX spares_code_in_use ON spares (lower(code)) WHERE retired_at IS NULL');
  await sql('CREATE INDEX spares_reforming_due ON spares (reforming_due_on)');
  await sql('CREATE INDEX spares_site ON spares (site_id)');

  await sql(`
    CREATE TABLE audit_entries (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      entity_type text NOT NULL,
      entity_id uuid NOT NULL,
      action text NOT NULL,
      actor_id uuid REFERENCES users (id) ON DELETE SET NULL,
      -- the actor's name when it happened, so the trail reads the same after a rename
      actor_name text,
      summary text NOT NULL DEFAULT '',
      before jsonb,
      after jsonb,
      at timestamptz NOT NULL DEFAULT now()
    )`);
  await sql('CREATE INDEX audit_entries_record ON audit_entries (entity_type, entity_id, at DESC)');
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable('audit_entries');
  await qi.dropTable('spares');
};
