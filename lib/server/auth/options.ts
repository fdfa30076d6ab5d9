/**
 * next-auth configuration: e-mail + password (credentials, JWT sessions), and optionally an
 * institutional OpenID Connect provider when HEATBOOK_OIDC_ISSUER, HEATBOOK_OIDC_CLIENT_ID and
 * HEATBOOK_OIDC_CLIENT_SECRET are set (HEATBOOK_OIDC_NAME labels the button).
 */
import type { NextAuthOptions } from "next-auth";
import type { Provider } from "next-auth/providers/index";
import CredentialsProvider from "next-auth/providers/credentials";
import { getDb } from "../db/client";
import { authenticate, findOrCreateExternalUser } from "../users";

/**
 * The client address for sign-in throttling. X-Forwarded-For is believed only behind a proxy we
 * were told about (HEATBOOK_TRUST_PROXY=1), since anyone can send the header; otherwise the
 * address is unknown ("") and only the per-e-mail limit applies.
 */
function clientIp(headers: Record<string, unknown> | undefined): string {
  const forwarded = headers?.["x-forwarded-for"];
  if (process.env.HEATBOOK_TRUST_PROXY === "1" && typeof forwarded === "string" && forwarded) return forwarded.split(",")[0]!.trim();
  return "";
}

function providers(): Provider[] {
  const list: Provider[] = [
    CredentialsProvider({
      id: "password",
      name: "E-mail and password",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(credentials, req) {
        if (!credentials?.email || !credentials.password) return null;
        const outcome = await authenticate(getDb(), credentials.email, credentials.password, clientIp(req?.headers));
        if (!outcome.ok) throw new Error(outcome.reason === "throttled" ? "Too many failed attempts: wait 15 minutes" : "E-mail or password is wrong");
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
  session: { strategy: "jwt", maxAge: 12 * 60 * 60 },
  pages: { signIn: "/signin" },
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
      } else if (user) {
        token.uid = user.id;
      }
      return token;
    },
    async session({ session, token }) {
      if (session.user && typeof token.uid === "string") (session.user as { id?: string }).id = token.uid;
      return session;
    },
  },
};
