/**
 * Next 16's `proxy` (formerly `middleware`), on every page request:
 *  - a Content-Security-Policy with a fresh nonce (lib/server/csp.ts), sent on the response and
 *    handed to the render in the request headers (x-nonce, Content-Security-Policy), where
 *    Next.js reads it and puts the nonce on its script tags;
 *  - redirect-only convenience: a request for an app page without a session cookie goes to
 *    /signin with a callbackUrl back. This is NOT the authorization — it only looks for the
 *    cookie; every page and route handler checks the session and the group role on the server.
 */
import { NextResponse, type NextRequest } from "next/server";
import { newNonce, pageContentSecurityPolicy } from "./lib/server/csp";

const SESSION_COOKIES = ["next-auth.session-token", "__Secure-next-auth.session-token"];
const SIGNED_IN_ONLY = /^\/(groups|g|account)(\/|$)/;

function hasSessionCookie(req: NextRequest): boolean {
  return req.cookies.getAll().some((c) => SESSION_COOKIES.some((name) => c.name === name || c.name.startsWith(`${name}.`)));
}

export function proxy(req: NextRequest): NextResponse {
  const nonce = newNonce();
  const csp = pageContentSecurityPolicy(nonce, { dev: process.env.NODE_ENV === "development" });
  let res: NextResponse;
  if (SIGNED_IN_ONLY.test(req.nextUrl.pathname) && !hasSessionCookie(req)) {
    const target = new URL("/signin", req.url);
    target.searchParams.set("callbackUrl", req.nextUrl.pathname + req.nextUrl.search);
    res = NextResponse.redirect(target);
  } else {
    const headers = new Headers(req.headers);
    headers.set("x-nonce", nonce);
    headers.set("content-security-policy", csp);
    res = NextResponse.next({ request: { headers } });
  }
  res.headers.set("content-security-policy", csp);
  return res;
}

export const config = {
  // Every page; not API routes (JSON, next.config.js's policy) nor Next's static files.
  matcher: ["/((?!api/|_next/static/|_next/image|favicon\\.svg$).*)"],
};
