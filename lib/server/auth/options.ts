/**
 * next-auth configuration: e-mail + password (credentials, JWT sessions), and optionally an
 * institutional OpenID Connect provider when HEATBOOK_OIDC_ISSUER, HEATBOOK_OIDC_CLIENT_ID and
 * HEATBOOK_OIDC_CLIENT_SECRET are set (HEATBOOK_OIDC_NAME labels the button).
 */
import type { NextAuthOptions } from "next-auth";
import type { Provider } from "next-auth/providers/index";
import CredentialsProvider from "next-auth/providers/credentials";
import { getDb } from "../db/client";
import { authenticate, findOrCreateExternalUser, normaliseEmail } from "../users";
import { signInClient } from "./client";
import { createSession, endSession, liveSessionUser, sessionPolicy } from "./sessions";

/** Headers of next-auth's internal request as a lookup by lower-case name. */
function headerLookup(headers: Record<string, unknown> | undefined): { get(name: string): string | null } {
  return { get: (name) => (typeof headers?.[name] === "string" ? (headers[name] as string) : null) };
}

/** "3 min", "1 h": the wait of a throttled sign-in, rounded up to whole minutes. */
export function waitText(ms: number): string {
  const minutes = Math.max(1, Math.ceil(ms / 60_000));
  return minutes >= 60 && minutes % 60 === 0 ? `${minutes / 60} h` : `${minutes} min`;
}

function providers(): Provider[] {
  const list: Provider[] = [
    CredentialsProvider({
      id: "password",
      name: "E-mail and password",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(credentials, req) {
        if (!credentials?.email || !credentials.password) return null;
        const email = normaliseEmail(credentials.email);
        const outcome = await authenticate(getDb(), email, credentials.password, signInClient(headerLookup(req?.headers), email));
        if (!outcome.ok) throw new Error(outcome.reason === "throttled" ? `Too many failed attempts from this browser: try again in ${waitText(outcome.retryAfterMs)}` : "E-mail or password is wrong");
        return { id: outcome.user.id, email: outcome.user.email, name: outcome.user.name };
      },
    }),
  ];
  const { HEATBOOK_OIDC_ISSUER: issuer, HEATBOOK_OIDC_CLIENT_ID: clientId, HEATBOOK_OIDC_CLIENT_SECRET: clientSecret } = process.env;
  if (issuer && clientId && clientSecret) {
    list.push({
      id: "institution",
      name: process.env.HEATBOOK_OIDC_NAME ?? "Institution sign-in",
      type: "oauth",
      wellKnown: `${issuer.replace(/\/$/, "")}/.well-known/openid-configuration`,
      authorization: { params: { scope: "openid email profile" } },
      idToken: true,
      checks: ["pkce", "state"],
      clientId,
      clientSecret,
      profile(profile: { sub: string; email?: string; name?: string }) {
        return { id: profile.sub, email: profile.email ?? null, name: profile.name ?? profile.email ?? profile.sub };
      },
    });
  }
  return list;
}

export const authOptions: NextAuthOptions = {
  providers: providers(),
  // The cookie lives as long as a session may; the Session row decides (lib/server/auth/sessions.ts).
  session: { strategy: "jwt", maxAge: sessionPolicy().maxSeconds },
  pages: { signIn: "/signin" },
  events: {
    // Sign-out ends the server-side session at once: the old cookie is refused from then on.
    async signOut({ token }) {
      if (typeof token?.sid === "string") await endSession(getDb(), token.sid);
    },
  },
  callbacks: {
    async jwt({ token, user, account }) {
      // How and when this session signed in: approving asks institutional accounts without a password for a fresh sign-in.
      if (account) {
        token.via = account.provider;
        token.authAt = Math.floor(Date.now() / 1000);
      }
      if (user && account?.provider === "institution") {
        if (!user.email) throw new Error("the institution did not share an e-mail address");
        const local = await findOrCreateExternalUser(getDb(), user.email, user.name ?? "");
        token.uid = local.id;
        token.sid = await createSession(getDb(), local.id);
      } else if (user) {
        token.uid = user.id;
        token.sid = await createSession(getDb(), user.id);
      }
      return token;
    },
    async session({ session, token }) {
      // /api/auth/session tells the browser it is signed out once its session row has ended.
      const live = typeof token.sid === "string" && typeof token.uid === "string" && (await liveSessionUser(getDb(), token.sid)) === token.uid;
      if (!live) return { expires: session.expires } as typeof session;
      if (session.user && typeof token.uid === "string") (session.user as { id?: string }).id = token.uid;
      return session;
    },
  },
};
