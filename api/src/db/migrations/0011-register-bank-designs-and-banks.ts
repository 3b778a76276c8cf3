import type { Migration } from '../migrator';

/**
 * Bank designs with immutable revisions (a verdict points at the revision it was judged with,
 * so editing a design never changes old verdicts), and banks: one DC link in a cabinet, with its
 * baseline and its place in a replacement chain.
 */
export const up: Migration = async ({ context: qi }) => {
  const sql = (text: string) => qi.sequelize.query(text);
  await sql(`
    CREATE TABLE bank_designs (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      code text NOT NULL,
      name text NOT NULL,
      notes text NOT NULL DEFAULT '',
      current_version_id uuid,
      version integer NOT NULL DEFAULT 1,
      retired_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    )`);
  await sql('CREATE UNIQUE INDEX bank_designs_code_in_use ON bank_designs (lower(code)) WHERE retired_at IS NULL');

  await sql(`
    CREATE TABLE bank_design_versions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      bank_design_id uuid NOT NULL REFERENCES bank_designs (id),
      revision integer NOT NULL CHECK (revision >= 1),
      technology text NOT NULL CHECK (technology IN ('electrolytic', 'film')),
      unit_capacitance_microfarads double precision NOT NULL CHECK (unit_capacitance_microfarads > 0),
      unit_rated_volts double precision NOT NULL CHECK (unit_rated_volts > 0),
      series_count integer NOT NULL CHECK (series_count >= 1),
      parallel_count integer NOT NULL CHECK (parallel_count >= 1),
      bleeder_ohms double precision NOT NULL CHECK (bleeder_ohms > 0),
      capacitance_tolerance_percent double precision NOT NULL CHECK (capacitance_tolerance_percent > 0),
      temp_coefficient_percent_per_kelvin double precision NOT NULL,
      rated_life_hours integer NOT NULL CHECK (rated_life_hours > 0),
      rated_life_celsius double precision NOT NULL,
      watch_ratio double precision NOT NULL CHECK (watch_ratio > 0 AND watch_ratio <= 1),
      end_of_life_ratio double precision NOT NULL CHECK (end_of_life_ratio > 0),
      inspection_interval_days integer NOT NULL CHECK (inspection_interval_days > 0),
      change_note text NOT NULL DEFAULT '',
      created_by_id uuid REFERENCES users (id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (bank_design_id, revision),
      CHECK (end_of_life_ratio < watch_ratio)
    )`);
  await sql(`ALTER TABLE bank_designs ADD CONSTRAINT bank_designs_current_version_fk
    FOREIGN KEY (current_version_id) REFERENCES bank_design_versions (id) DEFERRABLE INITIALLY DEFERRED`);

  await sql(`
    CREATE TABLE banks (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      cabinet_id uuid NOT NULL REFERENCES cabinets (id),
      bank_design_id uuid NOT NULL REFERENCES bank_designs (id),
      position text NOT NULL,
      serial_number text NOT NULL DEFAULT '',
      installed_on date,
      notes text NOT NULL DEFAULT '',
      status text NOT NULL DEFAULT 'in-service' CHECK (status IN ('in-service', 'replaced', 'removed')),
      baseline_tau_seconds double precision NOT NULL CHECK (baseline_tau_seconds > 0),
      baseline_capacitance_microfarads double precision NOT NULL CHECK (baseline_capacitance_microfarads > 0),
      baseline_source text NOT NULL CHECK (baseline_source IN ('nameplate', 'decay-run', 'manual')),
      baseline_set_at timestamptz NOT NULL,
      baseline_set_by_id uuid REFERENCES users (id) ON DELETE SET NULL,
      baseline_design_version_id uuid REFERENCES bank_design_versions (id),
      -- the decay run that set a decay-run baseline (decay runs come with visits)
      baseline_decay_run_id uuid,
      baseline_note text NOT NULL DEFAULT '',
      replaces_bank_id uuid UNIQUE REFERENCES banks (id),
      replaced_by_bank_id uuid UNIQUE REFERENCES banks (id),
      replaced_on date,
      version integer NOT NULL DEFAULT 1,
      retired_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    )`);
  await sql('CREATE INDEX banks_cabinet ON banks (cabinet_id)');
  await sql('CREATE INDEX banks_design ON banks (bank_design_id)');
  // one bank in service per position of a cabinet
  await sql(`CREATE UNIQUE INDEX banks_position_in_service ON banks (cabinet_id, lower(position)) WHERE status = 'in-service'`);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable('banks');
  await qi.sequelize.query('ALTER TABLE bank_designs DROP CONSTRAINT bank_designs_current_version_fk');
  await qi.dropTable('bank_design_versions');
  await qi.dropTable('bank_designs');
};
