import type { Metadata } from "next";
import { pageUser } from "@/app/_server/guard";
import { listLiveSessions, sessionPolicy } from "@/lib/server/auth/sessions";
import { sessionClaims } from "@/lib/server/session";
import { when } from "@/app/components/review/labels";
import { SignOutEverywhereButton } from "@/app/components/SignOutEverywhereButton";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Account" };

function hours(seconds: number): string {
  return seconds % 3600 === 0 ? `${seconds / 3600} h` : `${Math.round(seconds / 60)} min`;
}

/** The signed-in account: its live sessions and "sign out everywhere". */
export default async function AccountPage() {
  const { db, user } = await pageUser("/account");
  const [sessions, claims] = await Promise.all([listLiveSessions(db, user.id), sessionClaims()]);
  const policy = sessionPolicy();
  return (
    <div className="narrow">
      <h1>Account</h1>
      <p className="lede">
        Signed in as <strong>{user.email}</strong>.
      </p>
      <section className="sheet" aria-labelledby="sessions">
        <h2 id="sessions">Where you are signed in</h2>
        <p className="small muted">
          A session ends when you sign out, after {hours(policy.idleSeconds)} without use, and at the latest {hours(policy.maxSeconds)} after signing in.
        </p>
        <table data-testid="sessions">
          <thead><tr><th>Signed in</th><th>Last used</th><th>Ends at the latest</th><th /></tr></thead>
          <tbody>
            {sessions.map((s) => (
              <tr key={s.id}>
                <td className="small">{when(s.createdAt)}</td>
                <td className="small">{when(s.lastSeenAt)}</td>
                <td className="small">{when(s.expiresAt)}</td>
                <td className="small">{s.id === claims?.sid ? "this browser" : ""}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <p className="small">Lost a laptop, or signed in on a shared computer? End every session at once; you sign in again here afterwards.</p>
        <SignOutEverywhereButton />
      </section>
    </div>
  );
}
