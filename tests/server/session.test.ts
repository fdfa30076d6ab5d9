/** Reading the session cookie: next-auth's JWT decoded as next-auth does, by cookie name, chunks, expiry and tampering (the session row itself: tests/server/auth-sessions.test.ts). */
import { describe, it, expect, vi, beforeEach } from "vitest";
import { encode } from "next-auth/jwt";

const jar = vi.hoisted(() => ({ cookies: [] as { name: string; value: string }[] }));
vi.mock("next/headers", () => ({
  cookies: async () => ({ get: (name: string) => jar.cookies.find((c) => c.name === name), getAll: () => jar.cookies }),
}));

import { sessionClaims } from "../../lib/server/session";

const SECRET = "session-test-secret";
const UID = "5b0c3a52-8e0f-4a43-9d59-3c2f4f8c1a11";
const SID = "0d7e0c52-1f0f-4b43-8d59-3c2f4f8c1a22";
const CLAIMS = { uid: UID, sid: SID, via: null, authAtMs: null };

beforeEach(() => {
  process.env.NEXTAUTH_SECRET = SECRET;
  delete process.env.NEXTAUTH_URL;
  jar.cookies = [];
});

describe("sessionClaims", () => {
  it("sessionClaims reads the uid of a valid session cookie, and null without one", async () => {
    expect(await sessionClaims()).toBeNull();
    jar.cookies = [{ name: "next-auth.session-token", value: await encode({ token: { uid: UID, sid: SID }, secret: SECRET }) }];
    expect(await sessionClaims()).toEqual(CLAIMS);
    expect(await sessionClaims()).toEqual(CLAIMS); // the remembered decode
  });

  it("sessionClaims refuses a token without a session id (made before server-side sessions)", async () => {
    jar.cookies = [{ name: "next-auth.session-token", value: await encode({ token: { uid: UID }, secret: SECRET }) }];
    expect(await sessionClaims()).toBeNull();
  });

  it("sessionClaims refuses an expired token, a tampered one and one made with another secret", async () => {
    jar.cookies = [{ name: "next-auth.session-token", value: await encode({ token: { uid: UID, sid: SID }, secret: SECRET, maxAge: -60 }) }];
    expect(await sessionClaims()).toBeNull();
    const good = await encode({ token: { uid: UID, sid: SID }, secret: SECRET });
    const mid = Math.floor(good.length / 2);
    jar.cookies = [{ name: "next-auth.session-token", value: good.slice(0, mid) + (good[mid] === "A" ? "B" : "A") + good.slice(mid + 1) }];
    expect(await sessionClaims()).toBeNull();
    jar.cookies = [{ name: "next-auth.session-token", value: await encode({ token: { uid: UID, sid: SID }, secret: "another secret" }) }];
    expect(await sessionClaims()).toBeNull();
  });

  it("sessionClaims uses the __Secure- cookie under an https NEXTAUTH_URL and joins chunked cookies in order", async () => {
    process.env.NEXTAUTH_URL = "https://heatbook.example.org";
    const token = await encode({ token: { uid: UID, sid: SID, pad: "x".repeat(50) }, secret: SECRET });
    jar.cookies = [{ name: "next-auth.session-token", value: token }];
    expect(await sessionClaims()).toBeNull();
    const k = Math.floor(token.length / 3);
    jar.cookies = [
      { name: "__Secure-next-auth.session-token.1", value: token.slice(k, 2 * k) },
      { name: "__Secure-next-auth.session-token.0", value: token.slice(0, k) },
      { name: "__Secure-next-auth.session-token.2", value: token.slice(2 * k) },
    ];
    expect(await sessionClaims()).toEqual(CLAIMS);
  });
});
