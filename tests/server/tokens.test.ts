import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, type GroupFixture } from "./fixtures";
import { authenticateToken, createToken, listTokens, revokeToken } from "../../lib/server/tokens";
import { sha256Hex } from "../../lib/server/hash";
import { verifyAuditChain } from "../../lib/server/audit";
import { NotFoundError, UnauthenticatedError } from "../../lib/engine/errors";

let t: TestDatabase;
let A: GroupFixture;
beforeAll(async () => { t = await freshDatabase(); A = await makeGroup(t.db, "Tokens"); });
afterAll(() => t.drop());

describe("createToken", () => {
  it("createToken returns the secret once and stores only its SHA-256 and the hb_ prefix", async () => {
    const { token, info } = await createToken(t.db, A.members.viewer, { name: "notebook", scope: "read" });
    expect(token).toMatch(/^hb_[a-z2-9]{6}_[A-Za-z0-9_-]{43}$/);
    expect(info.prefix).toBe(token.slice(0, 9));
    const row = await t.db.apiToken.findUniqueOrThrow({ where: { id: info.id } });
    expect(row.tokenHash).toBe(sha256Hex(token));
    expect(JSON.stringify(row)).not.toContain(token.slice(10));
    expect(row.groupId).toBe(A.groupId);
  });
  it("createToken rejects an unknown scope and an empty name, naming the field", async () => {
    await expect(createToken(t.db, A.members.viewer, { name: "x", scope: "admin" })).rejects.toMatchObject({ field: "scope" });
    await expect(createToken(t.db, A.members.viewer, { name: " ", scope: "read" })).rejects.toMatchObject({ field: "name" });
  });
  it("createToken and revokeToken are recorded in the audit chain", async () => {
    const { info } = await createToken(t.db, A.members.analyst, { name: "audited", scope: "read_write" });
    await revokeToken(t.db, A.members.analyst, info.id);
    const actions = (await t.db.auditEvent.findMany({ where: { objectId: info.id }, orderBy: { id: "asc" } })).map((e) => e.action);
    expect(actions).toEqual(["token.create", "token.revoke"]);
    expect(await verifyAuditChain(t.db)).toMatchObject({ ok: true, problems: [] });
  });
});

describe("revokeToken and authenticateToken", () => {
  it("revokeToken of someone else's token is NotFound for an analyst but allowed for an owner", async () => {
    const { token, info } = await createToken(t.db, A.members.reviewer, { name: "r", scope: "read" });
    await expect(revokeToken(t.db, A.members.analyst, info.id)).rejects.toThrow(NotFoundError);
    expect((await authenticateToken(t.db, token)).member.role).toBe("reviewer");
    expect((await revokeToken(t.db, A.members.owner, info.id)).revokedAt).not.toBeNull();
    await expect(authenticateToken(t.db, token)).rejects.toThrow(UnauthenticatedError);
  });
  it("authenticateToken applies the member's current role, not the role at creation", async () => {
    const { token } = await createToken(t.db, A.members.viewer, { name: "promoted", scope: "read_write" });
    await t.db.membership.update({ where: { userId_groupId: { userId: A.members.viewer.userId, groupId: A.groupId } }, data: { role: "analyst" } });
    expect((await authenticateToken(t.db, token)).member.role).toBe("analyst");
    await t.db.membership.update({ where: { userId_groupId: { userId: A.members.viewer.userId, groupId: A.groupId } }, data: { role: "viewer" } });
  });
  it("listTokens shows the member's own tokens of this group without secrets", async () => {
    const list = await listTokens(t.db, A.members.viewer);
    expect(list.length).toBeGreaterThan(0);
    expect(list.every((x) => x.userId === A.members.viewer.userId && !("tokenHash" in x))).toBe(true);
  });
});
