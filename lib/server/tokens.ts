/**
 * Personal access tokens for the JSON API (/api/v1). A token belongs to one user, is scoped to
 * ONE group and to `read` or `read_write`, and is shown once: the database keeps only its
 * SHA-256 and a short visible prefix ("hb_" + 6 characters) so the settings page can name it.
 * Format: hb_<6 prefix chars>_<43 base64url chars> (32 random bytes).
 * A token expires (default after HEATBOOK_API_TOKEN_DAYS, 90 days; 1–366 days chosen at creation);
 * its owner (or a group owner) renews it for the same length from the day of renewal. Creation,
 * renewal and revocation each append an audit row.
 */
import { z } from "zod";
import { randomBytes } from "node:crypto";
import type { Db } from "./db/client";
import { ConflictError, NotFoundError, UnauthenticatedError } from "../engine/errors";
import { authorise, memberOf, type Member } from "./access";
import { can } from "./permissions";
import { recordAudit } from "./audit";
import { sha256Hex } from "./hash";
import { parseInput } from "./validate";
import { uuidOrNone } from "./samples";

/** 2026-12-04 14:52 UTC */
function utcMinutes(d: Date): string {
  return `${d.toISOString().slice(0, 16).replace("T", " ")} UTC`;
}

export type TokenScope = "read" | "read_write";

export const MAX_TOKEN_DAYS = 366;

/** Default lifetime of a new or renewed token, in days (HEATBOOK_API_TOKEN_DAYS, default 90). */
export function defaultTokenDays(): number {
  const v = Number(process.env.HEATBOOK_API_TOKEN_DAYS);
  return Number.isInteger(v) && v >= 1 && v <= MAX_TOKEN_DAYS ? v : 90;
}

export const createTokenSchema = z.object({
  name: z.string().trim().min(1, "give the token a name").max(80),
  scope: z.enum(["read", "read_write"]),
  days: z.number().int("days must be a whole number").min(1, "a token lives at least 1 day").max(MAX_TOKEN_DAYS, `a token lives at most ${MAX_TOKEN_DAYS} days`).optional(),
});

const DAY_MS = 24 * 3600 * 1000;

export interface TokenInfo {
  id: string;
  name: string;
  prefix: string;
  scope: TokenScope;
  groupId: string;
  userId: string;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
  expiresAt: string;
  renewedAt: string | null;
}

type TokenRow = Awaited<ReturnType<Db["apiToken"]["findFirstOrThrow"]>>;

function toInfo(t: TokenRow): TokenInfo {
  return {
    id: t.id, name: t.name, prefix: t.prefix, scope: t.scope, groupId: t.groupId, userId: t.userId, createdAt: t.createdAt.toISOString(),
    lastUsedAt: t.lastUsedAt?.toISOString() ?? null, revokedAt: t.revokedAt?.toISOString() ?? null,
    expiresAt: t.expiresAt.toISOString(), renewedAt: t.renewedAt?.toISOString() ?? null,
  };
}

const TOKEN_PATTERN = /^hb_[A-Za-z0-9]{6}_[A-Za-z0-9_-]{43}$/;
const PREFIX_ALPHABET = "abcdefghijkmnpqrstuvwxyz23456789";

function newSecret(): { token: string; prefix: string } {
  const bytes = randomBytes(6);
  const prefix = "hb_" + Array.from(bytes, (b) => PREFIX_ALPHABET[b % PREFIX_ALPHABET.length]).join("");
  return { token: `${prefix}_${randomBytes(32).toString("base64url")}`, prefix };
}

/** Create a token for the member in the member's group. Returns the secret once, with its info. */
export async function createToken(db: Db, member: Member, input: unknown): Promise<{ token: string; info: TokenInfo }> {
  authorise(member, "token.create");
  const { name, scope, days = defaultTokenDays() } = parseInput(createTokenSchema, input);
  const { token, prefix } = newSecret();
  const expiresAt = new Date(Date.now() + days * DAY_MS);
  return db.$transaction(async (tx) => {
    const t = await tx.apiToken.create({ data: { userId: member.userId, groupId: member.group.id, name, prefix, scope, tokenHash: sha256Hex(token), expiresAt } });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "token.create", objectType: "api_token", objectId: t.id, detail: { name, scope, prefix, expiresAt: expiresAt.toISOString() } });
    return { token, info: toInfo(t) };
  });
}

/** The member's own tokens in this group (revoked ones included, newest first). */
export async function listTokens(db: Db, member: Member): Promise<TokenInfo[]> {
  const rows = await db.apiToken.findMany({ where: { userId: member.userId, groupId: member.group.id }, orderBy: { createdAt: "desc" } });
  return rows.map(toInfo);
}

/** Revoke a token: its owner may, and so may a group owner (group.manage). Idempotent. */
export async function revokeToken(db: Db, member: Member, tokenId: string): Promise<TokenInfo> {
  const t = await db.apiToken.findFirst({ where: { id: uuidOrNone(tokenId), groupId: member.group.id } });
  if (!t || (t.userId !== member.userId && !can(member.role, "group.manage"))) throw new NotFoundError("token");
  if (t.revokedAt) return toInfo(t);
  return db.$transaction(async (tx) => {
    const r = await tx.apiToken.update({ where: { id: t.id }, data: { revokedAt: new Date() } });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "token.revoke", objectType: "api_token", objectId: t.id, detail: { prefix: t.prefix } });
    return toInfo(r);
  });
}

/**
 * Renew a token: it expires `days` (default: the default lifetime) from now. Its owner may, and
 * so may a group owner; a revoked token cannot be renewed (409). An expired one can.
 */
export async function renewToken(db: Db, member: Member, tokenId: string, input: unknown = {}): Promise<TokenInfo> {
  const { days = defaultTokenDays() } = parseInput(createTokenSchema.pick({ days: true }), input ?? {});
  const t = await db.apiToken.findFirst({ where: { id: uuidOrNone(tokenId), groupId: member.group.id } });
  if (!t || (t.userId !== member.userId && !can(member.role, "group.manage"))) throw new NotFoundError("token");
  if (t.revokedAt) throw new ConflictError("this token has been revoked: create a new one");
  const now = new Date();
  const expiresAt = new Date(now.getTime() + days * DAY_MS);
  return db.$transaction(async (tx) => {
    const r = await tx.apiToken.update({ where: { id: t.id }, data: { expiresAt, renewedAt: now } });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "token.renew", objectType: "api_token", objectId: t.id, detail: { prefix: t.prefix, previousExpiresAt: t.expiresAt.toISOString(), expiresAt: expiresAt.toISOString() } });
    return toInfo(r);
  });
}

export interface TokenPrincipal {
  tokenId: string;
  scope: TokenScope;
  member: Member;
}

/** lastUsedAt is written at most once a minute per token, so reads do not turn into writes. */
const LAST_USED_RESOLUTION_MS = 60_000;

/**
 * Resolve a presented secret: unknown, malformed, revoked or expired → UnauthenticatedError (401); a user
 * who is no longer a member of the token's group → UnauthenticatedError too (the token cannot
 * reach anything). Returns the membership as it is now (the current role applies).
 */
export async function authenticateToken(db: Db, secret: string): Promise<TokenPrincipal> {
  if (!TOKEN_PATTERN.test(secret)) throw new UnauthenticatedError("invalid API token");
  const t = await db.apiToken.findUnique({ where: { tokenHash: sha256Hex(secret) } });
  if (!t) throw new UnauthenticatedError("invalid API token");
  if (t.revokedAt) throw new UnauthenticatedError("this API token has been revoked");
  if (t.expiresAt.getTime() <= Date.now()) throw new UnauthenticatedError(`this API token expired on ${utcMinutes(t.expiresAt)}: its owner can renew it in the group's Settings`);
  let member: Member;
  try {
    member = await memberOf(db, t.userId, t.groupId);
  } catch (err) {
    if (err instanceof NotFoundError) throw new UnauthenticatedError("the token's user is no longer a member of its group");
    throw err;
  }
  const now = Date.now();
  if (!t.lastUsedAt || now - t.lastUsedAt.getTime() > LAST_USED_RESOLUTION_MS) {
    await db.apiToken.update({ where: { id: t.id }, data: { lastUsedAt: new Date(now) } });
  }
  return { tokenId: t.id, scope: t.scope, member };
}
