/** Test fixtures for server integration tests: users and a group with one member per role. */
import type { Db } from "../../lib/server/db/client";
import { createGroup } from "../../lib/server/groups";
import { memberOf, type Member } from "../../lib/server/access";
import type { Role } from "../../lib/server/permissions";

let counter = 0;

export async function makeUser(db: Db, name = "user"): Promise<{ id: string; email: string }> {
  counter++;
  const email = `${name}-${counter}-${Date.now()}@example.org`;
  const u = await db.user.create({ data: { email, name } });
  return { id: u.id, email };
}

export interface GroupFixture {
  slug: string;
  groupId: string;
  members: Record<Role, Member>;
}

export async function makeGroup(db: Db, name = "Test group"): Promise<GroupFixture> {
  const owner = await makeUser(db, "owner");
  const group = await createGroup(db, owner.id, { name });
  const members: Partial<Record<Role, Member>> = { owner: await memberOf(db, owner.id, group.slug) };
  for (const role of ["analyst", "reviewer", "viewer"] as const) {
    const u = await makeUser(db, role);
    await db.membership.create({ data: { userId: u.id, groupId: group.id, role } });
    members[role] = await memberOf(db, u.id, group.slug);
  }
  return { slug: group.slug, groupId: group.id, members: members as Record<Role, Member> };
}
