/**
 * Access before validation, on every route handler under app/api (found on disk, so a new route
 * is walked too): with a broken body (invalid JSON, a NUL, 100 levels of nesting) and missing or
 * garbage query parameters, a signed-out caller gets 401 and a signed-in member of another group
 * 404, and a viewer 403 on every write they may not make — never 422, which would tell a caller
 * without access something about the route's input. Public routes
 * (sign-in machinery, sign-up, health, the API description) are listed and skipped; the v1 token
 * API is called without a token (401). e2e/authz.spec.ts walks the same with a viewer's role.
 */
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import { readdirSync, statSync } from "node:fs";
import { join, relative } from "node:path";
import { randomUUID } from "node:crypto";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, makeUser, type GroupFixture } from "../server/fixtures";

const session = vi.hoisted(() => ({ userId: null as string | null }));
vi.mock("next/headers", async () => (await import("../helpers/session")).headersFor(session));

// Public, or authorised by a token in the path (a password-set link is the access itself).
const PUBLIC = new Set(["auth/[...nextauth]", "signup", "health", "v1/openapi.json", "password-links/[token]"]);
const METHODS = ["GET", "POST", "PATCH", "PUT", "DELETE"] as const;

function routeFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? routeFiles(path) : name === "route.ts" ? [path] : [];
  });
}

type H = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

let t: TestDatabase;
let g: GroupFixture;
let strangerId: string;

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  g = await makeGroup(t.db, "Order group");
  strangerId = (await makeUser(t.db, "stranger")).id;
});
afterAll(async () => t.drop());

const BROKEN_BODIES: [string, string][] = [
  ["invalid JSON", '{"label": '],
  ["a NUL in a label", JSON.stringify({ label: "a\u0000b", title: "x\u0000", name: "n\u0000", email: "e\u0000@x" })],
  ["deep nesting", "[".repeat(100) + "]".repeat(100)],
];

/** Writes a viewer may make (their own notices and tokens): validation may answer there. */
const VIEWER_WRITES = new Set(["POST groups/[slug]/notices", "PATCH groups/[slug]/notices/[id]", "POST groups/[slug]/tokens", "DELETE groups/[slug]/tokens/[id]", "POST groups/[slug]/tokens/[id]/renew"]);
function viewerExpects(method: string, route: string): number | null {
  if (method === "GET" || VIEWER_WRITES.has(`${method} ${route}`)) return null;
  return 403;
}

async function walk(as: string | null): Promise<{ calls: number; wrong: string[] }> {
  session.userId = as;
  const root = join(process.cwd(), "app", "api");
  const wrong: string[] = [];
  let calls = 0;
  for (const file of routeFiles(root)) {
    const route = relative(root, file).replace(/\/?route\.ts$/, "");
    if (PUBLIC.has(route)) continue;
    // The caller's own sessions: signed out they answer 401 (walked); signed in, "end all" would end the walk's own session.
    if (route.startsWith("account/") && as !== null) continue;
    const mod = (await import(/* @vite-ignore */ file)) as Record<string, H | undefined>;
    const params: Record<string, string> = {};
    for (const m of route.matchAll(/\[(\w+)\]/g)) params[m[1]!] = m[1] === "slug" ? g.slug : randomUUID();
    const path = route.replace(/\[(\w+)\]/g, (_, k: string) => params[k]!);
    for (const method of METHODS) {
      const handler = mod[method];
      if (!handler) continue;
      const bodies: [string, string | undefined][] = method === "GET" || method === "DELETE" ? [["no body", undefined], ["no body, no query", undefined]] : BROKEN_BODIES;
      for (const [what, body] of bodies) {
        const url = `http://localhost/api/${path}${what.endsWith("no query") ? "" : "?a=&take=lots&revision=%00&revisionVersion=x"}`;
        const res = await handler(new Request(url, { method, body, headers: body ? { "content-type": "application/json" } : {} }), { params: Promise.resolve(params) });
        calls++;
        const expected = route.startsWith("v1/") || as === null ? 401 : route === "groups" || route.startsWith("invitations/") ? null : as === g.members.viewer.userId ? viewerExpects(method, route) : 404;
        if (expected !== null && res.status !== expected) wrong.push(`${method} /api/${route} (${what}) → ${res.status} ${(await res.text()).slice(0, 120)}`);
        if (expected === null && res.status >= 500) wrong.push(`${method} /api/${route} (${what}) → ${res.status}`);
      }
    }
  }
  return { calls, wrong };
}

describe("every route checks access before it validates input", () => {
  it("every route answers 401 to a signed-out caller whatever the body and query", async () => {
    const { calls, wrong } = await walk(null);
    expect(calls).toBeGreaterThan(60);
    expect(wrong).toEqual([]);
  }, 120_000);

  it("every group write route refuses a viewer with 403 before it reads the broken body or query", async () => {
    const { calls, wrong } = await walk(g.members.viewer.userId);
    expect(calls).toBeGreaterThan(60);
    expect(wrong).toEqual([]);
  }, 120_000);

  it("every group route answers 404 to a member of no group whatever the body and query", async () => {
    const { calls, wrong } = await walk(strangerId);
    expect(calls).toBeGreaterThan(60);
    expect(wrong).toEqual([]);
  }, 120_000);
});
