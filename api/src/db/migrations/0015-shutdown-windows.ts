import type { Migration } from '../migrator';

/**
 * Shutdown windows: the times an area's drives are de-energised, when decay runs can be made.
 * `starts_at` / `ends_at` are the first occurrence; `recurrence` is an RRULE body without
 * DTSTART (`FREQ=WEEKLY;BYDAY=SA;COUNT=8`), expanded in the site's time zone so every
 * occurrence keeps the first one's local wall-clock start and its duration; null is a one-off.
 */
export const up: Migration = async ({ context: qi }) => {
  const sql = (text: string) => qi.sequelize.query(text);
  await sql(`
    CREATE TABLE shutdown_windows (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      area_id uuid NOT NULL REFERENCES areas (id),
      title text NOT NULL,
      starts_at timestamptz NOT NULL,
      ends_at timestamptz NOT NULL CHECK (ends_at > starts_at),
      recurrence text,
      notes text NOT NULL DEFAULT '',
      version integer NOT NULL DEFAULT 1,
      retired_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    )`);
  await sql('CREATE INDEX shutdown_windows_area ON shutdown_windows (area_id)');
  await sql('CREATE INDEX shutdown_windows_starts ON shutdown_windows (starts_at)');
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable('shutdown_windows');
};
