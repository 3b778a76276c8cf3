import type { Migration } from '../migrator';

/**
 * Photos of a visit (and optionally of one of its banks). The image files live in the photo
 * store (api/src/storage, a folder outside the web root) under generated names: `storage_key`
 * is the full-size JPEG, `thumbnail_key` its thumbnail; both re-encoded with no metadata. A
 * photo is made once per `client_id` (the browser's id for it), so a repeated upload finds it.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE photos (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      client_id uuid NOT NULL CONSTRAINT photos_client_id_in_use UNIQUE,
      visit_id uuid NOT NULL REFERENCES visits (id),
      bank_id uuid REFERENCES banks (id),
      caption text NOT NULL DEFAULT '',
      storage_key text NOT NULL UNIQUE,
      thumbnail_key text NOT NULL UNIQUE,
      width_px integer NOT NULL CHECK (width_px > 0),
      height_px integer NOT NULL CHECK (height_px > 0),
      bytes integer NOT NULL CHECK (bytes > 0),
      taken_by_id uuid NOT NULL REFERENCES users (id),
      created_at timestamptz NOT NULL
    );
    CREATE INDEX photos_visit ON photos (visit_id, created_at DESC);
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable('photos');
};
