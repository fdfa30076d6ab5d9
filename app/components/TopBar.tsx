/**
 * The top bar (server component): product name, the signed-in user's groups (switcher and
 * section links are client components that read the current path), and the user menu.
 */
import Link from "next/link";
import { currentUser } from "@/lib/server/session";
import { database as getDb } from "@/lib/server/database";
import { listMyGroups } from "@/lib/server/groups";
import { listNotices } from "@/lib/server/review";
import { Logo } from "./Logo";
import { GroupNav } from "./GroupNav";
import { SignOutButton } from "./SignOutButton";

export async function TopBar() {
  const user = await currentUser();
  const groups = user ? await listMyGroups(getDb(), user.id) : [];
  const unread = user ? await Promise.all(groups.map(async (g) => (await listNotices(getDb(), user.id, { groupId: g.id, take: 1 })).unread)) : [];
  return (
    <header className="topbar">
      <div className="topbar-inner">
        <Link href="/" className="brand">
          <Logo />
          Heatbook
        </Link>
        {user ? (
          <>
            <GroupNav groups={groups.map((g, i) => ({ slug: g.slug, name: g.name, role: g.role, unread: unread[i] ?? 0 }))} />
            <details className="usermenu" data-testid="user-menu">
              <summary>{user.name || user.email}</summary>
              <div className="usermenu-panel">
                <p className="who small">Signed in as {user.email}</p>
                <Link href="/groups">My groups</Link>
                <Link href="/account">Account and sessions</Link>
                <SignOutButton />
              </div>
            </details>
          </>
        ) : (
          <>
            <span className="topbar-spacer" />
            <nav className="signed-out" aria-label="Account">
              <Link href="/signin">Sign in</Link>
              <Link href="/signup">Create account</Link>
            </nav>
          </>
        )}
      </div>
    </header>
  );
}
