/**
 * Redirect-only convenience (Next 16's `proxy`, formerly `middleware`): a request for an app
 * page without a session cookie goes to /signin with a callbackUrl back. This is NOT the
 * authorization — it only looks for the cookie; every page and route handler checks the
 * session and the group role on the server itself.
 */
import { NextResponse, type NextRequest } from "next/server";

const SESSION_COOKIES = ["next-auth.session-token", "__Secure-next-auth.session-token"];

function hasSessionCookie(req: NextRequest): boolean {
  return req.cookies.getAll().some((c) => SESSION_COOKIES.some((name) => c.name === name || c.name.startsWith(`${name}.`)));
}

export function proxy(req: NextRequest): NextResponse {
  if (hasSessionCookie(req)) return NextResponse.next();
  const target = new URL("/signin", req.url);
  target.searchParams.set("callbackUrl", req.nextUrl.pathname + req.nextUrl.search);
  return NextResponse.redirect(target);
}

export const config = {
  matcher: ["/groups", "/groups/:path*", "/g/:path*", "/account"],
};
