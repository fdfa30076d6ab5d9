/**
 * Authorization walk: every data route, called as a member of another group (gets 404 and no
 * data) and as a viewer (reads work, every write is refused with 403) — also with broken bodies
 * and no query, so access is checked before any validation. The list of routes is
 * checked against the route files on disk, so a new route without an entry here fails the test.
 */
import { test, expect, request as newRequest, type APIRequestContext } from "@playwright/test";
import { readdirSync, readFileSync, statSync } from "node:fs";
import { join } from "node:path";
import { apiSignIn, DEMO } from "./helpers";

/** viewer: the status a viewer gets when it is not the default (200 for reads, 403 for writes). */
interface RouteCase { method: "GET" | "POST" | "PATCH" | "DELETE"; path: string; body?: unknown; multipart?: boolean; viewer?: number }

/** Routes that are not group data: sign-in machinery, sign-up, the caller's own group list and creation, invitation acceptance by token, the caller's own sessions (tests/server/auth-sessions.test.ts, e2e/sessions.spec.ts), the load balancer's health check (tests/server/health.test.ts). */
const NOT_GROUP_DATA = new Set(["/api/auth/[...nextauth]", "/api/signup", "/api/groups", "/api/invitations/[token]/accept", "/api/account/sessions", "/api/account/sessions/end-all", "/api/health", "/api/password-links/[token]"]);

function routeFiles(dir: string, prefix = ""): { route: string; methods: string[] }[] {
  const out: { route: string; methods: string[] }[] = [];
  for (const name of readdirSync(dir)) {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) out.push(...routeFiles(path, `${prefix}/${name}`));
    else if (name === "route.ts") {
      const methods = [...readFileSync(path, "utf8").matchAll(/export const (GET|POST|PATCH|DELETE|PUT)\b/g)].map((m) => m[1]!);
      out.push({ route: `/api${prefix}`, methods });
    }
  }
  return out;
}

/** "/api/groups/lab/samples/<uuid>" → "/api/groups/[slug]/samples/[id]" */
function template(path: string): string {
  return path.split("?")[0]!.replace(/^\/api\/groups\/[^/]+/, "/api/groups/[slug]").replace(/\/[0-9a-f]{8}-[0-9a-f-]{27}/g, "/[id]").replace(/\/figures\/[^/]+$/, "/figures/[figure]");
}

const NO_SUCH_ID = "0f0f0f0f-0f0f-4f0f-8f0f-0f0f0f0f0f0f";

let ids: { slug: string; sampleId: string; measurementId: string; memberId: string; invitationId: string; analysisId: string; revisionId: string; stepId: string; threadId: string; seriesId: string };

function cases(): RouteCase[] {
  const g = `/api/groups/${ids.slug}`;
  const csv = "T,C\n2,1e-6\n3,2e-6\n";
  return [
    { method: "GET", path: g },
    { method: "PATCH", path: g, body: { allowSelfApproval: true } },
    { method: "GET", path: `${g}/invitations`, viewer: 403 },
    { method: "POST", path: `${g}/invitations`, body: { email: "someone@example.org", role: "viewer" } },
    { method: "DELETE", path: `${g}/invitations/${ids.invitationId}` },
    { method: "PATCH", path: `${g}/members/${ids.memberId}`, body: { role: "viewer" } },
    { method: "DELETE", path: `${g}/members/${ids.memberId}` },
    { method: "GET", path: `${g}/samples` },
    { method: "POST", path: `${g}/samples`, body: { label: "intruder", formula: "Cu" } },
    { method: "GET", path: `${g}/samples/${ids.sampleId}` },
    { method: "PATCH", path: `${g}/samples/${ids.sampleId}`, body: { label: "changed", version: 1 } },
    { method: "POST", path: `${g}/samples/${ids.sampleId}`, body: { archived: true } },
    { method: "POST", path: `${g}/samples/${ids.sampleId}/imports`, multipart: true, body: csv },
    { method: "GET", path: `${g}/samples/${ids.sampleId}/measurements` },
    { method: "POST", path: `${g}/samples/${ids.sampleId}/measurements`, multipart: true, body: csv },
    { method: "GET", path: `${g}/measurements/${ids.measurementId}` },
    { method: "GET", path: `${g}/measurements/${ids.measurementId}/original` },
    { method: "GET", path: `${g}/analyses` },
    { method: "POST", path: `${g}/analyses`, body: { sampleId: ids.sampleId, title: "intruder" } },
    { method: "GET", path: `${g}/analyses/${ids.analysisId}` },
    { method: "PATCH", path: `${g}/analyses/${ids.analysisId}`, body: { title: "renamed" } },
    { method: "POST", path: `${g}/analyses/${ids.analysisId}`, body: { action: "archive", archived: true } },
    { method: "POST", path: `${g}/analyses/${ids.analysisId}/steps`, body: { revisionId: ids.revisionId, revisionVersion: 1, kind: "note" } },
    { method: "PATCH", path: `${g}/analyses/${ids.analysisId}/steps/${ids.stepId}`, body: { version: 1, config: {} } },
    { method: "DELETE", path: `${g}/analyses/${ids.analysisId}/steps/${ids.stepId}?revisionVersion=1` },
    { method: "POST", path: `${g}/analyses/${ids.analysisId}/steps/${ids.stepId}`, body: { action: "move", position: 0, revisionVersion: 1 } },
    { method: "GET", path: `${g}/analyses/${ids.analysisId}/threads` },
    { method: "POST", path: `${g}/analyses/${ids.analysisId}/threads`, body: { body: "intruder" } },
    { method: "POST", path: `${g}/analyses/${ids.analysisId}/threads/${ids.threadId}`, body: { body: "intruder" } },
    { method: "PATCH", path: `${g}/analyses/${ids.analysisId}/threads/${ids.threadId}`, body: { state: "resolved" } },
    { method: "GET", path: `${g}/events?once=1` },
    { method: "GET", path: `${g}/analyses/${ids.analysisId}/review` },
    { method: "POST", path: `${g}/analyses/${ids.analysisId}/review`, body: { revisionId: ids.revisionId, action: "submit", version: 1 } },
    { method: "POST", path: `${g}/analyses/${ids.analysisId}/review/revise`, body: {} },
    { method: "GET", path: `${g}/analyses/${ids.analysisId}/review/verify?revision=${ids.revisionId}` },
    { method: "GET", path: `${g}/analyses/${ids.analysisId}/review/diff?a=${ids.revisionId}&b=${ids.revisionId}` },
    { method: "GET", path: `${g}/analyses/${ids.analysisId}/report.pdf?revision=${ids.revisionId}` },
    { method: "GET", path: `${g}/analyses/${ids.analysisId}/figures/no-such-figure?revision=${ids.revisionId}`, viewer: 404 },
    { method: "GET", path: `${g}/analyses/${ids.analysisId}/steps/${ids.stepId}/figure`, viewer: 404 },
    { method: "GET", path: `${g}/analyses/${ids.analysisId}/review/preview?revision=${ids.revisionId}`, viewer: 403 },
    { method: "POST", path: `${g}/members/${ids.memberId}/password-link`, body: {} },
    { method: "GET", path: `${g}/notices` },
    { method: "POST", path: `${g}/notices`, body: { action: "read-all" }, viewer: 200 },
    { method: "PATCH", path: `${g}/notices/${NO_SUCH_ID}`, body: { read: true }, viewer: 404 },
    { method: "GET", path: `${g}/notices/queue` },
    { method: "GET", path: `${g}/audit`, viewer: 403 },
    { method: "GET", path: `${g}/audit/verify`, viewer: 403 },
    { method: "GET", path: `${g}/series` },
    { method: "POST", path: `${g}/series`, body: { name: "intruder" } },
    { method: "GET", path: `${g}/series/${ids.seriesId}` },
    { method: "PATCH", path: `${g}/series/${ids.seriesId}`, body: { name: "renamed" } },
    { method: "GET", path: `${g}/series/${ids.seriesId}/export` },
    { method: "POST", path: `${g}/series/${ids.seriesId}/members`, body: { sampleIds: [ids.sampleId] } },
    { method: "DELETE", path: `${g}/series/${ids.seriesId}/members/${ids.sampleId}` },
    // Personal tokens: every member may make their own (token.create), so a viewer gets 201; revoking an unknown one is 404.
    { method: "GET", path: `${g}/tokens` },
    { method: "POST", path: `${g}/tokens`, body: { name: "viewer's script", scope: "read" }, viewer: 201 },
    { method: "DELETE", path: `${g}/tokens/${NO_SUCH_ID}`, viewer: 404 },
    { method: "POST", path: `${g}/tokens/${NO_SUCH_ID}/renew`, body: {}, viewer: 404 },
    { method: "GET", path: `${g}/jobs` },
    { method: "POST", path: `${g}/jobs`, body: { kind: "refit-series", seriesId: ids.seriesId } },
    { method: "GET", path: `${g}/jobs/${NO_SUCH_ID}`, viewer: 404 },
  ];
}

async function call(ctx: APIRequestContext, c: RouteCase) {
  if (c.multipart) {
    return ctx.fetch(c.path, {
      method: c.method,
      multipart: {
        file: { name: "x.csv", mimeType: "text/csv", buffer: Buffer.from(String(c.body)) },
        options: JSON.stringify({ kind: "sample", label: "x", mapping: { temperature: 0, heatCapacity: 1 }, units: { temperature: "K", heatCapacity: "J/K" } }),
      },
    });
  }
  return ctx.fetch(c.path, { method: c.method, ...(c.body !== undefined ? { data: c.body } : {}) });
}

test.describe("authorization walk over every data route", () => {
  let owner: APIRequestContext;

  test.beforeAll(async ({ baseURL }) => {
    owner = await newRequest.newContext({ baseURL });
    await apiSignIn(owner, DEMO.owner);
    const groups = (await (await owner.get("/api/groups")).json()).groups as { slug: string; name: string }[];
    const slug = groups.find((g) => g.name.startsWith("Cryogenic"))!.slug;
    const samples = (await (await owner.get(`/api/groups/${slug}/samples`)).json()).samples as { id: string; label: string }[];
    const sampleId = samples.find((s) => s.label.startsWith("NM-02"))!.id;
    const detail = await (await owner.get(`/api/groups/${slug}/samples/${sampleId}`)).json();
    const members = (await (await owner.get(`/api/groups/${slug}`)).json()).members as { userId: string; email: string }[];
    const inv = await (await owner.post(`/api/groups/${slug}/invitations`, { data: { email: "pending@example.org", role: "analyst" } })).json();
    const analyses = (await (await owner.get(`/api/groups/${slug}/analyses`)).json()).analyses as { id: string; sampleId: string }[];
    const analysisId = analyses.find((a) => a.sampleId === sampleId)!.id;
    const nb = (await (await owner.get(`/api/groups/${slug}/analyses/${analysisId}`)).json()).notebook;
    const thread = await (await owner.post(`/api/groups/${slug}/analyses/${analysisId}/threads`, { data: { body: "authorization walk fixture" } })).json();
    ids = {
      slug, sampleId, measurementId: detail.measurements[0].id, memberId: members.find((m) => m.email === DEMO.analyst)!.userId, invitationId: inv.invitation.id,
      analysisId, revisionId: nb.revision.id, stepId: nb.steps[0].id, threadId: thread.threadId,
      seriesId: ((await (await owner.get(`/api/groups/${slug}/series`)).json()).series as { id: string }[])[0]!.id,
    };
  });

  test.afterAll(async () => { await owner.dispose(); });

  test("every group data route on disk has a case in this walk", () => {
    // /api/v1 is the token API: its own walk is in tests/server/api*.test.ts (scopes, revoked tokens, other groups).
    const onDisk = routeFiles("app/api").filter((r) => !NOT_GROUP_DATA.has(r.route) && !r.route.startsWith("/api/v1")).flatMap((r) => r.methods.map((m) => `${m} ${r.route}`));
    const covered = new Set(cases().map((c) => `${c.method} ${template(c.path)}`));
    const normalise = (s: string) => s.replace(/\[(userId|token|stepId|threadId|sampleId)\]/g, "[id]");
    const missing = onDisk.map(normalise).filter((r) => !covered.has(r));
    expect(missing).toEqual([]);
  });

  test("a member of another group gets 404 and no data from every route", async ({ baseURL }) => {
    const outsider = await newRequest.newContext({ baseURL });
    await apiSignIn(outsider, DEMO.outsider);
    for (const c of cases()) {
      const res = await call(outsider, c);
      expect(res.status(), `${c.method} ${c.path}`).toBe(404);
      const text = await res.text();
      expect(text, `${c.method} ${c.path} leaks nothing`).not.toMatch(/Nb|NM-0|Cryogenic/);
    }
    await outsider.dispose();
  });

  test("a viewer reads every route and is refused every write with 403", async ({ baseURL }) => {
    const viewer = await newRequest.newContext({ baseURL });
    await apiSignIn(viewer, DEMO.viewer);
    for (const c of cases()) {
      const res = await call(viewer, c);
      expect(res.status(), `${c.method} ${c.path}`).toBe(c.viewer ?? (c.method === "GET" ? 200 : 403));
    }
    // Nothing was changed by the refused writes.
    const sample = (await (await viewer.get(`/api/groups/${ids.slug}/samples/${ids.sampleId}`)).json()).sample;
    expect(sample.label).toMatch(/^NM-02/);
    expect(sample.archived).toBe(false);
    await viewer.dispose();
  });

  test("access is checked before input: with broken bodies and no query, another group's member gets 404, a viewer 403 on writes, a stranger 401", async ({ baseURL }) => {
    const outsider = await newRequest.newContext({ baseURL });
    await apiSignIn(outsider, DEMO.outsider);
    const viewer = await newRequest.newContext({ baseURL });
    await apiSignIn(viewer, DEMO.viewer);
    const anon = await newRequest.newContext({ baseURL });
    // Invalid JSON with a NUL and 100 levels of nesting; query parameters dropped (e.g. review/diff's a and b).
    const broken = (ctx: APIRequestContext, c: RouteCase) => ctx.fetch(c.path.split("?")[0]!, {
      method: c.method, headers: { "content-type": "application/json" }, ...(c.method === "GET" ? {} : { data: `{"label":"\u0000",${"[".repeat(100)}` }),
    });
    for (const c of cases()) {
      expect((await broken(outsider, c)).status(), `outsider ${c.method} ${c.path}`).toBe(404);
      expect((await broken(anon, c)).status(), `signed out ${c.method} ${c.path}`).toBe(401);
      if (c.method !== "GET" && (c.viewer ?? 403) === 403) expect((await broken(viewer, c)).status(), `viewer ${c.method} ${c.path}`).toBe(403);
    }
    await Promise.all([outsider.dispose(), viewer.dispose(), anon.dispose()]);
  });

  test("signed-out requests get 401 from every route", async ({ baseURL }) => {
    const anon = await newRequest.newContext({ baseURL });
    for (const c of cases()) {
      const res = await call(anon, c);
      expect(res.status(), `${c.method} ${c.path}`).toBe(401);
    }
    await anon.dispose();
  });
});
