import NextAuth from "next-auth";
import { authOptions } from "@/lib/server/auth/options";
import { deviceCookie, verifiedDevice } from "@/lib/server/auth/client";
import { normaliseEmail } from "@/lib/server/users";

export const dynamic = "force-dynamic";
const handler = NextAuth(authOptions);

type Ctx = { params: Promise<{ nextauth: string[] }> };

/**
 * next-auth, plus one thing: a successful password sign-in also gives the browser its device
 * cookie for that account (lib/server/auth/client.ts), so its later failures are counted apart
 * from strangers' guesses.
 */
async function POST(req: Request, ctx: Ctx): Promise<Response> {
  const isPasswordCallback = new URL(req.url).pathname.endsWith("/callback/password");
  const form = isPasswordCallback ? await req.clone().formData().catch(() => null) : null;
  const res: Response = await handler(req, ctx);
  const email = form?.get("email");
  if (typeof email === "string" && email && res.headers.getSetCookie().some((c) => /session-token=[^;]/.test(c))) {
    const normalised = normaliseEmail(email);
    const cookie = deviceCookie(normalised, verifiedDevice(req.headers.get("cookie"), normalised), process.env.NEXTAUTH_URL?.startsWith("https://") ?? false);
    if (cookie) res.headers.append("Set-Cookie", cookie);
  }
  return res;
}

export { handler as GET, POST };
