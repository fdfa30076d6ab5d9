/** inGroup: the signed-in user and their membership of the route's group in one query; 401 and 404 kept apart. */
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, makeUser, type GroupFixture } from "./fixtures";

const session = vi.hoisted(() => ({ userId: null as string | null }));
vi.mock("next/headers", async () => (await import("../helpers/session")).headersFor(session));

import { inGroup } from "../../lib/server/handler";

let t: TestDatabase;
let g: GroupFixture;
const get = () => new Request("http://localhost/api/x");

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  g = await makeGroup(t.db);
});
afterAll(async () => { await t.drop(); });

describe("inGroup", () => {
  it("inGroup gives the member's role, group and user, by the group's slug or its id", async () => {
    session.userId = g.members.reviewer.userId;
    const bySlug = await inGroup(get(), g.slug);
    expect(bySlug.member).toEqual(g.members.reviewer);
    const user = await t.db.user.findUniqueOrThrow({ where: { id: g.members.reviewer.userId }, select: { id: true, email: true, name: true } });
    expect(bySlug.user).toEqual(user);
    expect((await inGroup(get(), g.groupId)).member).toEqual(g.members.reviewer);
  });

  it("inGroup answers 404 for a group the user is not in (or that does not exist) and 401 when signed out or the user is gone", async () => {
    const outsider = await makeUser(t.db, "outsider");
    session.userId = outsider.id;
    await expect(inGroup(get(), g.slug)).rejects.toMatchObject({ name: "NotFoundError" });
    await expect(inGroup(get(), "no-such-group")).rejects.toMatchObject({ name: "NotFoundError" });
    session.userId = null;
    await expect(inGroup(get(), g.slug)).rejects.toMatchObject({ name: "UnauthenticatedError" });
    await t.db.user.delete({ where: { id: outsider.id } });
    session.userId = outsider.id;
    await expect(inGroup(get(), g.slug)).rejects.toMatchObject({ name: "UnauthenticatedError" });
  });

  it("inGroup refuses a write from another origin before reading anything", async () => {
    session.userId = g.members.owner.userId;
    const req = new Request("http://localhost/api/x", { method: "POST", headers: { origin: "https://elsewhere.example", host: "localhost" } });
    await expect(inGroup(req, g.slug)).rejects.toMatchObject({ name: "ForbiddenError" });
  });
});
