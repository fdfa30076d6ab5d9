/**
 * Server-side sessions through the real route handlers (the cookie is a real next-auth JWT
 * naming a Session row): sign-out ends the session at once (the old cookie gets 401), "sign out
 * everywhere" ends them all, the idle timeout and the absolute lifetime end a session (time
 * injected through the session clock), and a role change or a removal takes effect on the next
 * request.
 */
import { describe, it, expect, beforeAll, afterAll, afterEach, vi } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, type GroupFixture } from "./fixtures";

const session = vi.hoisted(() => ({ userId: null as string | null, token: null as string | null }));
vi.mock("next/headers", async () => (await import("../helpers/session")).headersFor(session));

import { sessionTokenFor } from "../helpers/session";
import { authOptions } from "../../lib/server/auth/options";
import { setSessionClock, sessionPolicy, listLiveSessions, createSession } from "../../lib/server/auth/sessions";
import { changeRole, removeMember } from "../../lib/server/groups";
import { decode } from "next-auth/jwt";
import * as samplesRoute from "../../app/api/groups/[slug]/samples/route";
import * as accountSessions from "../../app/api/account/sessions/route";
import * as endAll from "../../app/api/account/sessions/end-all/route";

let t: TestDatabase;
let g: GroupFixture;

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  g = await makeGroup(t.db, "Sessions group");
});
afterAll(async () => { await t.drop(); });
afterEach(() => { setSessionClock(undefined); session.token = null; session.userId = null; });

const listSamples = async () => (await samplesRoute.GET(new Request(`http://localhost/api/groups/${g.slug}/samples`), { params: Promise.resolve({ slug: g.slug }) })).status;
const createSample = async (label: string) =>
  (await samplesRoute.POST(new Request(`http://localhost/api/groups/${g.slug}/samples`, { method: "POST", body: JSON.stringify({ label, formula: "Cu", massMg: 10 }), headers: { "content-type": "application/json" } }), { params: Promise.resolve({ slug: g.slug }) })).status;
const mySessions = async () => accountSessions.GET(new Request("http://localhost/api/account/sessions"), { params: Promise.resolve({}) });

async function signedInAs(userId: string): Promise<string> {
  session.token = await sessionTokenFor(userId);
  return session.token;
}

describe("sign-out", () => {
  it("next-auth's signOut event ends the session: the same cookie then gets 401 on group and account routes", async () => {
    const token = await signedInAs(g.members.viewer.userId);
    expect(await listSamples()).toBe(200);
    expect((await mySessions()).status).toBe(200);
    const claims = await decode({ token, secret: process.env.NEXTAUTH_SECRET! });
    await authOptions.events!.signOut!({ token: claims!, session: undefined as never });
    expect(await listSamples()).toBe(401);
    expect((await mySessions()).status).toBe(401);
  });

  it("currentUser and next-auth's session callback see a live session, and nothing once it has ended", async () => {
    const { currentUser } = await import("../../lib/server/session");
    const token = await signedInAs(g.members.reviewer.userId);
    const claims = (await decode({ token, secret: process.env.NEXTAUTH_SECRET! }))!;
    const base = { user: { email: "x@example.org" }, expires: "2099-01-01T00:00:00.000Z" };
    const callback = authOptions.callbacks!.session! as unknown as (p: unknown) => Promise<{ user?: unknown }>;
    expect((await currentUser())?.id).toBe(g.members.reviewer.userId);
    expect((await callback({ session: structuredClone(base), token: claims })).user).toBeDefined();
    await authOptions.events!.signOut!({ token: claims, session: undefined as never });
    expect(await currentUser()).toBeNull();
    expect((await callback({ session: structuredClone(base), token: claims })).user).toBeUndefined();
  });

  it("POST /api/account/sessions/end-all ends every session of the user and no one else's", async () => {
    const other = await sessionTokenFor(g.members.reviewer.userId);
    const first = await signedInAs(g.members.analyst.userId);
    const second = await sessionTokenFor(g.members.analyst.userId);
    expect((await listLiveSessions(t.db, g.members.analyst.userId)).length).toBeGreaterThanOrEqual(2);
    const res = await endAll.POST(new Request("http://localhost/api/account/sessions/end-all", { method: "POST" }), { params: Promise.resolve({}) });
    expect(res.status).toBe(200);
    expect((await res.json()).ended).toBeGreaterThanOrEqual(2);
    for (const token of [first, second]) {
      session.token = token;
      expect(await listSamples()).toBe(401);
    }
    session.token = other;
    expect(await listSamples()).toBe(200);
  });

  it("a cookie naming no session (or a made-up one) gets 401", async () => {
    session.userId = g.members.viewer.userId;
    const { encode } = await import("next-auth/jwt");
    session.token = await encode({ token: { uid: g.members.viewer.userId, sid: "3f1e7c2a-0000-4000-8000-000000000001" }, secret: process.env.NEXTAUTH_SECRET! });
    expect(await listSamples()).toBe(401);
    session.token = await encode({ token: { uid: g.members.viewer.userId }, secret: process.env.NEXTAUTH_SECRET! });
    expect(await listSamples()).toBe(401);
  });

  it("a cookie of one user naming another user's session gets 401", async () => {
    const { encode } = await import("next-auth/jwt");
    const sid = await createSession(t.db, g.members.owner.userId);
    session.token = await encode({ token: { uid: g.members.viewer.userId, sid }, secret: process.env.NEXTAUTH_SECRET! });
    expect(await listSamples()).toBe(401);
  });
});

describe("idle timeout and absolute lifetime", () => {
  it("a session unused for longer than the idle timeout is refused; used within it, it stays", async () => {
    const { idleSeconds } = sessionPolicy();
    const t0 = Date.now();
    await signedInAs(g.members.viewer.userId);
    setSessionClock(() => t0 + (idleSeconds - 120) * 1000);
    expect(await listSamples()).toBe(200); // used: lastSeenAt moves on
    setSessionClock(() => t0 + (2 * idleSeconds - 240) * 1000);
    expect(await listSamples()).toBe(200);
    setSessionClock(() => t0 + (3 * idleSeconds) * 1000);
    expect(await listSamples()).toBe(401);
  });

  it("a session in steady use is refused after its absolute lifetime", async () => {
    const { idleSeconds, maxSeconds } = sessionPolicy();
    const t0 = Date.now();
    await signedInAs(g.members.viewer.userId);
    let at = 0;
    while (at + idleSeconds / 2 < maxSeconds - 60) {
      at += idleSeconds / 2;
      setSessionClock(() => t0 + at * 1000);
      expect(await listSamples()).toBe(200);
    }
    setSessionClock(() => t0 + (maxSeconds + 60) * 1000);
    expect(await listSamples()).toBe(401);
  });

  it("HEATBOOK_SESSION_IDLE_MINUTES and HEATBOOK_SESSION_MAX_HOURS set the policy", () => {
    process.env.HEATBOOK_SESSION_IDLE_MINUTES = "15";
    process.env.HEATBOOK_SESSION_MAX_HOURS = "8";
    try {
      expect(sessionPolicy()).toEqual({ idleSeconds: 900, maxSeconds: 28_800 });
    } finally {
      delete process.env.HEATBOOK_SESSION_IDLE_MINUTES;
      delete process.env.HEATBOOK_SESSION_MAX_HOURS;
    }
    expect(sessionPolicy()).toEqual({ idleSeconds: 7200, maxSeconds: 43_200 });
  });
});

describe("membership changes on the next request", () => {
  it("a role change takes effect on the same session's next request, and a removal answers 404", async () => {
    const g2 = await makeGroup(t.db, "Role change group");
    const prev = g;
    g = g2;
    try {
      await signedInAs(g2.members.analyst.userId);
      expect(await createSample("before")).toBe(201);
      await changeRole(t.db, g2.members.owner, g2.members.analyst.userId, { role: "viewer" });
      expect(await createSample("after demotion")).toBe(403);
      expect(await listSamples()).toBe(200);
      await removeMember(t.db, g2.members.owner, g2.members.analyst.userId);
      expect(await listSamples()).toBe(404);
    } finally {
      g = prev;
    }
  });
});
