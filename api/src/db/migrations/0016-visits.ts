import type { Migration } from '../migrator';

/**
 * Visits: one or more banks of one cabinet, planned between two instants, assigned to one or
 * more technicians, moving through planned → under-way → logged → reviewed (or missed,
 * cancelled). `overrides` keeps the planning warnings a planner accepted, with their reasons;
 * `state_reason` the reason of the last cancel or replan.
 */
export const up: Migration = async ({ context: qi }) => {
  const sql = (text: string) => qi.sequelize.query(text);
  await sql(`
    CREATE TABLE visits (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      cabinet_id uuid NOT NULL REFERENCES cabinets (id),
      planned_start_at timestamptz NOT NULL,
      planned_end_at timestamptz NOT NULL CHECK (planned_end_at > planned_start_at),
      state text NOT NULL DEFAULT 'planned'
        CHECK (state IN ('planned', 'under-way', 'logged', 'reviewed', 'missed', 'cancelled')),
      -- true for a visit made on the floor without a plan (capture comes with a later change)
      unplanned boolean NOT NULL DEFAULT false,
      notes text NOT NULL DEFAULT '',
      -- the planning warnings accepted: [{ "kind": "outside-window", "reason": "…" }]
      overrides jsonb NOT NULL DEFAULT '[]',
      -- the reason given for the last cancel or replan
      state_reason text NOT NULL DEFAULT '',
      started_at timestamptz,
      logged_at timestamptz,
      reviewed_at timestamptz,
      missed_at timestamptz,
      cancelled_at timestamptz,
      created_by_id uuid REFERENCES users (id) ON DELETE SET NULL,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    )`);
  await sql('CREATE INDEX visits_planned_start ON visits (planned_start_at)');
  await sql('CREATE INDEX visits_cabinet ON visits (cabinet_id)');
  await sql('CREATE INDEX visits_state_planned_end ON visits (state, planned_end_at)');

  await sql(`
    CREATE TABLE visit_banks (
      visit_id uuid NOT NULL REFERENCES visits (id) ON DELETE CASCADE,
      bank_id uuid NOT NULL REFERENCES banks (id),
      PRIMARY KEY (visit_id, bank_id)
    )`);
  await sql('CREATE INDEX visit_banks_bank ON visit_banks (bank_id)');

  await sql(`
    CREATE TABLE visit_technicians (
      visit_id uuid NOT NULL REFERENCES visits (id) ON DELETE CASCADE,
      user_id uuid NOT NULL REFERENCES users (id),
      PRIMARY KEY (visit_id, user_id)
    )`);
  await sql('CREATE INDEX visit_technicians_user ON visit_technicians (user_id)');
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable('visit_technicians');
  await qi.dropTable('visit_banks');
  await qi.dropTable('visits');
};
