import type { Metadata } from "next";
import Link from "next/link";
import { getDb } from "@/lib/server/db/client";
import { currentUser } from "@/lib/server/session";
import { previewInvitation } from "@/lib/server/groups";
import { orNotFound } from "@/app/_server/guard";
import { AcceptInvitationButton } from "@/app/components/AcceptInvitationButton";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Invitation" };

/** An invitation link: which group and role; sign in or sign up first (the token rides along), then accept. */
export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const invite = await orNotFound(() => previewInvitation(getDb(), token));
  const user = await currentUser();
  const back = encodeURIComponent(`/invite/${token}`);
  return (
    <div className="narrow">
      <h1>Join {invite.groupName}</h1>
      <div className="sheet" data-testid="invitation">
        <dl className="facts">
          <dt>Group</dt><dd>{invite.groupName}</dd>
          <dt>Role</dt><dd><span className="role">{invite.role}</span></dd>
          <dt>Sent to</dt><dd>{invite.email}</dd>
        </dl>
      </div>
      {!invite.usable ? (
        <p className="form-error" role="alert">This invitation can no longer be used ({invite.why}). Ask the group owner for a new link.</p>
      ) : !user ? (
        <>
          <p>Sign in, or create an account, to accept. You come back here afterwards.</p>
          <div className="actions">
            <Link className="button" href={`/signin?callbackUrl=${back}`}>Sign in</Link>
            <Link className="button quiet" href={`/signup?callbackUrl=${back}`}>Create an account</Link>
          </div>
        </>
      ) : (
        <>
          <p>
            You are signed in as <strong>{user.email}</strong>.
            {user.email.toLowerCase() !== invite.email.toLowerCase() && " The invitation was sent to another address; the link itself is what counts."}
          </p>
          <AcceptInvitationButton token={token} />
        </>
      )}
    </div>
  );
}
