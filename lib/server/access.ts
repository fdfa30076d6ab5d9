/**
 * Group access: the caller's membership decides everything. A group the caller is not a member
 * of does not exist for them (404, never 403, so names and ids do not leak across groups).
 */
import type { Db } from "./db/client";
import { ForbiddenError, NotFoundError } from "../engine/errors";
import { can, type Action, type Role } from "./permissions";
import { isUuid } from "./ids";

export interface GroupInfo {
  id: string;
  slug: string;
  name: string;
  allowSelfApproval: boolean;
}

export interface Member {
  userId: string;
  group: GroupInfo;
  role: Role;
}

const GROUP_FIELDS = { id: true, slug: true, name: true, allowSelfApproval: true } as const;

/** The caller's membership of the group with this slug or id, or NotFoundError. */
/** The Prisma filter for a group named by slug or by id. */
export function groupWhere(groupSlugOrId: string): { id: string } | { slug: string } {
  return isUuid(groupSlugOrId) ? { id: groupSlugOrId } : { slug: groupSlugOrId };
}

export async function memberOf(db: Db, userId: string, groupSlugOrId: string): Promise<Member> {
  const m = await db.membership.findFirst({
    where: { userId, group: groupWhere(groupSlugOrId) },
    select: { role: true, group: { select: GROUP_FIELDS } },
  });
  if (!m) throw new NotFoundError("group");
  return { userId, group: m.group, role: m.role };
}

/** Throws ForbiddenError unless the member's role allows the action. */
export function authorise(member: Member, action: Action): void {
  if (!can(member.role, action)) throw new ForbiddenError(`a ${member.role} may not do ${action}`);
}

/**
 * Throws ForbiddenError unless the role allows at least one of the actions: a write route's first
 * check after the membership, before it reads its body (so a role that may not write hears 403,
 * never a validation message); the domain function checks the exact action again.
 */
export function authoriseAny(member: Member, actions: readonly Action[]): void {
  if (!actions.some((a) => can(member.role, a))) throw new ForbiddenError(`a ${member.role} may not do ${actions.join(" or ")}`);
}

/** memberOf + authorise in one call, for handlers. */
export async function requireRole(db: Db, userId: string, groupSlugOrId: string, action: Action): Promise<Member> {
  const member = await memberOf(db, userId, groupSlugOrId);
  authorise(member, action);
  return member;
}
