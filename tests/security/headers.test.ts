/**
 * next.config.js applies the security headers to every path (source "/:path*"), with a
 * Content-Security-Policy that keeps scripts, connections, frames, forms and the base URL to
 * our own origin, and no x-powered-by. tests/security/headers.ops.test.ts checks the same on
 * the responses of a running server.
 */
import { describe, it, expect } from "vitest";
// @ts-expect-error next.config.js is plain JavaScript without a declaration file
import nextConfig from "../../next.config.js";

type Header = { key: string; value: string };

describe("next.config.js headers()", () => {
  it("headers() covers every path with the CSP and the framing, sniffing and referrer headers", async () => {
    const rules = (await (nextConfig as { headers(): Promise<{ source: string; headers: Header[] }[]> }).headers());
    const all = rules.find((r) => r.source === "/:path*");
    expect(all).toBeDefined();
    const get = (k: string) => all!.headers.find((h) => h.key.toLowerCase() === k)?.value ?? "";
    expect(get("x-frame-options")).toBe("DENY");
    expect(get("x-content-type-options")).toBe("nosniff");
    const csp = get("content-security-policy");
    for (const d of ["default-src 'self'", "connect-src 'self'", "frame-ancestors 'none'", "base-uri 'self'", "form-action 'self'"]) expect(csp).toContain(d);
    expect(/script-src ([^;]*)/.exec(csp)?.[1]).not.toMatch(/\*|https?:/);
    expect((nextConfig as { poweredByHeader?: boolean }).poweredByHeader).toBe(false);
  });
});
