import type { Metadata } from "next";
import Link from "next/link";
import { listMyGroups } from "@/lib/server/groups";
import { pageUser } from "@/app/_server/guard";
import { groupPaths } from "@/app/_lib/paths";
import { CreateGroupForm } from "@/app/components/CreateGroupForm";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "My groups" };

export default async function GroupsPage() {
  const { db, user } = await pageUser("/groups");
  const groups = await listMyGroups(db, user.id);
  return (
    <>
      <h1>My groups</h1>
      <p className="lede">A group owns its samples, measurements and analyses; nothing crosses from one group to another.</p>
      <div className="columns">
        <section className="sheet" aria-labelledby="my-groups">
          <h2 id="my-groups">Groups you belong to</h2>
          {groups.length === 0 ? (
            <p className="muted">You are not in a group yet. Create one, or open an invitation link from a group owner.</p>
          ) : (
            <table data-testid="my-groups">
              <thead>
                <tr><th>Group</th><th>Your role</th></tr>
              </thead>
              <tbody>
                {groups.map((g) => (
                  <tr key={g.id}>
                    <td><Link href={groupPaths(g.slug).home}>{g.name}</Link></td>
                    <td><span className="role">{g.role}</span></td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </section>
        <section className="sheet" aria-labelledby="new-group">
          <h2 id="new-group">Create a group</h2>
          <p className="small muted">You become its owner and can invite others.</p>
          <CreateGroupForm />
        </section>
      </div>
    </>
  );
}
