/**
 * Against real `next start` servers (run by `npm run test:ops`): every page of the app (each
 * app/**\/page.tsx with its parameters filled from a fixture), an API route and an unknown path
 * answer with the security headers, including a Content-Security-Policy that forbids framing,
 * foreign scripts, inline scripts (pages: only by a nonce per response), plugins and foreign form targets; the session cookie is HttpOnly,
 * SameSite=Lax, Path=/ — and Secure (with the __Secure- prefix) when the public URL is https.
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { readdirSync, statSync } from "node:fs";
import { join, relative } from "node:path";
import { randomUUID } from "node:crypto";
import { APP_DIR, opsDatabase, opsFixture, startApp, signIn, storeMeasurement, type OpsDatabase, type OpsFixture, type AppServer } from "../ops/harness";

let d: OpsDatabase;
let f: OpsFixture;
let app: AppServer;
let secure: AppServer;
const ids: Record<string, string> = {};

function pages(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return name.startsWith("_") || name === "api" ? [] : pages(path);
    return name === "page.tsx" ? [path] : [];
  });
}

function urlOf(file: string): string {
  const parts = relative(join(APP_DIR, "app"), file).split("/").slice(0, -1);
  return "/" + parts.map((p, i) => {
    if (p === "[slug]") return f.slug;
    if (p === "[id]") return ids[parts[i - 1]!] ?? randomUUID();
    if (p.startsWith("[")) return "not-a-real-token";
    return p;
  }).join("/");
}

function checkHeaders(h: Headers, where: string): string[] {
  const csp = h.get("content-security-policy") ?? "";
  const out: string[] = [];
  const want: [string, string | RegExp][] = [["x-content-type-options", "nosniff"], ["x-frame-options", "DENY"], ["referrer-policy", "same-origin"]];
  for (const [name, value] of want) if (!(typeof value === "string" ? h.get(name) === value : value.test(h.get(name) ?? ""))) out.push(`${where}: ${name} = ${h.get(name)}`);
  for (const directive of ["default-src 'self'", "frame-ancestors 'none'", "base-uri 'self'", "form-action 'self'", "connect-src 'self'"]) if (!csp.includes(directive)) out.push(`${where}: CSP lacks ${directive}`);
  const script = /script-src ([^;]*)/.exec(csp)?.[1] ?? "";
  if (!script || /\*|https?:|'unsafe-eval'|'unsafe-inline'/.test(script)) out.push(`${where}: script-src is ${script || "missing"}`);
  if (h.get("content-security-policy")?.includes(",")) out.push(`${where}: more than one policy`);
  // Pages (HTML) allow inline scripts only by this response's nonce.
  if ((h.get("content-type") ?? "").startsWith("text/html") && !/^'self' 'nonce-[A-Za-z0-9+/]{22}==' 'strict-dynamic'$/.test(script.trim())) out.push(`${where}: page script-src is ${script}`);
  if (h.get("x-powered-by")) out.push(`${where}: x-powered-by present`);
  return out;
}

beforeAll(async () => {
  d = await opsDatabase("headers");
  f = await opsFixture(d.db, "hdr");
  ids.samples = f.sampleId;
  ids.measurements = await storeMeasurement(d.db, f, 50);
  ids.analyses = (await d.db.analysis.create({ data: { groupId: f.owner.group.id, sampleId: f.sampleId, title: "headers", createdById: f.owner.userId, revisions: { create: { number: 1 } } } })).id;
  ids.series = (await d.db.series.create({ data: { groupId: f.owner.group.id, name: "headers series" } })).id;
  [app, secure] = await Promise.all([startApp(d.url), startApp(d.url, { https: true })]);
});

afterAll(async () => {
  await Promise.all([app?.kill("SIGTERM"), secure?.kill("SIGTERM")]);
  await d?.close();
});

describe("security headers on every page", () => {
  it("every page, signed in and signed out, carries the headers and the CSP", async () => {
    const { cookie } = await signIn(app.base, f.owner.email);
    const urls = pages(join(APP_DIR, "app")).map(urlOf);
    expect(urls.length).toBeGreaterThanOrEqual(15);
    const problems: string[] = [];
    const statuses: string[] = [];
    for (const url of [...urls, "/no-such-page", `/api/groups/${f.slug}/samples`, "/api/auth/csrf"]) {
      for (const headers of [{ cookie }, {}] as Record<string, string>[]) {
        const r = await fetch(`${app.base}${url}`, { headers, redirect: "manual" });
        await r.arrayBuffer();
        statuses.push(`${url} ${r.status}`);
        problems.push(...checkHeaders(r.headers, `${url} (${headers.cookie ? "signed in" : "signed out"}, ${r.status})`));
      }
    }
    expect(problems).toEqual([]);
    // A nonce is never used twice.
    const nonces = await Promise.all([0, 1, 2].map(async () => /'nonce-([^']+)'/.exec((await fetch(`${app.base}/signin`)).headers.get("content-security-policy") ?? "")?.[1]));
    expect(new Set(nonces).size).toBe(3);
    // Signed-in page loads succeed (no page answers 500).
    expect(statuses.filter((s) => / 5\d\d$/.test(s))).toEqual([]);
  });
});

describe("session cookie flags", () => {
  it("over http the session cookie is HttpOnly, SameSite=Lax, Path=/", async () => {
    const { setCookie } = await signIn(app.base, f.analyst.email);
    const session = setCookie.find((c) => c.startsWith("next-auth.session-token="))!;
    expect(session).toMatch(/;\s*HttpOnly/i);
    expect(session).toMatch(/;\s*SameSite=Lax/i);
    expect(session).toMatch(/;\s*Path=\//i);
  });

  it("with an https public URL the session cookie is also Secure with the __Secure- prefix", async () => {
    const { setCookie } = await signIn(secure.base, f.analyst.email);
    const session = setCookie.find((c) => c.startsWith("__Secure-next-auth.session-token="));
    expect(session).toBeDefined();
    expect(session).toMatch(/;\s*Secure/i);
    expect(session).toMatch(/;\s*HttpOnly/i);
    expect(session).toMatch(/;\s*SameSite=Lax/i);
  });
});
