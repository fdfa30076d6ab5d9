/**
 * Shared steps of the app's route handlers: the signed-in user, the group membership from the
 * route's slug, multipart file reading with a size cap, and the same-origin check on writes.
 */
import { getDb, sqlRows, type Db } from "./db/client";
import { requireUser, sessionClaims } from "./session";
import { liveSessionSql } from "./auth/sessions";
import { groupWhere, type Member } from "./access";
import type { Role } from "./permissions";
import { uuidOrNone } from "./ids";
import { ForbiddenError, InputError, NotFoundError, PayloadTooLargeError, UnauthenticatedError } from "../engine/errors";
import { assertCleanText, parseJsonText, readBodyLimited } from "./body";
import { MAX_UPLOAD_BYTES } from "./measurements";
import type { UserInfo } from "./users";

export interface GroupContext {
  db: Db;
  user: UserInfo;
  member: Member;
}

/** Writes must come from our own pages (or a client without an Origin header, e.g. scripts). */
export function assertSameOrigin(req: Request): void {
  const origin = req.headers.get("origin");
  if (!origin) return;
  const host = req.headers.get("x-forwarded-host") ?? req.headers.get("host");
  let originHost: string;
  try {
    originHost = new URL(origin).host;
  } catch {
    throw new ForbiddenError("cross-site request refused");
  }
  if (originHost !== host) throw new ForbiddenError("cross-site request refused");
}

export async function signedIn(req: Request): Promise<{ db: Db; user: UserInfo }> {
  if (req.method !== "GET" && req.method !== "HEAD") assertSameOrigin(req);
  const user = await requireUser();
  return { db: getDb(), user };
}

/**
 * SQL for one more value read in the same statement as the membership (see inGroupWith): a
 * scalar subquery giving text, which reads the group's id as `group` (NULL when the caller is not
 * a member, so it finds nothing) and its own parameters as param(0), param(1), ….
 */
export type GroupScopedSql = (group: string, param: (k: number) => string) => string;

type MemberRow = { role: Role; id: string; slug: string; name: string; allowSelfApproval: boolean; email: string; userName: string };

/**
 * The text of inGroupWith's one statement: $1 the user, $2 the group's id (byId) or slug, $3–$6
 * the session (liveSessionSql), $7… the extra's parameters. Columns: live (the session is live
 * and the user's), member (JSON or NULL), extra.
 */
export function memberStatement(byId: boolean, extra?: GroupScopedSql): string {
  const live = liveSessionSql(3);
  return `WITH ${live.sql},
    mem AS (
      SELECT m."role"::text AS "role", g."id"::text AS "id", g."slug", g."name", g."allowSelfApproval", u."email", u."name" AS "userName"
      FROM "Membership" m JOIN "Group" g ON g."id" = m."groupId" JOIN "User" u ON u."id" = m."userId"
      WHERE m."userId" = $1::uuid AND m."userId" = (SELECT "userId" FROM sess) AND ${byId ? `g."id" = $2::uuid` : `g."slug" = $2`})
    SELECT EXISTS (SELECT 1 FROM sess WHERE "userId" = $1::uuid) AS "live", (SELECT row_to_json(mem)::text FROM mem) AS "member"${extra ? `, (${extra(`(SELECT "id"::uuid FROM mem)`, (k) => `$${k + 7}`)}) AS "extra"` : ""}`;
}

/**
 * The signed-in user and their membership of the route's group, with the user row, in one
 * statement — and, if `extra` is given, the value it reads, in that same statement (one round
 * trip: on this path a query's cost is mostly the round trip). The same statement checks the
 * session row (lib/server/auth/sessions.ts): ended, idle or expired → 401. No membership: 401
 * if the user no longer exists, else 404. Bare pg on the client's pool: every request runs this.
 */
export async function inGroupWith(req: Request, slug: string, extra?: { sql: GroupScopedSql; values: readonly unknown[] }): Promise<GroupContext & { extra: string | null }> {
  if (req.method !== "GET" && req.method !== "HEAD") assertSameOrigin(req);
  const claims = await sessionClaims();
  if (!claims) throw new UnauthenticatedError();
  const userId = claims.uid;
  const db = getDb();
  const where = groupWhere(slug);
  const text = memberStatement("id" in where, extra?.sql);
  const [row] = await sqlRows<{ live: boolean; member: string | null; extra?: string | null }>(db, text, [uuidOrNone(userId), "id" in where ? where.id : where.slug, ...liveSessionSql(3).values(claims.sid), ...(extra?.values ?? [])]);
  if (!row?.live) throw new UnauthenticatedError();
  const m = row.member ? (JSON.parse(row.member) as MemberRow) : null;
  if (!m) {
    if (!(await db.user.findUnique({ where: { id: uuidOrNone(userId) }, select: { id: true } }))) throw new UnauthenticatedError();
    throw new NotFoundError("group");
  }
  return {
    db,
    user: { id: userId, email: m.email, name: m.userName },
    member: { userId, group: { id: m.id, slug: m.slug, name: m.name, allowSelfApproval: m.allowSelfApproval }, role: m.role },
    extra: row?.extra ?? null,
  };
}

/** The signed-in user and their membership of the route's group (inGroupWith without more). */
export async function inGroup(req: Request, slug: string): Promise<GroupContext> {
  const { extra: _extra, ...ctx } = await inGroupWith(req, slug);
  return ctx;
}

export interface UploadedForm {
  fileName: string;
  bytes: Uint8Array;
  fields: Record<string, unknown>;
}

/**
 * Read a multipart form with a `file` part and a JSON `options` part. The body is counted as it
 * arrives and refused (413) beyond the upload limit plus 64 KiB for the form's framing; the
 * options JSON and the file name get the JSON body's checks (depth, no NUL or bidi controls).
 */
export async function readUpload(req: Request): Promise<UploadedForm> {
  const bytes = await readBodyLimited(req, MAX_UPLOAD_BYTES + 64 * 1024, "upload", "file", MAX_UPLOAD_BYTES);
  let form: FormData;
  try {
    form = await new Response(bytes as Uint8Array<ArrayBuffer>, { headers: { "content-type": req.headers.get("content-type") ?? "" } }).formData();
  } catch {
    throw new InputError("expected a multipart form with a file", { field: "file" });
  }
  const file = form.get("file");
  if (!file || typeof file === "string") throw new InputError("no file was uploaded", { field: "file" });
  if (file.size > MAX_UPLOAD_BYTES) throw new PayloadTooLargeError(`the upload is larger than ${MAX_UPLOAD_BYTES / 1024 / 1024} MiB`, "file");
  const fileName = file.name || "upload.txt";
  assertCleanText(fileName, "fileName");
  const raw = form.get("options");
  let fields: Record<string, unknown> = {};
  if (typeof raw === "string" && raw) fields = parseJsonText(raw, "options") as Record<string, unknown>;
  return { fileName, bytes: new Uint8Array(await file.arrayBuffer()), fields };
}
