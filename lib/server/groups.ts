/** Groups, members, roles and invitations. Invitations are links the app shows (no mail server). */
import { z } from "zod";
import { randomBytes } from "node:crypto";
import type { Db } from "./db/client";
import { ConflictError, ForbiddenError, InputError, NotFoundError } from "../engine/errors";
import { normaliseEmail } from "./users";
import { recordAudit } from "./audit";
import { authorise, type GroupInfo, type Member } from "./access";
import { ROLES, type Role } from "./permissions";
import { sha256Hex } from "./hash";
import { parseInput } from "./validate";

const INVITATION_DAYS = 14;

export const groupSchema = z.object({
  name: z.string().trim().min(2, "a group name needs at least 2 characters").max(80),
});

export const inviteSchema = z.object({
  email: z.string().trim().toLowerCase().email("a valid e-mail address is needed"),
  role: z.enum(ROLES as [Role, ...Role[]]),
});

export const roleSchema = z.object({ role: z.enum(ROLES as [Role, ...Role[]]) });

function slugify(name: string): string {
  const base = name.toLowerCase().normalize("NFKD").replace(/[^a-z0-9]+/g, "-").replace(/^-+|-+$/g, "").slice(0, 40);
  return base || "group";
}

export async function createGroup(db: Db, userId: string, input: unknown): Promise<GroupInfo> {
  const { name } = parseInput(groupSchema, input);
  const base = slugify(name);
  return db.$transaction(async (tx) => {
    let slug = base;
    for (let i = 2; await tx.group.findUnique({ where: { slug } }); i++) slug = `${base}-${i}`;
    const group = await tx.group.create({ data: { name, slug, memberships: { create: { userId, role: "owner" } } } });
    await recordAudit(tx, { groupId: group.id, actorId: userId, action: "group.create", objectType: "group", objectId: group.id, detail: { name } });
    return { id: group.id, slug: group.slug, name: group.name, allowSelfApproval: group.allowSelfApproval };
  });
}

export interface MyGroup extends GroupInfo {
  role: Role;
}

export async function listMyGroups(db: Db, userId: string): Promise<MyGroup[]> {
  const rows = await db.membership.findMany({ where: { userId }, include: { group: true }, orderBy: { group: { name: "asc" } } });
  return rows.map((m) => ({ id: m.group.id, slug: m.group.slug, name: m.group.name, allowSelfApproval: m.group.allowSelfApproval, role: m.role }));
}

export interface MemberRow {
  userId: string;
  email: string;
  name: string;
  role: Role;
  since: string;
  /** false for accounts without a password (restored from a backup, or institutional sign-in only). */
  hasPassword: boolean;
  /** For @mentions in discussions, unique within the group. */
  handle: string;
}

export async function listMembers(db: Db, member: Member): Promise<MemberRow[]> {
  authorise(member, "group.read");
  const rows = await db.membership.findMany({ where: { groupId: member.group.id }, include: { user: true }, orderBy: { createdAt: "asc" } });
  return rows.map((m) => ({ userId: m.userId, email: m.user.email, name: m.user.name, role: m.role, since: m.createdAt.toISOString(), hasPassword: m.user.passwordHash !== null, handle: m.handle }));
}

export interface InvitationRow {
  id: string;
  email: string;
  role: Role;
  createdAt: string;
  expiresAt: string;
}

export async function listInvitations(db: Db, member: Member): Promise<InvitationRow[]> {
  authorise(member, "group.manage");
  const rows = await db.invitation.findMany({
    where: { groupId: member.group.id, acceptedAt: null, revokedAt: null, expiresAt: { gt: new Date() } },
    orderBy: { createdAt: "desc" },
  });
  return rows.map((r) => ({ id: r.id, email: r.email, role: r.role, createdAt: r.createdAt.toISOString(), expiresAt: r.expiresAt.toISOString() }));
}

/** Create an invitation; returns the secret token (shown once, stored only as its hash). */
export async function inviteMember(db: Db, member: Member, input: unknown): Promise<{ token: string; invitation: InvitationRow }> {
  authorise(member, "group.manage");
  const { email, role } = parseInput(inviteSchema, input);
  const already = await db.membership.findFirst({ where: { groupId: member.group.id, user: { email } } });
  if (already) throw new ConflictError(`${email} is already a member`);
  const token = randomBytes(24).toString("base64url");
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * 86_400_000);
  return db.$transaction(async (tx) => {
    const inv = await tx.invitation.create({
      data: { groupId: member.group.id, email, role, tokenHash: sha256Hex(token), invitedById: member.userId, expiresAt },
    });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "member.invite", objectType: "invitation", objectId: inv.id, detail: { email, role } });
    return { token, invitation: { id: inv.id, email, role, createdAt: inv.createdAt.toISOString(), expiresAt: expiresAt.toISOString() } };
  });
}

export async function revokeInvitation(db: Db, member: Member, invitationId: string): Promise<void> {
  authorise(member, "group.manage");
  const inv = await db.invitation.findFirst({ where: { id: invitationId, groupId: member.group.id } });
  if (!inv) throw new NotFoundError("invitation");
  await db.$transaction(async (tx) => {
    await tx.invitation.update({ where: { id: inv.id }, data: { revokedAt: new Date() } });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "member.invite.revoke", objectType: "invitation", objectId: inv.id });
  });
}

export interface InvitationPreview {
  groupName: string;
  role: Role;
  email: string;
  usable: boolean;
  why?: string;
}

async function findInvitation(db: Db, token: string) {
  return db.invitation.findUnique({ where: { tokenHash: sha256Hex(token) }, include: { group: true } });
}

export async function previewInvitation(db: Db, token: string): Promise<InvitationPreview> {
  const inv = await findInvitation(db, token);
  if (!inv) throw new NotFoundError("invitation");
  const why = inv.acceptedAt ? "already accepted" : inv.revokedAt ? "revoked" : inv.expiresAt < new Date() ? "expired" : undefined;
  return { groupName: inv.group.name, role: inv.role, email: inv.email, usable: !why, ...(why ? { why } : {}) };
}

/**
 * Accept with the signed-in account. Only the account whose e-mail is the invited address may
 * (403 for any other: holding the link is not enough). The invitation is used up by the same
 * transaction that adds the membership, with a conditional UPDATE (not accepted, not revoked,
 * not expired): of two parallel accepts one wins, the other gets 409.
 */
export async function acceptInvitation(db: Db, user: { id: string; email: string }, token: string): Promise<GroupInfo> {
  const inv = await findInvitation(db, token);
  if (!inv) throw new NotFoundError("invitation");
  if (normaliseEmail(inv.email) !== normaliseEmail(user.email)) {
    throw new ForbiddenError(`this invitation was sent to another address: sign in with ${inv.email} to accept it, or ask the group owner to invite ${user.email}`);
  }
  return db.$transaction(async (tx) => {
    const now = new Date();
    const used = await tx.invitation.updateMany({
      where: { id: inv.id, acceptedAt: null, revokedAt: null, expiresAt: { gt: now } },
      data: { acceptedAt: now, acceptedById: user.id },
    });
    if (used.count !== 1) throw new ConflictError("this invitation can no longer be used");
    const existing = await tx.membership.findUnique({ where: { userId_groupId: { userId: user.id, groupId: inv.groupId } } });
    if (!existing) await tx.membership.create({ data: { userId: user.id, groupId: inv.groupId, role: inv.role } });
    await recordAudit(tx, { groupId: inv.groupId, actorId: user.id, action: "member.join", objectType: "membership", objectId: user.id, detail: { role: inv.role } });
    const g = inv.group;
    return { id: g.id, slug: g.slug, name: g.name, allowSelfApproval: g.allowSelfApproval };
  });
}

async function ownerCount(db: Pick<Db, "membership">, groupId: string): Promise<number> {
  return db.membership.count({ where: { groupId, role: "owner" } });
}

export async function changeRole(db: Db, member: Member, targetUserId: string, input: unknown): Promise<void> {
  authorise(member, "group.manage");
  const { role } = parseInput(roleSchema, input);
  const target = await db.membership.findUnique({ where: { userId_groupId: { userId: targetUserId, groupId: member.group.id } } });
  if (!target) throw new NotFoundError("member");
  await db.$transaction(async (tx) => {
    if (target.role === "owner" && role !== "owner" && (await ownerCount(tx, member.group.id)) <= 1)
      throw new ConflictError("a group needs at least one owner: make someone else owner first");
    await tx.membership.update({ where: { id: target.id }, data: { role } });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "member.role", objectType: "membership", objectId: targetUserId, detail: { from: target.role, to: role } });
  });
}

export async function removeMember(db: Db, member: Member, targetUserId: string): Promise<void> {
  if (targetUserId !== member.userId) authorise(member, "group.manage");
  const target = await db.membership.findUnique({ where: { userId_groupId: { userId: targetUserId, groupId: member.group.id } } });
  if (!target) throw new NotFoundError("member");
  await db.$transaction(async (tx) => {
    if (target.role === "owner" && (await ownerCount(tx, member.group.id)) <= 1)
      throw new ConflictError("the last owner cannot leave or be removed: make someone else owner first");
    await tx.membership.delete({ where: { id: target.id } });
    const action = targetUserId === member.userId ? "member.leave" : "member.remove";
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action, objectType: "membership", objectId: targetUserId });
  });
}

export async function updateGroupSettings(db: Db, member: Member, input: { allowSelfApproval?: boolean; name?: string }): Promise<void> {
  authorise(member, "group.manage");
  if (input.name !== undefined && input.name.trim().length < 2) throw new InputError("a group name needs at least 2 characters", { field: "name" });
  await db.$transaction(async (tx) => {
    await tx.group.update({
      where: { id: member.group.id },
      data: { ...(input.name !== undefined ? { name: input.name.trim() } : {}), ...(input.allowSelfApproval !== undefined ? { allowSelfApproval: input.allowSelfApproval } : {}) },
    });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "group.settings", objectType: "group", objectId: member.group.id, detail: input });
  });
}


