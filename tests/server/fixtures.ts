/** Test fixtures for server integration tests: users and a group with one member per role. */
import bcrypt from "bcryptjs";
import type { Db } from "../../lib/server/db/client";
import { createGroup } from "../../lib/server/groups";
import { memberOf, type Member } from "../../lib/server/access";
import type { Role } from "../../lib/server/permissions";

let counter = 0;

/** Every fixture user's password (bcrypt cost 4: fast, for tests only). */
export const TEST_PASSWORD = "fixture-password-1";
let testHash: Promise<string> | null = null;
const passwordHash = () => (testHash ??= bcrypt.hash(TEST_PASSWORD, 4));

/** What approving needs besides the note: a meaning and the signer's password. */
export const SIGN = { meaning: "internal", password: TEST_PASSWORD } as const;

export async function makeUser(db: Db, name = "user"): Promise<{ id: string; email: string }> {
  counter++;
  const email = `${name}-${counter}-${Date.now()}@example.org`;
  const u = await db.user.create({ data: { email, name, passwordHash: await passwordHash() } });
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
