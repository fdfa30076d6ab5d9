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

/** memberOf + authorise in one call, for handlers. */
export async function requireRole(db: Db, userId: string, groupSlugOrId: string, action: Action): Promise<Member> {
  const member = await memberOf(db, userId, groupSlugOrId);
  authorise(member, action);
  return member;
}
