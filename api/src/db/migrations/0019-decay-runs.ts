import type { Migration } from '../migrator';

/**
 * Decay runs recorded at the cabinet: the raw readings exactly as sent, the safety checks
 * confirmed, the observations, and the verdict the server computed. A stored run is never
 * edited: a correction is a new row (version + 1) that supersedes it, at most once per version
 * (`supersedes_id` is unique: a linear chain). `client_id` is made on the phone, so a retried
 * submission finds its run; `body_sha256` tells a retry from a different body under the same id.
 * The figures beside the verdict (health, τ, ratio, safety finding) are copies of it, for lists
 * and the fleet.
 */
export const up: Migration = async ({ context: qi }) => {
  const sql = (text: string) => qi.sequelize.query(text);
  await sql(`
    CREATE TABLE decay_runs (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      client_id uuid NOT NULL,
      visit_id uuid NOT NULL REFERENCES visits (id),
      bank_id uuid NOT NULL REFERENCES banks (id),
      version integer NOT NULL DEFAULT 1 CHECK (version >= 1),
      supersedes_id uuid REFERENCES decay_runs (id),
      correction_reason text,
      source text NOT NULL CHECK (source IN ('guided', 'typed', 'logger')),
      logger_file_name text,
      isolated_at timestamptz NOT NULL,
      samples jsonb NOT NULL CHECK (jsonb_typeof(samples) = 'array' AND jsonb_array_length(samples) >= 1),
      safety jsonb NOT NULL CHECK (jsonb_typeof(safety) = 'object'),
      observations jsonb NOT NULL CHECK (jsonb_typeof(observations) = 'object'),
      verdict jsonb NOT NULL CHECK (jsonb_typeof(verdict) = 'object'),
      health text CHECK (health IN ('healthy', 'watch', 'end-of-life')),
      tau_seconds double precision CHECK (tau_seconds > 0),
      capacitance_ratio double precision CHECK (capacitance_ratio > 0),
      safety_finding boolean NOT NULL DEFAULT false,
      body_sha256 text NOT NULL CHECK (body_sha256 ~ '^[0-9a-f]{64}$'),
      review_state text NOT NULL DEFAULT 'pending' CHECK (review_state IN ('pending', 'accepted', 'queried')),
      review_comment text NOT NULL DEFAULT '',
      reviewed_by_id uuid REFERENCES users (id),
      reviewed_at timestamptz,
      recorded_by_id uuid NOT NULL REFERENCES users (id),
      recorded_at timestamptz NOT NULL,
      CONSTRAINT decay_runs_client_id_unique UNIQUE (client_id),
      -- a version is corrected at most once
      CONSTRAINT decay_runs_supersedes_unique UNIQUE (supersedes_id),
      -- version 1 supersedes nothing and has no reason; a correction names both
      CONSTRAINT decay_runs_correction CHECK (
        (version = 1 AND supersedes_id IS NULL AND correction_reason IS NULL)
        OR (version > 1 AND supersedes_id IS NOT NULL AND correction_reason IS NOT NULL AND correction_reason <> '')
      ),
      -- a reviewed run names who reviewed it and when; a pending one neither
      CONSTRAINT decay_runs_review CHECK (
        (review_state = 'pending' AND reviewed_at IS NULL)
        OR (review_state <> 'pending' AND reviewed_at IS NOT NULL)
      )
    )`);
  await sql('CREATE INDEX decay_runs_bank_recorded ON decay_runs (bank_id, recorded_at)');
  await sql('CREATE INDEX decay_runs_visit ON decay_runs (visit_id)');
  await sql("CREATE INDEX decay_runs_review_pending ON decay_runs (visit_id) WHERE review_state = 'pending'");
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable('decay_runs');
};
