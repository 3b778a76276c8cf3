import type { Migration } from '../migrator';

/**
 * Where a person works and how many hours a week they can give to visits.
 * - `person_sites`: the sites a person (a technician) works at. A technician reads every visit
 *   of their sites; one with no rows here has no sites and reads only the visits assigned to them.
 * - `users.available_hours_per_week`: the hours a technician is available for visits in a week,
 *   against which the Planner's week view sets the hours planned (0–80, a full week of 37.5 h
 *   by default).
 */
export const up: Migration = async ({ context: qi }) => {
  const sql = (text: string) => qi.sequelize.query(text);
  await sql(`
    CREATE TABLE person_sites (
      user_id uuid NOT NULL REFERENCES users (id) ON DELETE CASCADE,
      site_id uuid NOT NULL REFERENCES sites (id),
      PRIMARY KEY (user_id, site_id)
    )`);
  await sql('CREATE INDEX person_sites_site ON person_sites (site_id)');
  await sql(`
    ALTER TABLE users
      ADD COLUMN available_hours_per_week numeric(5,1) NOT NULL DEFAULT 37.5
        CHECK (available_hours_per_week BETWEEN 0 AND 80)`);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query('ALTER TABLE users DROP COLUMN available_hours_per_week');
  await qi.dropTable('person_sites');
};
