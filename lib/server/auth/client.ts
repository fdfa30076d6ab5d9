/**
 * Who is signing in (lib/server/auth/throttle.ts's SignInClient), from the request's headers.
 *
 * - The client address is believed only behind a proxy we were told about
 *   (HEATBOOK_TRUST_PROXY=N, N ≥ 1 proxies of ours in front, "1" for one): it is the N-th
 *   X-Forwarded-For entry from the right, the one our own proxy wrote. Entries further left
 *   come from the client and are never used. Without it the address is unknown.
 * - A device cookie proves that this browser signed in to this account before: after each
 *   successful password sign-in the browser gets `hb-device-<account tag>` = `<device id>.<MAC>`
 *   (HMAC-SHA256 with the session secret over the e-mail and the device id; HttpOnly, SameSite
 *   Lax, path /api/auth, one year). Its failures are counted apart from everybody else's, so a
 *   stranger's guesses do not make the owner wait on a browser the owner has used.
 */
import { createHmac, randomBytes, timingSafeEqual, createHash } from "node:crypto";
import type { SignInClient } from "./throttle";

const DEVICE_MAX_AGE_S = 365 * 24 * 3600;

function secret(): string | null {
  return process.env.NEXTAUTH_SECRET ?? process.env.AUTH_SECRET ?? null;
}

/** The trusted client address from X-Forwarded-For, or null. */
export function clientAddress(forwardedFor: string | null | undefined, trustProxy = process.env.HEATBOOK_TRUST_PROXY): string | null {
  const hops = trustProxy ? Number(trustProxy) : 0;
  if (!Number.isInteger(hops) || hops < 1 || !forwardedFor) return null;
  const entries = forwardedFor.split(",").map((s) => s.trim()).filter(Boolean);
  const address = entries[entries.length - hops];
  return address && address.length <= 100 ? address : null;
}

export function deviceCookieName(email: string): string {
  return `hb-device-${createHash("sha256").update(email).digest("hex").slice(0, 16)}`;
}

function mac(email: string, deviceId: string, key: string): string {
  return createHmac("sha256", key).update(`heatbook-device|${email}|${deviceId}`).digest("base64url");
}

/** The device id in a valid device cookie for `email`, or null. */
export function verifiedDevice(cookieHeader: string | null | undefined, email: string): string | null {
  const key = secret();
  if (!key || !cookieHeader) return null;
  const name = deviceCookieName(email);
  const raw = cookieHeader.split(";").map((c) => c.trim()).find((c) => c.startsWith(`${name}=`))?.slice(name.length + 1);
  const m = raw ? /^([A-Za-z0-9_-]{22})\.([A-Za-z0-9_-]{43})$/.exec(decodeURIComponent(raw)) : null;
  if (!m) return null;
  const want = Buffer.from(mac(email, m[1]!, key));
  const got = Buffer.from(m[2]!);
  return want.length === got.length && timingSafeEqual(want, got) ? m[1]! : null;
}

/** A Set-Cookie value marking this browser as one that signed in to `email` (keeps its device id if it had one). */
export function deviceCookie(email: string, existingId: string | null, secure: boolean): string | null {
  const key = secret();
  if (!key) return null;
  const id = existingId ?? randomBytes(16).toString("base64url");
  return `${deviceCookieName(email)}=${id}.${mac(email, id, key)}; Path=/api/auth; Max-Age=${DEVICE_MAX_AGE_S}; HttpOnly; SameSite=Lax${secure ? "; Secure" : ""}`;
}

/** The SignInClient of a request to the credentials sign-in for `email`. */
export function signInClient(headers: { get(name: string): string | null }, email: string): SignInClient {
  return { address: clientAddress(headers.get("x-forwarded-for")), deviceId: verifiedDevice(headers.get("cookie"), email) };
}
