/**
 * CSRF walk: every cookie-authenticated write route under app/api (POST, PATCH, PUT, DELETE)
 * is called by a signed-in group owner with a foreign Origin header, and must refuse with 403
 * before doing anything (assertSameOrigin in lib/server/handler.ts); nothing is written (audit
 * rows, groups, samples, jobs counted before and after). The v1 API authenticates with bearer
 * tokens only (no ambient cookie), so it is outside this walk; next-auth's own routes carry
 * its CSRF token. Same-origin calls are not refused by the check (one control case).
 */
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import { readdirSync, statSync } from "node:fs";
import { join, relative } from "node:path";
import { randomUUID } from "node:crypto";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, type GroupFixture } from "../server/fixtures";

const session = vi.hoisted(() => ({ userId: null as string | null }));
vi.mock("next/headers", async () => (await import("../helpers/session")).headersFor(session));

const WRITE = ["POST", "PATCH", "PUT", "DELETE"] as const;

function routeFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return routeFiles(path);
    return name === "route.ts" ? [path] : [];
  });
}

const FILES = routeFiles("app/api").filter((f) => !f.startsWith(join("app", "api", "v1")) && !f.includes("[...nextauth]")).sort();

let t: TestDatabase;
let g: GroupFixture;

async function counts() {
  const [audit, groups, samples, jobs] = await Promise.all([t.db.auditEvent.count(), t.db.group.count(), t.db.sample.count(), t.db.$queryRaw<{ n: bigint }[]>`SELECT count(*) AS n FROM "JobRun"`]);
  return { audit, groups, samples, jobs: Number(jobs[0]!.n) };
}

function paramsFor(file: string): Record<string, string> {
  const params: Record<string, string> = {};
  for (const m of relative("app/api", file).matchAll(/\[(\w+)\]/g)) params[m[1]!] = m[1] === "slug" ? g.slug : randomUUID();
  return params;
}

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  g = await makeGroup(t.db, "CSRF group");
  session.userId = g.members.owner.userId;
});
afterAll(async () => t.drop());

describe("cross-origin writes to every cookie-authenticated route", () => {
  it("finds the write routes to walk", async () => {
    expect(FILES.length).toBeGreaterThan(30);
  });

  it("each write handler answers 403 to a foreign Origin and writes nothing", async () => {
    const before = await counts();
    const open: string[] = [];
    let walked = 0;
    for (const file of FILES) {
      const mod = (await import(/* @vite-ignore */ `../../${file}`)) as Record<string, unknown>;
      for (const method of WRITE) {
        const handler = mod[method] as ((req: Request, ctx: unknown) => Promise<Response>) | undefined;
        if (!handler) continue;
        walked++;
        const req = new Request(`http://localhost:3000/${relative("app", file)}`, {
          method,
          headers: { origin: "https://evil.example", host: "localhost:3000", "content-type": "application/json" },
          ...(method === "DELETE" ? {} : { body: JSON.stringify({ name: "csrf", title: "csrf", label: "csrf", formula: "Cu", email: "x@evil.example", role: "owner", action: "archive", archived: true }) }),
        });
        const res = await handler(req, { params: Promise.resolve(paramsFor(file)) });
        if (res.status !== 403) open.push(`${method} ${file} → ${res.status}`);
      }
    }
    expect(walked).toBeGreaterThanOrEqual(30); // 34 write handlers when this was written
    expect(open).toEqual([]);
    expect(await counts()).toEqual(before);
  }, 120_000);

  it("the same write from our own origin is not refused by the origin check", async () => {
    const mod = await import("../../app/api/groups/[slug]/samples/route");
    const res = await mod.POST(new Request("http://localhost:3000/api/groups/x/samples", {
      method: "POST", headers: { origin: "http://localhost:3000", host: "localhost:3000", "content-type": "application/json" },
      body: JSON.stringify({ label: "same-origin", formula: "Cu" }),
    }), { params: Promise.resolve({ slug: g.slug }) });
    expect(res.status).toBe(201);
  });
});
