import type { Metadata } from "next";
import { pageMember } from "@/app/_server/guard";
import { listInvitations, listMembers } from "@/lib/server/groups";
import { can, ROLES } from "@/lib/server/permissions";
import { groupPaths } from "@/app/_lib/paths";
import { fmtDay, fmtDate } from "@/app/_lib/format";
import { LeaveGroupButton, MemberRoleSelect, RemoveMemberButton } from "@/app/components/MemberControls";
import { InviteForm, RevokeInvitationButton } from "@/app/components/Invitations";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Members" };

const ROLE_MEANING: Record<string, string> = {
  owner: "manages members and settings, and can do everything below",
  analyst: "adds samples and measurements, builds and submits analyses",
  reviewer: "reviews submitted analyses and comments",
  viewer: "reads everything in the group",
};

export default async function MembersPage({ params }: { params: Promise<{ slug: string }> }) {
  const { slug } = await params;
  const p = groupPaths(slug);
  const { db, member } = await pageMember(slug, p.members);
  const manage = can(member.role, "group.manage");
  const [members, invitations] = await Promise.all([listMembers(db, member), manage ? listInvitations(db, member) : Promise.resolve([])]);
  return (
    <>
      <h1>Members of {member.group.name}</h1>
      <p className="lede">
        {ROLES.map((r, i) => (
          <span key={r}>
            <span className="role">{r}</span>: {ROLE_MEANING[r]}
            {i < ROLES.length - 1 ? "; " : "."}
          </span>
        ))}
      </p>
      <section className="sheet" aria-labelledby="member-list">
        <h2 id="member-list">Members</h2>
        <table data-testid="members">
          <thead>
            <tr><th>Name</th><th>Handle</th><th>E-mail</th><th>Role</th><th>Member since</th>{manage && <th><span className="muted">Actions</span></th>}</tr>
          </thead>
          <tbody>
            {members.map((m) => (
              <tr key={m.userId}>
                <td>{m.name}{m.userId === member.userId && <span className="muted"> (you)</span>}</td>
                <td className="mono" data-testid="member-handle">@{m.handle}</td>
                <td>{m.email}</td>
                <td>
                  {manage ? <MemberRoleSelect apiBase={p.api} userId={m.userId} name={m.name || m.email} role={m.role} /> : <span className="role">{m.role}</span>}
                </td>
                <td>{fmtDay(m.since)}</td>
                {manage && <td>{m.userId !== member.userId && <RemoveMemberButton apiBase={p.api} userId={m.userId} name={m.name || m.email} />}</td>}
              </tr>
            ))}
          </tbody>
        </table>
        <div className="actions" style={{ marginTop: "0.8rem" }}>
          <LeaveGroupButton apiBase={p.api} groupName={member.group.name} />
        </div>
      </section>
      {manage && (
        <div className="columns">
          <section className="sheet" aria-labelledby="invite">
            <h2 id="invite">Invite someone</h2>
            <p className="small muted">Heatbook sends no e-mail: the link appears here once; pass it on yourself. It works for 14 days, once.</p>
            <InviteForm apiBase={p.api} />
          </section>
          <section className="sheet" aria-labelledby="open-invitations">
            <h2 id="open-invitations">Open invitations</h2>
            {invitations.length === 0 ? (
              <p className="muted">None.</p>
            ) : (
              <table data-testid="invitations">
                <thead>
                  <tr><th>E-mail</th><th>Role</th><th>Expires</th><th><span className="muted">Actions</span></th></tr>
                </thead>
                <tbody>
                  {invitations.map((inv) => (
                    <tr key={inv.id}>
                      <td>{inv.email}</td>
                      <td><span className="role">{inv.role}</span></td>
                      <td className="small">{fmtDate(inv.expiresAt)}</td>
                      <td><RevokeInvitationButton apiBase={p.api} invitationId={inv.id} email={inv.email} /></td>
                    </tr>
                  ))}
                </tbody>
              </table>
            )}
          </section>
        </div>
      )}
    </>
  );
}
