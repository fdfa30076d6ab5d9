/**
 * A signed-in request for route handlers called directly in tests: `cookies()` of next/headers
 * answers with a real next-auth session cookie (encrypted with a test secret) for the user in
 * `state.userId` (with `state.claims` added to the token, e.g. how and when they signed in), or none. The session code under test decodes it as in production.
 * Use: const session = vi.hoisted(() => ({ userId: null as string | null }));
 *      vi.mock("next/headers", async () => (await import("../helpers/session")).headersFor(session));
 */
import { encode } from "next-auth/jwt";

const COOKIE = "next-auth.session-token";

export function headersFor(state: { userId: string | null; claims?: Record<string, unknown> }) {
  process.env.NEXTAUTH_SECRET ??= "heatbook-test-secret-not-for-production";
  const tokens = new Map<string, string>();
  return {
    cookies: async () => {
      const uid = state.userId;
      let token: string | null = null;
      if (uid) {
        const key = `${uid} ${JSON.stringify(state.claims ?? {})}`;
        token = tokens.get(key) ?? (await encode({ token: { uid, ...(state.claims ?? {}) }, secret: process.env.NEXTAUTH_SECRET!, maxAge: 3600 }));
        tokens.set(key, token);
      }
      const all = token ? [{ name: COOKIE, value: token }] : [];
      return { get: (name: string) => all.find((c) => c.name === name), getAll: () => all };
    },
  };
}
