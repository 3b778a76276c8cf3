import type { Sequelize } from 'sequelize';

/**
 * Tables the app may only add to and read: the register's audit trail and the sign-in log.
 * Nobody connected as the app can change or delete what they record.
 */
export const APPEND_ONLY_TABLES = ['audit_entries', 'access_events'] as const;

/** The role name in a postgres:// URL. */
export function roleOf(databaseUrl: string): string {
  return decodeURIComponent(new URL(databaseUrl).username);
}

/**
 * Gives the app's role its rights, connected as the owner: ordinary rights (read, add, change,
 * delete) on every table and sequence of the schema, now and for tables that later migrations
 * add (default privileges of the owner), but only INSERT and SELECT on the append-only tables
 * and only SELECT on the migrations' own record. Never TRUNCATE, never ownership. Run after
 * every migration, so a table added since is covered too.
 */
export async function grantAppRole(owner: Sequelize, appRole: string): Promise<void> {
  const qi = owner.getQueryInterface();
  const q = (name: string) => qi.quoteIdentifier(name);
  const app = q(appRole);
  const statements = [
    `GRANT USAGE ON SCHEMA public TO ${app}`,
    `GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA public TO ${app}`,
    `GRANT USAGE, SELECT ON ALL SEQUENCES IN SCHEMA public TO ${app}`,
    `ALTER DEFAULT PRIVILEGES IN SCHEMA public GRANT SELECT, INSERT, UPDATE, DELETE ON TABLES TO ${app}`,
    `ALTER DEFAULT PRIVILEGES IN SCHEMA public GRANT USAGE, SELECT ON SEQUENCES TO ${app}`,
    `REVOKE UPDATE, DELETE, TRUNCATE, REFERENCES, TRIGGER ON ${APPEND_ONLY_TABLES.map((t) => q(t)).join(', ')} FROM ${app}, PUBLIC`,
    `REVOKE INSERT, UPDATE, DELETE, TRUNCATE ON schema_migrations FROM ${app}, PUBLIC`,
  ];
  // the job queue's rows (pg-boss, migration 0017): ordinary rights, never its tables
  const [queueSchema] = (await owner.query(
    `SELECT 1 FROM pg_namespace WHERE nspname = 'pgboss'`,
  )) as [unknown[], unknown];
  if (queueSchema.length > 0) {
    statements.push(
      `GRANT USAGE ON SCHEMA pgboss TO ${app}`,
      `GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA pgboss TO ${app}`,
      `ALTER DEFAULT PRIVILEGES IN SCHEMA pgboss GRANT SELECT, INSERT, UPDATE, DELETE ON TABLES TO ${app}`,
    );
  }
  await owner.transaction(async (transaction) => {
    for (const sql of statements) await owner.query(sql, { transaction });
  });
}

/** What the app's role may be, checked after migrating: never a superuser, never an owner. */
export async function appRoleProblems(owner: Sequelize, appRole: string): Promise<string[]> {
  const [rows] = (await owner.query(
    `SELECT r.rolsuper AS superuser,
            (SELECT count(*)::int FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
              WHERE n.nspname = 'public' AND c.relowner = r.oid) AS owned
       FROM pg_roles r WHERE r.rolname = :appRole`,
    { replacements: { appRole } },
  )) as [Array<{ superuser: boolean; owned: number }>, unknown];
  const role = rows[0];
  if (!role) return [`the app's role "${appRole}" does not exist: create it (LOGIN, no superuser)`];
  const problems: string[] = [];
  if (role.superuser) problems.push(`the app's role "${appRole}" is a superuser`);
  if (role.owned > 0) problems.push(`the app's role "${appRole}" owns ${role.owned} table(s) or sequence(s)`);
  return problems;
}
