/**
 * The two database roles. The OWNER owns every table, runs migrations, backup and restore. The
 * RUNTIME role is what the app and the workers log in as: not a superuser, owns nothing, holds no
 * TRIGGER or TRUNCATE privilege (so it can neither create nor disable triggers, nor empty a
 * table), cannot set session_replication_role (a superuser-only setting), and has per table
 * only the privileges listed in TABLE_GRANTS (everything else: SELECT, INSERT, UPDATE, DELETE).
 *
 * applyRuntimeGrants(owner, role) makes the grants match this policy for every table in the
 * schemas `public` and `pgboss`; it runs after every migration (lib/server/db/prepare.ts), so a
 * table added by a new migration gets its grants on the next start.
 */
import type pg from "pg";

/** The runtime login of the embedded database (a managed server may use any name). */
export const RUNTIME_ROLE = "heatbook_runtime";

type Privilege = "SELECT" | "INSERT" | "UPDATE" | "DELETE";

/**
 * Tables whose runtime privileges are narrower than read-write. Append-only tables (rows are
 * added and read, never changed or removed by the app; removal by a cascade runs as the owner)
 * get INSERT and SELECT. Absent from the map: SELECT, INSERT, UPDATE, DELETE.
 */
export const TABLE_GRANTS: Readonly<Record<string, readonly Privilege[]>> = {
  AuditEvent: ["SELECT", "INSERT"],
  ReviewDecision: ["SELECT", "INSERT"],
  // Filled by the sealing trigger, which runs with the privileges of the role that seals.
  RevisionMeasurement: ["SELECT", "INSERT"],
  // Original files are kept as uploaded.
  StoredFile: ["SELECT", "INSERT"],
  // Written once by the start-up upgrade (as the owner); the app only reads it.
  AuditChainUpgrade: ["SELECT"],
  // Migration bookkeeping: the app has no business there.
  _prisma_migrations: [],
};

const READ_WRITE: readonly Privilege[] = ["SELECT", "INSERT", "UPDATE", "DELETE"];

const ident = (name: string) => `"${name.replace(/"/g, '""')}"`;

/** Create the runtime login if missing (or reset its password and attributes). Needs CREATEROLE or a superuser. */
export async function ensureRuntimeRole(client: pg.Client, name: string, password: string): Promise<void> {
  const exists = await client.query("SELECT 1 FROM pg_roles WHERE rolname = $1", [name]);
  const attributes = `LOGIN NOSUPERUSER NOCREATEDB NOCREATEROLE NOREPLICATION NOBYPASSRLS PASSWORD ${client.escapeLiteral(password)}`;
  await client.query(`${exists.rowCount ? "ALTER" : "CREATE"} ROLE ${ident(name)} WITH ${attributes}`);
}

/**
 * Make the runtime role's privileges in the connected database match the policy: CONNECT only
 * on the database (no CREATE, no TEMPORARY), USAGE on the schemas, per-table privileges from
 * TABLE_GRANTS, USAGE and SELECT on sequences (ids), EXECUTE on pg-boss's functions. Run as the
 * owner, in the database to set up. Refuses a runtime role that is a superuser.
 */
export async function applyRuntimeGrants(owner: pg.Client, role: string): Promise<void> {
  const r = ident(role);
  const attrs = await owner.query<{ rolsuper: boolean; rolbypassrls: boolean }>("SELECT rolsuper, rolbypassrls FROM pg_roles WHERE rolname = $1", [role]);
  if (!attrs.rowCount) throw new Error(`the runtime role ${role} does not exist (create it first; see README "Security model")`);
  if (attrs.rows[0]!.rolsuper || attrs.rows[0]!.rolbypassrls) throw new Error(`the runtime role ${role} is a superuser (or bypasses row security): give the app a role of its own (README "Security model")`);
  const db = (await owner.query<{ d: string }>("SELECT current_database() AS d")).rows[0]!.d;
  await owner.query("BEGIN");
  try {
    await owner.query(`REVOKE ALL ON DATABASE ${ident(db)} FROM PUBLIC`);
    await owner.query(`REVOKE ALL ON DATABASE ${ident(db)} FROM ${r}`);
    await owner.query(`GRANT CONNECT ON DATABASE ${ident(db)} TO ${r}`);
    await owner.query(`REVOKE CREATE ON SCHEMA public FROM PUBLIC`);
    const schemas = (await owner.query<{ nspname: string }>(`SELECT nspname FROM pg_namespace WHERE nspname IN ('public', 'pgboss')`)).rows.map((x) => x.nspname);
    for (const s of schemas) {
      await owner.query(`REVOKE ALL ON SCHEMA ${ident(s)} FROM ${r}`);
      await owner.query(`GRANT USAGE ON SCHEMA ${ident(s)} TO ${r}`);
      await owner.query(`REVOKE ALL ON ALL TABLES IN SCHEMA ${ident(s)} FROM ${r}`);
      await owner.query(`REVOKE ALL ON ALL SEQUENCES IN SCHEMA ${ident(s)} FROM ${r}`);
      await owner.query(`GRANT USAGE, SELECT ON ALL SEQUENCES IN SCHEMA ${ident(s)} TO ${r}`);
    }
    const tables = await owner.query<{ schema: string; name: string }>(
      `SELECT n.nspname AS schema, c.relname AS name FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
       WHERE c.relkind IN ('r', 'p') AND n.nspname = ANY($1) ORDER BY 1, 2`, [schemas]);
    for (const t of tables.rows) {
      const privileges = t.schema === "public" ? (TABLE_GRANTS[t.name] ?? READ_WRITE) : READ_WRITE;
      if (privileges.length) await owner.query(`GRANT ${privileges.join(", ")} ON ${ident(t.schema)}.${ident(t.name)} TO ${r}`);
    }
    if (schemas.includes("pgboss")) await owner.query(`GRANT EXECUTE ON ALL FUNCTIONS IN SCHEMA pgboss TO ${r}`);
    await owner.query("COMMIT");
  } catch (err) {
    await owner.query("ROLLBACK");
    throw err;
  }
}

export interface RoleCheck {
  ok: boolean;
  problems: string[];
}

/** Is the role connected on `client` fit to be the runtime role? (not a superuser, owns no table, no TRIGGER/TRUNCATE) */
export async function checkRuntimeRole(client: pg.Client): Promise<RoleCheck> {
  const problems: string[] = [];
  const me = (await client.query<{ u: string; sup: boolean }>("SELECT current_user AS u, rolsuper AS sup FROM pg_roles WHERE rolname = current_user")).rows[0]!;
  if (me.sup) problems.push(`${me.u} is a superuser`);
  const owned = await client.query<{ name: string }>(
    `SELECT c.relname AS name FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
     WHERE c.relowner = (SELECT oid FROM pg_roles WHERE rolname = current_user) AND n.nspname IN ('public', 'pgboss') AND c.relkind IN ('r', 'p') LIMIT 3`);
  if (owned.rowCount) problems.push(`${me.u} owns tables (${owned.rows.map((x) => x.name).join(", ")})`);
  const powers = await client.query<{ name: string }>(
    `SELECT c.relname AS name FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
     WHERE n.nspname = 'public' AND c.relkind = 'r' AND (has_table_privilege(c.oid, 'TRIGGER') OR has_table_privilege(c.oid, 'TRUNCATE')) LIMIT 3`);
  if (powers.rowCount) problems.push(`${me.u} may create triggers on or truncate ${powers.rows.map((x) => x.name).join(", ")}`);
  return { ok: problems.length === 0, problems };
}
