import type { Metadata } from "next";
import { pageMember } from "@/app/_server/guard";
import { defaultTokenDays, listTokens } from "@/lib/server/tokens";
import { can } from "@/lib/server/permissions";
import { GroupSettingsForm } from "@/app/components/settings/GroupSettingsForm";
import { TokenPanel } from "@/app/components/settings/TokenPanel";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Settings" };

/** Group settings (owners: name, self-approval) and the member's personal access tokens for the JSON API. */
export default async function SettingsPage({ params }: { params: Promise<{ slug: string }> }) {
  const { slug } = await params;
  const { db, member } = await pageMember(slug, `/g/${encodeURIComponent(slug)}/settings`);
  const tokens = await listTokens(db, member);
  const apiBase = `/api/groups/${encodeURIComponent(slug)}`;
  return (
    <>
      <h1>Settings</h1>
      {can(member.role, "group.manage") ? (
        <section className="sheet" aria-labelledby="group-settings">
          <h2 id="group-settings">Group</h2>
          <GroupSettingsForm apiBase={apiBase} name={member.group.name} allowSelfApproval={member.group.allowSelfApproval} />
        </section>
      ) : (
        <p className="small muted">Group settings are kept by its owners. Approving one&apos;s own submission is {member.group.allowSelfApproval ? "allowed" : "not allowed"} in this group.</p>
      )}
      <p className="small">Your sign-in sessions (and &ldquo;Sign out everywhere&rdquo;) are on your <a href="/account">account page</a>.</p>
      <section className="sheet" aria-labelledby="tokens">
        <h2 id="tokens">Personal access tokens</h2>
        <p className="small muted">For your own scripts and the <code>heatbook</code> command (HEATBOOK_TOKEN). A token acts as you, in this group only, with read or read-write access; your current role still applies. Heatbook keeps only its hash: the secret is shown once. A token stops working when it expires; Renew gives it {defaultTokenDays()} more days from today.</p>
        <TokenPanel apiBase={apiBase} tokens={tokens} now={new Date().toISOString()} defaultDays={defaultTokenDays()} />
      </section>
    </>
  );
}
