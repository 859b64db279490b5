// The two database roles of a Fanbound database, set up by a superuser (the
// start and test scripts do it on their own PostgreSQL):
//
// - the owner role owns the database and every table; migrations run as it;
// - the app role is what the server connects as: SELECT, INSERT, UPDATE and
//   DELETE on the tables and USAGE on sequences, nothing else. It is no
//   superuser and owns nothing, so it can neither TRUNCATE, nor set
//   session_replication_role, nor drop or alter a table or its triggers.
//
// Tables the owner creates later get the app's grants through ALTER DEFAULT
// PRIVILEGES; a migration that wants less for a table (revisions: no UPDATE
// or DELETE) revokes it there. Only Node built-ins and pg here.
//
// As a command, for a server of your own (the role names are the defaults below):
//   FANBOUND_DB_ADMIN_URL=postgres://admin@host/postgres node lib/db/roles.mjs DATABASE
import { pathToFileURL } from "node:url";

/** Default role names: the owner runs migrations, the app serves requests. */
export const ROLES = { owner: "fanbound_owner", app: "fanbound_app" };

const ident = (s) => `"${String(s).replace(/"/g, '""')}"`;

/**
 * Creates the roles when missing (LOGIN, no superuser, no CREATEDB or
 * CREATEROLE), creates the database owned by the owner role when missing,
 * hands every object of the public schema that another role owns to the owner
 * (databases made before the roles existed), and sets the app role's grants.
 * `adminUrl` must reach the server as a superuser (or a role with CREATEROLE
 * that may create databases); its path names any database but `database`.
 * @returns {Promise<{ created: boolean, adopted: number }>}
 */
export async function prepareDatabase(adminUrl, database, roles = ROLES) {
  const { default: pg } = await import("pg");
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  let created = false;
  try {
    for (const role of [roles.owner, roles.app]) {
      const r = await admin.query("SELECT 1 FROM pg_roles WHERE rolname = $1", [role]);
      if (r.rowCount === 0) {
        await admin.query(`CREATE ROLE ${ident(role)} LOGIN NOSUPERUSER NOCREATEDB NOCREATEROLE NOREPLICATION NOBYPASSRLS`);
      }
    }
    const db = await admin.query("SELECT 1 FROM pg_database WHERE datname = $1", [database]);
    if (db.rowCount === 0) {
      await admin.query(`CREATE DATABASE ${ident(database)} OWNER ${ident(roles.owner)}`);
      created = true;
    } else {
      await admin.query(`ALTER DATABASE ${ident(database)} OWNER TO ${ident(roles.owner)}`);
    }
  } finally {
    await admin.end();
  }

  const url = new URL(adminUrl);
  url.pathname = `/${encodeURIComponent(database)}`;
  const client = new pg.Client({ connectionString: url.toString() });
  await client.connect();
  try {
    const owner = ident(roles.owner);
    const app = ident(roles.app);
    const adopted = await adopt(client, roles.owner);
    await client.query(`REVOKE CREATE ON SCHEMA public FROM PUBLIC`);
    await client.query(`GRANT USAGE, CREATE ON SCHEMA public TO ${owner}`);
    await client.query(`GRANT USAGE ON SCHEMA public TO ${app}`);
    await client.query(`REVOKE CREATE ON SCHEMA public FROM ${app}`);
    await client.query(`GRANT CONNECT, TEMPORARY ON DATABASE ${ident(database)} TO ${app}`);
    await client.query(`ALTER DEFAULT PRIVILEGES FOR ROLE ${owner} IN SCHEMA public GRANT SELECT, INSERT, UPDATE, DELETE ON TABLES TO ${app}`);
    await client.query(`ALTER DEFAULT PRIVILEGES FOR ROLE ${owner} IN SCHEMA public GRANT USAGE ON SEQUENCES TO ${app}`);
    if (adopted > 0) {
      // Tables made before the roles existed missed the default privileges.
      // Later migrations narrow them where a table needs less (revisions).
      await client.query(`GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA public TO ${app}`);
      await client.query(`GRANT USAGE ON ALL SEQUENCES IN SCHEMA public TO ${app}`);
      for (const records of ["revisions", "library_revisions", "library_approvals", "revision_libraries"]) {
        await client.query(`REVOKE UPDATE, DELETE, TRUNCATE ON TABLE ${ident(records)} FROM ${app}`).catch(() => {});
      }
      await client.query(`REVOKE UPDATE, DELETE, TRUNCATE ON TABLE review_decisions, review_comments, review_reviewers FROM ${app}`).catch(() => {});
      await client.query(`REVOKE DELETE, TRUNCATE ON TABLE reviews FROM ${app}`).catch(() => {});
      await client.query(`REVOKE UPDATE, DELETE, TRUNCATE ON TABLE activity FROM ${app}`).catch(() => {});
      await client.query(`REVOKE ALL ON TABLE "SequelizeMeta" FROM ${app}`).catch(() => {});
    }
    return { created, adopted };
  } finally {
    await client.end();
  }
}

/** Gives the owner role every table, view, sequence, function and type of the public schema; returns how many moved. */
async function adopt(client, owner) {
  const r = await client.query(
    `SELECT format('ALTER %s %s OWNER TO %I',
              CASE c.relkind WHEN 'S' THEN 'SEQUENCE' WHEN 'v' THEN 'VIEW' WHEN 'm' THEN 'MATERIALIZED VIEW' ELSE 'TABLE' END,
              c.oid::regclass, $1::text) AS sql
       FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
      WHERE n.nspname = 'public' AND c.relkind IN ('r', 'p', 'v', 'm', 'S') AND pg_get_userbyid(c.relowner) <> $1
        AND NOT (c.relkind = 'S' AND EXISTS (SELECT 1 FROM pg_depend d WHERE d.objid = c.oid AND d.deptype IN ('a', 'i')))
     UNION ALL
     SELECT format('ALTER FUNCTION %s OWNER TO %I', p.oid::regprocedure, $1::text)
       FROM pg_proc p JOIN pg_namespace n ON n.oid = p.pronamespace
      WHERE n.nspname = 'public' AND pg_get_userbyid(p.proowner) <> $1
     UNION ALL
     SELECT format('ALTER TYPE %s OWNER TO %I', t.oid::regtype, $1::text)
       FROM pg_type t JOIN pg_namespace n ON n.oid = t.typnamespace
      WHERE n.nspname = 'public' AND t.typtype IN ('e', 'c', 'd') AND t.typrelid = 0 AND pg_get_userbyid(t.typowner) <> $1`,
    [owner],
  );
  for (const { sql } of r.rows) await client.query(sql);
  return r.rowCount ?? 0;
}

/** A connection URL for `role` on the server and database of `url` (no password: the local server trusts loopback). */
export function urlForRole(url, role) {
  const u = new URL(url);
  u.username = role;
  u.password = "";
  return u.toString();
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href) {
  const adminUrl = process.env.FANBOUND_DB_ADMIN_URL;
  const database = process.argv[2];
  if (!adminUrl || !database) {
    console.error("usage: FANBOUND_DB_ADMIN_URL=postgres://admin@host/postgres node lib/db/roles.mjs DATABASE");
    process.exit(2);
  }
  const { created, adopted } = await prepareDatabase(adminUrl, database);
  console.log(`${database}: ${created ? "created" : "exists"}; owner ${ROLES.owner}, app ${ROLES.app}; ${adopted} objects handed to the owner`);
}
