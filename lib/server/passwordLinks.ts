/**
 * Password-set links for accounts without a password (restored from a group backup, which
 * carries no password hashes). A group owner issues one for a member of their group; the link is
 * shown once, only the SHA-256 of its token is stored, it expires after PASSWORD_LINK_HOURS and
 * works once: the password is set and the link marked used in one transaction that holds the
 * link's row lock. Issuing a new link ends the member's earlier unused ones.
 *
 * Guard against an owner taking over an account: only accounts with no password, and only
 * members who belong to no group the issuing owner does not own.
 */
import { randomBytes } from "node:crypto";
import type { Db } from "./db/client";
import { ConflictError, ForbiddenError, InputError, NotFoundError } from "../engine/errors";
import { authorise, type Member } from "./access";
import { recordAudit } from "./audit";
import { hashPassword, passwordProblem } from "./auth/password";
import { sha256Hex } from "./hash";
import { uuidOrNone } from "./ids";

export const PASSWORD_LINK_HOURS = 24;

export interface IssuedLink {
  /** The token: shown once, never stored. */
  token: string;
  path: string;
  expiresAt: string;
}

/** Issue a link for member `userId` of the owner's group; see the module comment for refusals. */
export async function issuePasswordLink(db: Db, owner: Member, userId: string, now = new Date()): Promise<IssuedLink> {
  authorise(owner, "group.manage");
  const target = await db.membership.findFirst({ where: { groupId: owner.group.id, userId: uuidOrNone(userId) }, include: { user: { select: { id: true, email: true, passwordHash: true } } } });
  if (!target) throw new NotFoundError("member");
  if (target.user.passwordHash) throw new ConflictError(`${target.user.email} already has a password: they sign in with it (a password-set link is only for accounts without one)`);
  const elsewhere = await db.membership.findMany({ where: { userId: target.userId, groupId: { not: owner.group.id } }, select: { groupId: true } });
  const ownedThere = await db.membership.findMany({ where: { userId: owner.userId, role: "owner", groupId: { in: elsewhere.map((m) => m.groupId) } }, select: { groupId: true } });
  if (ownedThere.length < elsewhere.length) throw new ForbiddenError(`${target.user.email} also belongs to a group you do not own: an owner of every group they belong to must issue the link`);
  const token = randomBytes(32).toString("base64url");
  const expiresAt = new Date(now.getTime() + PASSWORD_LINK_HOURS * 3_600_000);
  await db.$transaction(async (tx) => {
    await tx.passwordSetLink.updateMany({ where: { userId: target.userId, usedAt: null, expiresAt: { gt: now } }, data: { expiresAt: now } });
    const link = await tx.passwordSetLink.create({ data: { userId: target.userId, groupId: owner.group.id, tokenHash: sha256Hex(token), createdById: owner.userId, expiresAt } });
    await recordAudit(tx, { groupId: owner.group.id, actorId: owner.userId, action: "user.password-link.issue", objectType: "user", objectId: target.userId, detail: { linkId: link.id, expiresAt: expiresAt.toISOString() } });
  });
  return { token, path: `/set-password/${token}`, expiresAt: expiresAt.toISOString() };
}

export interface LinkState {
  email: string;
  name: string;
  state: "valid" | "used" | "expired";
  expiresAt: string;
}

/** What the set-password page shows for a token (NotFoundError for an unknown one). */
export async function describePasswordLink(db: Db, token: string, now = new Date()): Promise<LinkState> {
  const link = await db.passwordSetLink.findUnique({ where: { tokenHash: sha256Hex(token) }, include: { user: { select: { email: true, name: true } } } });
  if (!link) throw new NotFoundError("password-set link");
  return { email: link.user.email, name: link.user.name, state: link.usedAt ? "used" : link.expiresAt <= now ? "expired" : "valid", expiresAt: link.expiresAt.toISOString() };
}

/** Set the password through a link: once, before it expires, for an account still without one. */
export async function setPasswordWithLink(db: Db, token: string, password: unknown, now = new Date()): Promise<{ email: string }> {
  if (typeof password !== "string") throw new InputError("a password is needed", { field: "password" });
  const problem = passwordProblem(password);
  if (problem) throw new InputError(problem, { field: "password" });
  const hash = await hashPassword(password);
  return db.$transaction(async (tx) => {
    const rows = await tx.$queryRaw<{ id: string; userId: string; groupId: string; expiresAt: Date; usedAt: Date | null }[]>`
      SELECT id::text AS id, "userId"::text AS "userId", "groupId"::text AS "groupId", "expiresAt", "usedAt" FROM "PasswordSetLink" WHERE "tokenHash" = ${sha256Hex(token)} FOR UPDATE`;
    const link = rows[0];
    if (!link) throw new NotFoundError("password-set link");
    if (link.usedAt) throw new ConflictError("this password-set link was already used: ask a group owner for a new one");
    if (link.expiresAt <= now) throw new ConflictError("this password-set link has expired: ask a group owner for a new one");
    const user = await tx.user.findUniqueOrThrow({ where: { id: link.userId }, select: { email: true, passwordHash: true } });
    if (user.passwordHash) throw new ConflictError("this account has a password already: sign in with it");
    await tx.user.update({ where: { id: link.userId }, data: { passwordHash: hash } });
    await tx.passwordSetLink.update({ where: { id: link.id }, data: { usedAt: now } });
    await recordAudit(tx, { groupId: link.groupId, actorId: link.userId, action: "user.password-set", objectType: "user", objectId: link.userId, detail: { linkId: link.id } });
    return { email: user.email };
  });
}
