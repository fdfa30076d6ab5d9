/**
 * A signed-in request for route handlers called directly in tests: `cookies()` of next/headers
 * answers with a real next-auth session cookie (encrypted with a test secret) for the user in
 * `state.userId`, naming a real server-side session (a Session row, created on first use per
 * user in the database of DATABASE_URL), or none. `state.token`, when set, is sent instead
 * (e.g. a token whose session a test ended); `state.claims` are added to the token (e.g. how and
 * when they signed in). The session code under test decodes and checks it as in production.
 * Use: const session = vi.hoisted(() => ({ userId: null as string | null }));
 *      vi.mock("next/headers", async () => (await import("../helpers/session")).headersFor(session));
 */
import { encode } from "next-auth/jwt";
import { getDb } from "../../lib/server/db/client";
import { createSession } from "../../lib/server/auth/sessions";

const COOKIE = "next-auth.session-token";

/** A cookie value for a new server-side session of `userId` (in the database of DATABASE_URL). */
export async function sessionTokenFor(userId: string, claims: Record<string, unknown> = {}): Promise<string> {
  process.env.NEXTAUTH_SECRET ??= "heatbook-test-secret-not-for-production";
  const sid = await createSession(getDb(), userId);
  return encode({ token: { uid: userId, sid, ...claims }, secret: process.env.NEXTAUTH_SECRET!, maxAge: 3600 });
}

export function headersFor(state: { userId: string | null; token?: string | null; claims?: Record<string, unknown> }) {
  process.env.NEXTAUTH_SECRET ??= "heatbook-test-secret-not-for-production";
  const tokens = new Map<string, string>();
  return {
    cookies: async () => {
      const uid = state.userId;
      let token: string | null = state.token ?? null;
      if (!token && uid) {
        const key = `${process.env.DATABASE_URL}|${uid}|${JSON.stringify(state.claims ?? {})}`;
        token = tokens.get(key) ?? (await sessionTokenFor(uid, state.claims ?? {}));
        tokens.set(key, token);
      }
      const all = token ? [{ name: COOKIE, value: token }] : [];
      return { get: (name: string) => all.find((c) => c.name === name), getAll: () => all };
    },
  };
}
