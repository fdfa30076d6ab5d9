/**
 * The signed-in user of the current request (server components, route handlers, actions).
 *
 * The session is next-auth's encrypted JWT cookie. We read it with next-auth's own `decode`
 * (same key derivation, same JWE check, same 15 s clock tolerance) instead of going through
 * `getServerSession`, which on every call also re-runs the callbacks and re-encrypts a fresh
 * token that a route handler or server component cannot even send back (in the App Router only
 * /api/auth/session refreshes the cookie). A decoded token is remembered by its exact text
 * until its own expiry: the text is unforgeable, so a hit is as good as a fresh decryption.
 *
 * The token names a server-side session (`sid`, lib/server/auth/sessions.ts); the session row is
 * checked on EVERY request, so sign-out, "sign out everywhere" and the idle and absolute limits
 * take effect at once. Routes of a group fold that check into their membership statement
 * (inGroupWith); everything else calls sessionUserId, one statement.
 */
import { cookies } from "next/headers";
import { decode } from "next-auth/jwt";
import { getDb } from "./db/client";
import { UnauthenticatedError } from "../engine/errors";
import type { UserInfo } from "./users";
import { liveSessionUser, liveSessionUserRow } from "./auth/sessions";

/** next-auth's cookie name: with the __Secure- prefix when the public URL is https. */
function sessionCookieName(): string {
  return process.env.NEXTAUTH_URL?.startsWith("https://") ? "__Secure-next-auth.session-token" : "next-auth.session-token";
}

const TOKEN_CACHE_SIZE = 2000;
const decoded = new Map<string, { claims: SessionClaims | null; expMs: number }>();

/** What the cookie says: the user, the server-side session it belongs to, and how and when they signed in. */
export interface SessionClaims {
  uid: string;
  sid: string;
  /** "password" or "institution" (OpenID Connect); null for tokens that do not say. */
  via: string | null;
  /** When the sign-in happened (ms since the epoch), if the token says. */
  authAtMs: number | null;
}

/** The session token of the request: the cookie, or its chunks name.0, name.1, … joined in order. */
async function sessionToken(): Promise<string | null> {
  const jar = await cookies();
  const name = sessionCookieName();
  const whole = jar.get(name)?.value;
  if (whole) return whole;
  const chunks = jar.getAll().filter((c) => c.name.startsWith(`${name}.`) && /^\d+$/.test(c.name.slice(name.length + 1)));
  if (chunks.length === 0) return null;
  return chunks.sort((a, b) => Number(a.name.slice(name.length + 1)) - Number(b.name.slice(name.length + 1))).map((c) => c.value).join("");
}

/**
 * The claims of the request's session cookie, or null (no cookie, bad or expired token, or a
 * token from before server-side sessions). NOT a check of the session row: callers must check
 * it (sessionUserId, or inGroupWith's statement).
 */
export async function sessionClaims(): Promise<SessionClaims | null> {
  const token = await sessionToken();
  if (!token) return null;
  const now = Date.now();
  const hit = decoded.get(token);
  if (hit && hit.expMs > now) return hit.claims;
  const secret = process.env.NEXTAUTH_SECRET ?? process.env.AUTH_SECRET;
  if (!secret) return null;
  let payload: Awaited<ReturnType<typeof decode>>;
  try {
    payload = await decode({ token, secret });
  } catch {
    return null;
  }
  const claims = typeof payload?.uid === "string" && typeof payload.sid === "string"
    ? { uid: payload.uid, sid: payload.sid, via: typeof payload.via === "string" ? payload.via : null, authAtMs: typeof payload.authAt === "number" ? payload.authAt * 1000 : null }
    : null;
  const exp = typeof payload?.exp === "number" ? payload.exp * 1000 : now;
  decoded.delete(token);
  decoded.set(token, { claims, expMs: exp });
  while (decoded.size > TOKEN_CACHE_SIZE) decoded.delete(decoded.keys().next().value!);
  return claims;
}

/** The user id of the request's live session, or null (no cookie, bad token, session ended or expired). */
export async function sessionUserId(): Promise<string | null> {
  const claims = await sessionClaims();
  if (!claims) return null;
  const uid = await liveSessionUser(getDb(), claims.sid);
  return uid === claims.uid ? uid : null;
}

/** When the session's institutional (OpenID Connect) sign-in happened; null for other sessions. */
export async function institutionSignInAt(): Promise<Date | null> {
  const c = await sessionClaims();
  return c?.via === "institution" && c.authAtMs !== null ? new Date(c.authAtMs) : null;
}

/** The signed-in user (live session and user row in one statement), or null. */
export async function currentUser(): Promise<UserInfo | null> {
  const claims = await sessionClaims();
  if (!claims) return null;
  const user = await liveSessionUserRow(getDb(), claims.sid);
  return user && user.id === claims.uid ? user : null;
}

export async function requireUser(): Promise<UserInfo> {
  const user = await currentUser();
  if (!user) throw new UnauthenticatedError();
  return user;
}
