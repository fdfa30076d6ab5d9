/** Groups, invitations and roles against a real PostgreSQL. */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, makeUser } from "./fixtures";
import { acceptInvitation, changeRole, inviteMember, listMembers, previewInvitation, removeMember, listMyGroups } from "../../lib/server/groups";
import { memberOf } from "../../lib/server/access";
import { verifyAuditChain } from "../../lib/server/audit";
import { ConflictError, ForbiddenError, NotFoundError } from "../../lib/engine/errors";

let t: TestDatabase;
beforeAll(async () => { t = await freshDatabase(); });
afterAll(async () => { await t.drop(); });

describe("groups", () => {
  it("inviteMember then acceptInvitation makes the invitee a member with the invited role", async () => {
    const g = await makeGroup(t.db);
    const invitee = await makeUser(t.db, "invitee");
    const { token } = await inviteMember(t.db, g.members.owner, { email: invitee.email, role: "reviewer" });
    expect((await previewInvitation(t.db, token)).usable).toBe(true);
    await acceptInvitation(t.db, invitee, token);
    expect((await memberOf(t.db, invitee.id, g.slug)).role).toBe("reviewer");
    expect((await previewInvitation(t.db, token)).why).toBe("already accepted");
    await expect(acceptInvitation(t.db, invitee, token)).rejects.toThrow(/no longer be used/);
  });

  it("acceptInvitation by a signed-in account of another address is refused and leaves the invitation usable", async () => {
    const g = await makeGroup(t.db);
    const invitee = await makeUser(t.db, "invitee");
    const holder = await makeUser(t.db, "link-holder");
    const { token } = await inviteMember(t.db, g.members.owner, { email: invitee.email, role: "analyst" });
    await expect(acceptInvitation(t.db, holder, token)).rejects.toMatchObject({ constructor: ForbiddenError, message: expect.stringContaining(`sign in with ${invitee.email}`) });
    await expect(memberOf(t.db, holder.id, g.slug)).rejects.toThrow(NotFoundError);
    expect((await previewInvitation(t.db, token)).usable).toBe(true);
    await acceptInvitation(t.db, { id: invitee.id, email: invitee.email.toUpperCase() }, token);
    expect((await memberOf(t.db, invitee.id, g.slug)).role).toBe("analyst");
  });

  it("acceptInvitation twice in parallel: one accept wins, the other is refused, one membership and one join row", async () => {
    const g = await makeGroup(t.db);
    const invitee = await makeUser(t.db, "racer");
    const { token } = await inviteMember(t.db, g.members.owner, { email: invitee.email, role: "viewer" });
    const results = await Promise.allSettled([acceptInvitation(t.db, invitee, token), acceptInvitation(t.db, invitee, token), acceptInvitation(t.db, invitee, token)]);
    expect(results.filter((r) => r.status === "fulfilled")).toHaveLength(1);
    for (const r of results.filter((r) => r.status === "rejected")) expect((r as PromiseRejectedResult).reason).toBeInstanceOf(ConflictError);
    expect(await t.db.membership.count({ where: { userId: invitee.id, groupId: g.groupId } })).toBe(1);
    expect(await t.db.auditEvent.count({ where: { action: "member.join", objectId: invitee.id } })).toBe(1);
  });

  it("inviteMember by a non-owner is refused", async () => {
    const g = await makeGroup(t.db);
    for (const role of ["analyst", "reviewer", "viewer"] as const)
      await expect(inviteMember(t.db, g.members[role], { email: "x@example.org", role: "viewer" })).rejects.toThrow(/may not do group.manage/);
  });

  it("inviteMember with a bad e-mail names the field", async () => {
    const g = await makeGroup(t.db);
    await expect(inviteMember(t.db, g.members.owner, { email: "not-an-address", role: "viewer" })).rejects.toMatchObject({ field: "email" });
  });

  it("changeRole refuses to demote the last owner, and works once another owner exists", async () => {
    const g = await makeGroup(t.db);
    const ownerId = g.members.owner.userId;
    await expect(changeRole(t.db, g.members.owner, ownerId, { role: "viewer" })).rejects.toThrow(/at least one owner/);
    await changeRole(t.db, g.members.owner, g.members.analyst.userId, { role: "owner" });
    await changeRole(t.db, g.members.owner, ownerId, { role: "analyst" });
    expect((await memberOf(t.db, ownerId, g.slug)).role).toBe("analyst");
  });

  it("removeMember lets anyone leave and only owners remove others", async () => {
    const g = await makeGroup(t.db);
    await expect(removeMember(t.db, g.members.analyst, g.members.viewer.userId)).rejects.toThrow(/group.manage/);
    await removeMember(t.db, g.members.viewer, g.members.viewer.userId);
    await removeMember(t.db, g.members.owner, g.members.reviewer.userId);
    const emails = (await listMembers(t.db, g.members.owner)).map((m) => m.role);
    expect(emails.sort()).toEqual(["analyst", "owner"]);
    await expect(memberOf(t.db, g.members.viewer.userId, g.slug)).rejects.toThrow(/group not found/);
  });

  it("memberOf a group the user is not in reports not found, never forbidden", async () => {
    const a = await makeGroup(t.db, "Lab A");
    const b = await makeGroup(t.db, "Lab B");
    await expect(memberOf(t.db, a.members.owner.userId, b.slug)).rejects.toMatchObject({ name: "NotFoundError" });
    await expect(memberOf(t.db, a.members.owner.userId, b.groupId)).rejects.toMatchObject({ name: "NotFoundError" });
  });

  it("listMyGroups lists every group of a user in several groups", async () => {
    const a = await makeGroup(t.db, "Alpha lab");
    const b = await makeGroup(t.db, "Beta lab");
    const u = a.members.viewer.userId;
    await t.db.membership.create({ data: { userId: u, groupId: b.groupId, role: "analyst" } });
    const mine = await listMyGroups(t.db, u);
    expect(mine.map((g) => [g.name, g.role])).toEqual([["Alpha lab", "viewer"], ["Beta lab", "analyst"]]);
  });

  it("every change above left an unbroken audit chain", async () => {
    const report = await verifyAuditChain(t.db);
    expect(report.ok).toBe(true);
    expect(report.checked).toBeGreaterThan(10);
  });
});
