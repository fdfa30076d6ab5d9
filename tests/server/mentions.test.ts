/** @mentions by member handle: every member gets a handle unique in the group; a mention that matches nobody is reported. */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, type GroupFixture } from "./fixtures";
import { createSample } from "../../lib/server/samples";
import { createAnalysis, createThread, replyToThread, mentionedHandles } from "../../lib/server/notebook";
import { listMembers } from "../../lib/server/groups";
import { mentionAt, unknownMentions } from "../../app/_lib/mentions";

let t: TestDatabase;
let g: GroupFixture;
let analysisId: string;
let rosa: { id: string };
let rosa2: { id: string };

beforeAll(async () => {
  t = await freshDatabase();
  g = await makeGroup(t.db);
  rosa = await t.db.user.create({ data: { email: `r.k-${Date.now()}@example.org`, name: "Rosa Kowalczyk" } });
  rosa2 = await t.db.user.create({ data: { email: `rosa.b-${Date.now()}@example.org`, name: "Rosa Brandt" } });
  await t.db.membership.create({ data: { userId: rosa.id, groupId: g.groupId, role: "reviewer" } });
  await t.db.membership.create({ data: { userId: rosa2.id, groupId: g.groupId, role: "viewer" } });
  const s = await createSample(t.db, g.members.analyst, { label: "M-1", formula: "Nb", massMg: 10 });
  analysisId = (await createAnalysis(t.db, g.members.analyst, { sampleId: s.id, title: "M-1 γ" })).id;
});
afterAll(async () => { await t.drop(); });

describe("member handles and mentions", () => {
  it("every member gets a handle from the first name, made unique within the group, shown in the member list", async () => {
    const members = await listMembers(t.db, g.members.owner);
    const handles = members.map((m) => m.handle);
    expect(new Set(handles).size).toBe(handles.length);
    expect(members.find((m) => m.userId === rosa.id)!.handle).toBe("rosa");
    expect(members.find((m) => m.userId === rosa2.id)!.handle).toBe("rosa2");
  });

  it("a handle is unique within a group but the same handle may exist in another group", async () => {
    const other = await makeGroup(t.db, "Other group");
    await t.db.membership.create({ data: { userId: rosa.id, groupId: other.groupId, role: "viewer" } });
    const row = await t.db.membership.findFirst({ where: { userId: rosa.id, groupId: other.groupId } });
    expect(row!.handle).toBe("rosa");
    await expect(t.db.membership.update({ where: { id: row!.id }, data: { handle: (await t.db.membership.findFirst({ where: { groupId: other.groupId, userId: { not: rosa.id } } }))!.handle } })).rejects.toThrow();
  });

  it("createThread notifies a member mentioned by handle and reports handles that match nobody", async () => {
    const before = await t.db.notice.count({ where: { userId: rosa.id, kind: "mention" } });
    const r = await createThread(t.db, g.members.analyst, analysisId, { body: "@rosa please check the upturn; cc @nobody-here." });
    expect(r.unmatchedMentions).toEqual(["nobody-here"]);
    expect(await t.db.notice.count({ where: { userId: rosa.id, kind: "mention" } })).toBe(before + 1);
    expect(await t.db.notice.count({ where: { userId: rosa2.id, kind: "mention" } })).toBe(0);
    const reply = await replyToThread(t.db, g.members.owner, analysisId, r.threadId, { body: "Agreed with @rosa2." });
    expect(reply.unmatchedMentions).toEqual([]);
    expect(await t.db.notice.count({ where: { userId: rosa2.id, kind: "mention" } })).toBe(1);
  });

  it("mentionedHandles reads @handles but not e-mail addresses", () => {
    expect(mentionedHandles("ask @rosa and @Viktor. mail a@b.org; @rosa again")).toEqual(["rosa", "viktor"]);
  });

  it("mentionAt finds the handle being typed at the caret, and unknownMentions names handles of no member", () => {
    expect(mentionAt("see @ro", 7)).toEqual({ start: 4, query: "ro" });
    expect(mentionAt("mail a@b", 8)).toBeNull();
    expect(unknownMentions("@rosa and @zed", [{ handle: "rosa", name: "Rosa" }])).toEqual(["zed"]);
  });
});
