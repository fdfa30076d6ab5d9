/**
 * Password-set links for accounts without a password (what a group restore creates): issued by
 * an owner through the members route, shown once, stored only as a hash, usable once, expiring;
 * refused for accounts that have a password, for non-owners, and for members of a group the
 * issuing owner does not own.
 */
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, makeUser, type GroupFixture } from "./fixtures";
import { describePasswordLink, issuePasswordLink, setPasswordWithLink, PASSWORD_LINK_HOURS } from "../../lib/server/passwordLinks";
import { authenticate } from "../../lib/server/users";
import { sha256Hex } from "../../lib/server/hash";

const session = vi.hoisted(() => ({ userId: null as string | null }));
vi.mock("next/headers", async () => (await import("../helpers/session")).headersFor(session));

import * as issueRoute from "../../app/api/groups/[slug]/members/[userId]/password-link/route";
import * as setRoute from "../../app/api/password-links/[token]/route";

let t: TestDatabase;
let g: GroupFixture;

/** A member of g whose account has no password (as a restore leaves it). */
async function restoredMember(name: string) {
  const u = await makeUser(t.db, name);
  await t.db.user.update({ where: { id: u.id }, data: { passwordHash: null } });
  await t.db.membership.create({ data: { userId: u.id, groupId: g.groupId, role: "reviewer" } });
  return u;
}

async function issue(as: "owner" | "analyst", userId: string) {
  session.userId = g.members[as].userId;
  const res = await issueRoute.POST(new Request("http://localhost/api/x", { method: "POST" }), { params: Promise.resolve({ slug: g.slug, userId }) });
  return { status: res.status, body: (await res.json()) as any };
}

async function use(token: string, password: string) {
  const res = await setRoute.POST(new Request("http://localhost/api/x", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ password }) }), { params: Promise.resolve({ token }) });
  return { status: res.status, body: (await res.json()) as any };
}

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  process.env.HEATBOOK_BCRYPT_COST ??= "4";
  g = await makeGroup(t.db, "Restored group");
});
afterAll(async () => { await t.drop(); });

describe("password-set links", () => {
  it("POST password-link by the owner gives a link once; the database keeps only the token's hash", async () => {
    const u = await restoredMember("restored");
    const res = await issue("owner", u.id);
    expect(res.status).toBe(201);
    const token = res.body.link.token as string;
    expect(res.body.link.path).toBe(`/set-password/${token}`);
    const rows = await t.db.passwordSetLink.findMany({ where: { userId: u.id } });
    expect(rows).toHaveLength(1);
    expect(rows[0]!.tokenHash).toBe(sha256Hex(token));
    expect(JSON.stringify(rows)).not.toContain(token);
    expect(rows[0]!.expiresAt.getTime() - rows[0]!.createdAt.getTime()).toBeGreaterThan((PASSWORD_LINK_HOURS - 0.1) * 3_600_000);
  });

  it("the link sets the password once: the account signs in with it, and a second use is refused (409)", async () => {
    const u = await restoredMember("once");
    const { token } = (await issue("owner", u.id)).body.link;
    expect((await describePasswordLink(t.db, token)).state).toBe("valid");
    const first = await use(token, "a-new-password-1");
    expect(first).toMatchObject({ status: 200, body: { email: u.email } });
    expect((await authenticate(t.db, u.email, "a-new-password-1")).ok).toBe(true);
    const second = await use(token, "another-password-2");
    expect(second.status).toBe(409);
    expect(second.body.error).toMatch(/already used/);
    expect((await authenticate(t.db, u.email, "another-password-2")).ok).toBe(false);
    expect((await describePasswordLink(t.db, token)).state).toBe("used");
    const audit = await t.db.auditEvent.findMany({ where: { objectId: u.id }, orderBy: { id: "asc" } });
    expect(audit.map((e) => e.action)).toEqual(["user.password-link.issue", "user.password-set"]);
  });

  it("an expired link is refused and sets nothing", async () => {
    const u = await restoredMember("late");
    const link = await issuePasswordLink(t.db, g.members.owner, u.id, new Date(Date.now() - (PASSWORD_LINK_HOURS + 1) * 3_600_000));
    expect((await describePasswordLink(t.db, link.token)).state).toBe("expired");
    await expect(setPasswordWithLink(t.db, link.token, "too-late-password")).rejects.toMatchObject({ name: "ConflictError", message: expect.stringMatching(/expired/) });
    expect((await t.db.user.findUniqueOrThrow({ where: { id: u.id } })).passwordHash).toBeNull();
  });

  it("a new link ends the earlier unused one; a short password is 422 and uses nothing", async () => {
    const u = await restoredMember("twice");
    const old = (await issue("owner", u.id)).body.link.token;
    const fresh = (await issue("owner", u.id)).body.link.token;
    expect((await use(old, "old-link-password")).status).toBe(409);
    expect((await use(fresh, "short")).status).toBe(422);
    expect((await describePasswordLink(t.db, fresh)).state).toBe("valid");
    expect((await use(fresh, "fresh-link-password")).status).toBe(200);
  });

  it("refused: for an account with a password (409), by a non-owner (403), for a member of a group the owner does not own (403), unknown token (404)", async () => {
    expect((await issue("owner", g.members.reviewer.userId)).status).toBe(409);
    const u = await restoredMember("refused");
    expect((await issue("analyst", u.id)).status).toBe(403);
    const other = await makeGroup(t.db, "Elsewhere");
    await t.db.membership.create({ data: { userId: u.id, groupId: other.groupId, role: "viewer" } });
    const res = await issue("owner", u.id);
    expect(res.status).toBe(403);
    expect(res.body.error).toMatch(/group you do not own/);
    expect((await use("no-such-token", "whatever-password")).status).toBe(404);
  });
});
