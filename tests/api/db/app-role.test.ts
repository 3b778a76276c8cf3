/**
 * The app's database role (DATABASE_URL): neither superuser nor owner, only INSERT and SELECT
 * on the audit trail and the sign-in log, ordinary rights elsewhere, tables of later migrations
 * included. Each statement runs in its own connection, as the app's role.
 */
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { APPEND_ONLY_TABLES } from '../../../api/src/db/app-role';
import { ownerUrlOf } from '../../support/test-cluster';

const appUrl = process.env.DATABASE_URL as string;
const app = new pg.Client({ connectionString: appUrl });

/** The SQLSTATE of a statement run as the app, or 'ok'. */
async function outcome(sql: string, params: unknown[] = []): Promise<string> {
  try {
    await app.query(sql, params);
    return 'ok';
  } catch (err) {
    return (err as { code?: string }).code ?? String(err);
  }
}

async function asOwner(sql: string): Promise<void> {
  const owner = new pg.Client({ connectionString: ownerUrlOf(appUrl) });
  await owner.connect();
  try {
    await owner.query(sql);
  } finally {
    await owner.end();
  }
}

beforeAll(async () => {
  await app.connect();
  await app.query(
    `INSERT INTO audit_entries (entity_type, entity_id, action, summary) VALUES ('site', gen_random_uuid(), 'create', 'a test entry')`,
  );
  await app.query(
    `INSERT INTO access_events (id, kind, login, detail, created_at) VALUES (gen_random_uuid(), 'sign-in-failed', 'rurik', '{}', now())`,
  );
});

afterAll(async () => {
  await app.end();
});

describe('the append-only tables, as the app', () => {
  it.each(APPEND_ONLY_TABLES)('when it reads and adds to %s, then both work', async (table) => {
    const { rows } = await app.query<{ n: number }>(`SELECT count(*)::int AS n FROM ${table}`);
    expect(rows[0]!.n).toBeGreaterThan(0);
  });

  it.each(APPEND_ONLY_TABLES)(
    'when it changes, deletes or truncates rows of %s, then PostgreSQL refuses (42501) and the rows stay',
    async (table) => {
      const before = (await app.query<{ n: number }>(`SELECT count(*)::int AS n FROM ${table}`)).rows[0]!.n;
      const column = table === 'audit_entries' ? 'summary' : 'login';
      expect(await outcome(`UPDATE ${table} SET ${column} = 'rewritten'`)).toBe('42501');
      expect(await outcome(`DELETE FROM ${table}`)).toBe('42501');
      expect(await outcome(`TRUNCATE ${table}`)).toBe('42501');
      expect(await outcome(`ALTER TABLE ${table} DISABLE TRIGGER ALL`)).toBe('42501');
      expect(await outcome(`DROP TABLE ${table}`)).toBe('42501');
      const after = (await app.query<{ n: number }>(`SELECT count(*)::int AS n FROM ${table}`)).rows[0]!.n;
      expect(after).toBe(before);
      const rewritten = await app.query(`SELECT 1 FROM ${table} WHERE ${column} = 'rewritten'`);
      expect(rewritten.rowCount).toBe(0);
    },
  );

  it('when it tries to grant itself the rights back, then nothing is granted', async () => {
    // a non-owner's GRANT grants nothing (PostgreSQL warns rather than fails)
    await outcome('GRANT UPDATE, DELETE ON audit_entries TO CURRENT_USER');
    expect(await outcome('UPDATE audit_entries SET summary = $1', ['x'])).toBe('42501');
    expect(await outcome('DELETE FROM audit_entries')).toBe('42501');
  });
});

describe('the app role itself', () => {
  it('when its attributes are read, then it is neither superuser nor able to make roles or databases', async () => {
    const { rows } = await app.query(
      'SELECT rolsuper, rolcreaterole, rolcreatedb, rolbypassrls FROM pg_roles WHERE rolname = current_user',
    );
    expect(rows[0]).toEqual({ rolsuper: false, rolcreaterole: false, rolcreatedb: false, rolbypassrls: false });
  });

  it('when ownership is looked up, then it owns no table, sequence, type, function or the database', async () => {
    const { rows } = await app.query<{ n: number }>(
      `SELECT ((SELECT count(*) FROM pg_class WHERE relowner = r.oid)
            + (SELECT count(*) FROM pg_type WHERE typowner = r.oid)
            + (SELECT count(*) FROM pg_proc WHERE proowner = r.oid)
            + (SELECT count(*) FROM pg_namespace WHERE nspowner = r.oid)
            + (SELECT count(*) FROM pg_database WHERE datdba = r.oid))::int AS n
         FROM pg_roles r WHERE r.rolname = current_user`,
    );
    expect(rows[0]!.n).toBe(0);
    const { rows: owners } = await app.query<{ tableowner: string }>(
      "SELECT DISTINCT tableowner FROM pg_tables WHERE schemaname = 'public'",
    );
    expect(owners.map((o) => o.tableowner)).not.toContain(new URL(appUrl).username);
    expect(owners.length).toBeGreaterThan(0);
  });

  it('when it tries to create a table or change the migrations record, then PostgreSQL refuses', async () => {
    expect(await outcome('CREATE TABLE intruder (id int)')).toBe('42501');
    expect(await outcome("DELETE FROM schema_migrations WHERE name LIKE '0013%'")).toBe('42501');
    expect(await outcome('SELECT name FROM schema_migrations')).toBe('ok');
  });
});

describe('ordinary rights elsewhere', () => {
  it('when it writes the sessions, the provider records and the failed attempts, then it may change and delete them', async () => {
    expect(
      await outcome(
        "INSERT INTO sessions (sid, sess, expire) VALUES ('role-test', '{}', now() + interval '1 hour')",
      ),
    ).toBe('ok');
    expect(await outcome("UPDATE sessions SET expire = now() WHERE sid = 'role-test'")).toBe('ok');
    expect(await outcome("DELETE FROM sessions WHERE sid = 'role-test'")).toBe('ok');
    expect(
      await outcome(
        "INSERT INTO identity_provider_records (model, id, payload) VALUES ('Session', 'role-test', '{}')",
      ),
    ).toBe('ok');
    expect(await outcome("DELETE FROM identity_provider_records WHERE id = 'role-test'")).toBe('ok');
    expect(await outcome("INSERT INTO identity_sign_in_failures (key) VALUES ('login:role-test')")).toBe('ok');
    expect(await outcome("DELETE FROM identity_sign_in_failures WHERE key = 'login:role-test'")).toBe('ok');
  });

  it('when the owner adds a table later (a new migration), then the app may use it at once, through its sequence too', async () => {
    await asOwner('CREATE TABLE later_table (id bigserial PRIMARY KEY, note text)');
    expect(await outcome("INSERT INTO later_table (note) VALUES ('new')")).toBe('ok');
    expect(await outcome("UPDATE later_table SET note = 'changed'")).toBe('ok');
    expect(await outcome('DELETE FROM later_table')).toBe('ok');
    expect(await outcome('TRUNCATE later_table')).toBe('42501');
  });
});
