/**
 * The two database roles of Ebbline's own PostgreSQL (npm start, npm run dev, npm test, the
 * bench): an owner that owns the schema and runs the migrations, and the app's role, which is
 * neither superuser nor owner and so cannot rewrite the audit trail (api/src/db/app-role.ts
 * gives it its rights after every migration). The cluster's superuser (PG_USER) only makes
 * roles and databases.
 */
import pg from 'pg';
import { databaseUrl, ensureDatabase, type ClusterOptions } from './postgres';

/** A login role: name and password. */
export interface RoleLogin {
  user: string;
  password: string;
}

export interface DatabaseRoles {
  /** Owns the database, its schema and every table; migrations connect as it. */
  owner: RoleLogin;
  /** What the app connects as: ordinary rights, INSERT and SELECT only on the audit tables. */
  app: RoleLogin;
}

/** The connection URLs of one database: the app's and the migrations'. */
export interface DatabaseUrls {
  databaseUrl: string;
  migrationDatabaseUrl: string;
}

/** A role's URL for one database of the cluster. */
export function roleUrl(cluster: ClusterOptions, role: RoleLogin, database: string): string {
  return databaseUrl({ ...cluster, ...role }, database);
}

async function asSuperuser<T>(
  cluster: ClusterOptions,
  database: string,
  work: (client: pg.Client) => Promise<T>,
): Promise<T> {
  const client = new pg.Client({
    host: '127.0.0.1',
    port: cluster.port,
    user: cluster.user,
    password: cluster.password,
    database,
  });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

/** Creates a login role, or brings an existing one's password and limits in line. */
async function ensureRole(client: pg.Client, role: RoleLogin): Promise<void> {
  const name = client.escapeIdentifier(role.user);
  const found = await client.query('SELECT 1 FROM pg_roles WHERE rolname = $1', [role.user]);
  const verb = found.rowCount ? 'ALTER' : 'CREATE';
  await client.query(
    `${verb} ROLE ${name} LOGIN NOSUPERUSER NOCREATEDB NOCREATEROLE NOREPLICATION NOBYPASSRLS PASSWORD ${client.escapeLiteral(role.password)}`,
  );
}

/**
 * Hands every object of the public schema that the owner does not own yet to the owner: the
 * in-place upgrade of clusters made when Ebbline had one role (the superuser owned everything).
 * Objects of extensions (pg_trgm's functions) stay with the extension.
 */
const HAND_OVER_TO_OWNER = `
DO $$
DECLARE
  owner_role text := %OWNER%;
  item record;
BEGIN
  FOR item IN
    SELECT c.oid::regclass::text AS name, c.relkind
      FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
     WHERE n.nspname = 'public' AND c.relkind IN ('r', 'p', 'v', 'm', 'S')
       AND pg_get_userbyid(c.relowner) <> owner_role
       AND NOT EXISTS (SELECT 1 FROM pg_depend d WHERE d.classid = 'pg_class'::regclass AND d.objid = c.oid AND d.deptype IN ('e', 'a', 'i'))
  LOOP
    EXECUTE format('ALTER %s %s OWNER TO %I',
      CASE item.relkind WHEN 'v' THEN 'VIEW' WHEN 'm' THEN 'MATERIALIZED VIEW' WHEN 'S' THEN 'SEQUENCE' ELSE 'TABLE' END,
      item.name, owner_role);
  END LOOP;
  FOR item IN
    SELECT t.oid::regtype::text AS name
      FROM pg_type t JOIN pg_namespace n ON n.oid = t.typnamespace
     WHERE n.nspname = 'public' AND t.typtype IN ('e', 'd')
       AND pg_get_userbyid(t.typowner) <> owner_role
       AND NOT EXISTS (SELECT 1 FROM pg_depend d WHERE d.classid = 'pg_type'::regclass AND d.objid = t.oid AND d.deptype = 'e')
  LOOP
    EXECUTE format('ALTER TYPE %s OWNER TO %I', item.name, owner_role);
  END LOOP;
  FOR item IN
    SELECT p.oid::regprocedure::text AS name
      FROM pg_proc p JOIN pg_namespace n ON n.oid = p.pronamespace
     WHERE n.nspname = 'public'
       AND pg_get_userbyid(p.proowner) <> owner_role
       AND NOT EXISTS (SELECT 1 FROM pg_depend d WHERE d.classid = 'pg_proc'::regclass AND d.objid = p.oid AND d.deptype = 'e')
  LOOP
    EXECUTE format('ALTER ROUTINE %s OWNER TO %I', item.name, owner_role);
  END LOOP;
END $$`;

/**
 * Makes both roles (cluster-wide), the database owned by the owner role (a copy of `template`
 * when given), and upgrades a database of the one-role days in place. Idempotent: `npm start`
 * runs it at every start. The app's rights come after the migrations (api/src/db/app-role.ts).
 * @returns the app's and the migrations' connection URLs for the database
 */
export async function prepareDatabase(
  cluster: ClusterOptions,
  roles: DatabaseRoles,
  database: string,
  template?: string,
): Promise<DatabaseUrls> {
  await asSuperuser(cluster, 'postgres', async (client) => {
    await ensureRole(client, roles.owner);
    await ensureRole(client, roles.app);
  });
  await ensureDatabase(cluster, database, template, roles.owner.user);
  await asSuperuser(cluster, database, async (client) => {
    const db = client.escapeIdentifier(database);
    const owner = client.escapeIdentifier(roles.owner.user);
    await client.query(`ALTER DATABASE ${db} OWNER TO ${owner}`);
    // the owner creates the tables; nobody else creates anything in the schema
    await client.query(`GRANT USAGE, CREATE ON SCHEMA public TO ${owner}`);
    await client.query('REVOKE CREATE ON SCHEMA public FROM PUBLIC');
    await client.query(HAND_OVER_TO_OWNER.replace('%OWNER%', client.escapeLiteral(roles.owner.user)));
    await client.query(`GRANT CONNECT, TEMPORARY ON DATABASE ${db} TO ${client.escapeIdentifier(roles.app.user)}`);
  });
  return {
    databaseUrl: roleUrl(cluster, roles.app, database),
    migrationDatabaseUrl: roleUrl(cluster, roles.owner, database),
  };
}
