import type { Migration } from '../migrator';

/**
 * Sites → areas → cabinets. Every register table carries `version` (optimistic concurrency:
 * a write names the version it read) and `retired_at` (soft delete: retired records stay).
 * Tags are searched by trigram (pg_trgm) so a search for part of a tag stays fast on a large fleet.
 */
export const up: Migration = async ({ context: qi }) => {
  const sql = (text: string) => qi.sequelize.query(text);
  await sql('CREATE EXTENSION IF NOT EXISTS pg_trgm');
  await sql(`
    CREATE TABLE sites (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL,
      code text NOT NULL,
      address text NOT NULL DEFAULT '',
      time_zone text NOT NULL,
      version integer NOT NULL DEFAULT 1,
      retired_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    )`);
  await sql('CREATE UNIQUE INDEX sites_code_in_use ON sites (lower(code)) WHERE retired_at IS NULL');
  await sql('CREATE UNIQUE INDEX sites_name_in_use ON sites (lower(name)) WHERE retired_at IS NULL');

  await sql(`
    CREATE TABLE areas (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      site_id uuid NOT NULL REFERENCES sites (id),
      name text NOT NULL,
      description text NOT NULL DEFAULT '',
      version integer NOT NULL DEFAULT 1,
      retired_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    )`);
  await sql('CREATE INDEX areas_site ON areas (site_id)');
  await sql('CREATE UNIQUE INDEX areas_name_in_use ON areas (site_id, lower(name)) WHERE retired_at IS NULL');

  await sql(`
    CREATE TABLE cabinets (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      area_id uuid NOT NULL REFERENCES areas (id),
      tag text NOT NULL,
      location text NOT NULL DEFAULT '',
      drive_make text NOT NULL DEFAULT '',
      drive_model text NOT NULL DEFAULT '',
      supply_volts double precision NOT NULL CHECK (supply_volts > 0),
      dc_bus_volts double precision CHECK (dc_bus_volts > 0),
      rated_power_kilowatts double precision CHECK (rated_power_kilowatts > 0),
      marked_wait_minutes integer CHECK (marked_wait_minutes >= 0),
      criticality text NOT NULL DEFAULT 'medium' CHECK (criticality IN ('low', 'medium', 'high', 'critical')),
      environment_notes text NOT NULL DEFAULT '',
      commissioned_on date,
      status text NOT NULL DEFAULT 'in-service' CHECK (status IN ('in-service', 'out-of-service', 'retired')),
      version integer NOT NULL DEFAULT 1,
      retired_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    )`);
  // one cabinet in use per tag; a retired cabinet's tag may be used again
  await sql('CREATE UNIQUE INDEX cabinets_tag_in_use ON cabinets (lower(tag)) WHERE retired_at IS NULL');
  // the list's default order (tag, then id for a stable page) and its tag search
  await sql('CREATE INDEX cabinets_tag_order ON cabinets (tag, id)');
  await sql('CREATE INDEX cabinets_tag_trgm ON cabinets USING gin (tag gin_trgm_ops)');
  await sql('CREATE INDEX cabinets_area ON cabinets (area_id)');
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable('cabinets');
  await qi.dropTable('areas');
  await qi.dropTable('sites');
};
