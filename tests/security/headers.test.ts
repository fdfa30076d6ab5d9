/**
 * Security headers: next.config.js sends the framing, sniffing and referrer headers on every
 * path and a fixed policy without inline scripts on the paths proxy.ts does not see (API routes,
 * static files); proxy.ts sends every page a Content-Security-Policy with a fresh nonce and no
 * 'unsafe-inline' for scripts, and hands the nonce to the render. tests/security/headers.ops.test.ts
 * checks the responses of a running server; e2e/csp.spec.ts the browser.
 */
import { describe, it, expect } from "vitest";
import { NextRequest } from "next/server";
// @ts-expect-error next.config.js is plain JavaScript without a declaration file
import nextConfig from "../../next.config.js";
import { proxy, config as proxyConfig } from "../../proxy";
import { newNonce, pageContentSecurityPolicy } from "../../lib/server/csp";

type Header = { key: string; value: string };
type Rule = { source: string; headers: Header[] };

const scriptSrc = (csp: string) => /script-src ([^;]*)/.exec(csp)?.[1] ?? "";

function checkCommon(csp: string): void {
  for (const d of ["default-src 'self'", "connect-src 'self'", "frame-ancestors 'none'", "base-uri 'self'", "form-action 'self'", "object-src 'none'"]) expect(csp).toContain(d);
  expect(scriptSrc(csp)).not.toMatch(/\*|https?:|'unsafe-inline'/);
}

describe("next.config.js headers()", () => {
  it("headers() covers every path with the framing, sniffing and referrer headers and no x-powered-by", async () => {
    const rules = (await (nextConfig as { headers(): Promise<Rule[]> }).headers());
    const all = rules.find((r) => r.source === "/:path*")!;
    const get = (k: string) => all.headers.find((h) => h.key.toLowerCase() === k)?.value ?? "";
    expect(get("x-frame-options")).toBe("DENY");
    expect(get("x-content-type-options")).toBe("nosniff");
    expect(get("referrer-policy")).toBe("same-origin");
    // Pages get their policy from the proxy only (two policies would both be enforced).
    expect(get("content-security-policy")).toBe("");
    expect((nextConfig as { poweredByHeader?: boolean }).poweredByHeader).toBe(false);
  });

  it("headers() gives API routes and static files a fixed policy with scripts from our origin only", async () => {
    const rules = (await (nextConfig as { headers(): Promise<Rule[]> }).headers());
    for (const source of ["/api/:path*", "/_next/static/:path*"]) {
      const csp = rules.find((r) => r.source === source)!.headers.find((h) => h.key === "Content-Security-Policy")!.value;
      checkCommon(csp);
      expect(scriptSrc(csp).trim()).toBe("'self'");
    }
  });
});

describe("proxy", () => {
  it("pageContentSecurityPolicy allows scripts by nonce with 'strict-dynamic', never 'unsafe-inline', 'unsafe-eval' only in development", () => {
    const csp = pageContentSecurityPolicy("abc123");
    checkCommon(csp);
    expect(scriptSrc(csp)).toBe("'self' 'nonce-abc123' 'strict-dynamic'");
    expect(scriptSrc(pageContentSecurityPolicy("x", { dev: true }))).toContain("'unsafe-eval'");
  });

  it("newNonce gives 16 random bytes in base64, different every time", () => {
    const a = newNonce();
    expect(a).toMatch(/^[A-Za-z0-9+/]{22}==$/);
    expect(new Set(Array.from({ length: 50 }, newNonce)).size).toBe(50);
  });

  it("proxy sends each page response its own nonce policy and passes the nonce to the render", () => {
    const a = proxy(new NextRequest("http://localhost/signin"));
    const b = proxy(new NextRequest("http://localhost/signin"));
    const cspA = a.headers.get("content-security-policy")!;
    checkCommon(cspA);
    expect(cspA).not.toBe(b.headers.get("content-security-policy"));
    const nonce = /'nonce-([^']+)'/.exec(cspA)![1]!;
    // NextResponse.next({ request: { headers } }) carries the overridden request headers as x-middleware-request-*.
    expect(a.headers.get("x-middleware-request-x-nonce")).toBe(nonce);
    expect(a.headers.get("x-middleware-request-content-security-policy")).toBe(cspA);
  });

  it("proxy redirects an app page without a session cookie to /signin, still with a policy", () => {
    const r = proxy(new NextRequest("http://localhost/g/some-group/analyses?x=1"));
    expect(r.status).toBe(307);
    expect(r.headers.get("location")).toBe("http://localhost/signin?callbackUrl=%2Fg%2Fsome-group%2Fanalyses%3Fx%3D1");
    checkCommon(r.headers.get("content-security-policy")!);
    expect(proxy(new NextRequest("http://localhost/groups/")).status).toBe(307);
    expect(proxy(new NextRequest("http://localhost/gallery")).status).toBe(200);
  });

  it("the proxy's matcher takes pages and leaves out API routes and Next's static files", () => {
    const re = new RegExp(`^${proxyConfig.matcher[0]!.replace("/((", "/((")}$`);
    for (const p of ["/", "/signin", "/g/lab/analyses/1", "/unknown-page"]) expect(re.test(p), p).toBe(true);
    for (const p of ["/api/health", "/_next/static/chunks/a.js", "/favicon.svg"]) expect(re.test(p), p).toBe(false);
  });
});
