// The database's two roles, set up as the superuser before the migrations run. `gusset_owner` owns the
// database and everything in it and runs the migrations; `gusset_app` is the login of the Next server,
// the worker and the seed, with only the privileges scripts/migrate.ts grants it after every run. Neither
// is a superuser: a superuser can switch off the audit trail's append-only triggers.
import { DATABASE_ROLES } from "./env.mjs";
import { psql } from "./postgres.mjs";
import { say } from "./processes.mjs";

const { owner, app } = DATABASE_ROLES;

/**
 * Creates the roles when missing and sets their attributes every time, so a role edited by hand is put
 * right. The app's role is a member of no other role: membership would let it SET ROLE to the owner.
 */
export function ensureDatabaseRoles(port) {
  const create = (role) => `DO $$ BEGIN CREATE ROLE ${role};
    EXCEPTION WHEN duplicate_object OR unique_violation THEN NULL; -- made already, or by a run beside this one
  END $$;`;
  psql(
    port,
    "postgres",
    `${create(owner)}
    ${create(app)}
    ALTER ROLE ${owner} WITH LOGIN NOSUPERUSER NOCREATEDB NOCREATEROLE NOREPLICATION NOBYPASSRLS;
    ALTER ROLE ${app} WITH LOGIN NOSUPERUSER NOCREATEDB NOCREATEROLE NOREPLICATION NOBYPASSRLS NOINHERIT;
    DO $$ DECLARE granted regrole; BEGIN
      FOR granted IN SELECT roleid::regrole FROM pg_auth_members WHERE member = '${app}'::regrole LOOP
        EXECUTE format('REVOKE %s FROM ${app}', granted);
      END LOOP;
    END $$;`,
  );
}

// Every object of the database that the owner role does not own, as the ALTER … OWNER TO statement that
// hands it over: the database, its own schemas (not `public` when pg_database_owner holds it, which
// follows the database), tables, partitions, views, sequences (those of a serial column move with their
// table), functions, and enums, domains and range types. Objects of extensions are left alone.
const HAND_OVER = `
  WITH ours AS (
    SELECT oid FROM pg_namespace
    WHERE nspname NOT LIKE 'pg\\_%' AND nspname <> 'information_schema'
  ), extension_member AS (
    SELECT classid, objid FROM pg_depend WHERE deptype = 'e'
  ), objects(kind, name, owner_oid, classid, objid) AS (
    SELECT 'DATABASE', quote_ident(datname), datdba, 'pg_database'::regclass, oid
      FROM pg_database WHERE datname = current_database()
    UNION ALL
    SELECT 'SCHEMA', quote_ident(nspname), nspowner, 'pg_namespace'::regclass, oid
      FROM pg_namespace WHERE oid IN (SELECT oid FROM ours) AND nspowner <> 'pg_database_owner'::regrole
    UNION ALL
    SELECT CASE c.relkind WHEN 'S' THEN 'SEQUENCE' WHEN 'v' THEN 'VIEW' WHEN 'm' THEN 'MATERIALIZED VIEW'
                          WHEN 'f' THEN 'FOREIGN TABLE' ELSE 'TABLE' END,
           c.oid::regclass::text, c.relowner, 'pg_class'::regclass, c.oid
      FROM pg_class c
      WHERE c.relnamespace IN (SELECT oid FROM ours) AND c.relkind IN ('r', 'p', 'v', 'm', 'f', 'S')
        AND NOT (c.relkind = 'S' AND EXISTS (SELECT FROM pg_depend d WHERE d.classid = 'pg_class'::regclass
                   AND d.objid = c.oid AND d.refclassid = 'pg_class'::regclass AND d.deptype IN ('a', 'i')))
    UNION ALL
    SELECT 'ROUTINE', p.oid::regprocedure::text, p.proowner, 'pg_proc'::regclass, p.oid
      FROM pg_proc p WHERE p.pronamespace IN (SELECT oid FROM ours)
    UNION ALL
    SELECT CASE t.typtype WHEN 'd' THEN 'DOMAIN' ELSE 'TYPE' END, t.oid::regtype::text, t.typowner, 'pg_type'::regclass, t.oid
      FROM pg_type t
      WHERE t.typnamespace IN (SELECT oid FROM ours)
        AND (t.typtype IN ('e', 'd', 'r')
             OR (t.typtype = 'c' AND (SELECT relkind FROM pg_class WHERE oid = t.typrelid) = 'c'))
  )
  SELECT format('ALTER %s %s OWNER TO ${owner}', kind, name) AS statement
  FROM objects o
  WHERE owner_oid <> '${owner}'::regrole
    AND NOT EXISTS (SELECT FROM extension_member e WHERE e.classid = o.classid AND e.objid = o.objid)`;

/**
 * Hands the database and everything in it to the owner role. A database made before the roles existed
 * (a checkout's `.gusset/` from an earlier run) belongs to `postgres`, object by object; `REASSIGN OWNED
 * BY postgres` is refused for the bootstrap superuser, so each object is altered on its own. Does nothing
 * when the owner has everything already.
 */
export function handDatabaseToOwner(port, database) {
  const pending = Number(psql(port, database, `SELECT count(*) FROM (${HAND_OVER}) pending`).stdout.trim());
  if (pending === 0) return 0;
  psql(
    port,
    database,
    `DO $$ DECLARE statement text; BEGIN
      FOR statement IN ${HAND_OVER} LOOP EXECUTE statement; END LOOP;
    END $$;`,
  );
  say(`handed ${pending} object(s) of database ${database} to the ${owner} role`);
  return pending;
}
