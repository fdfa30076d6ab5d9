import type { Metadata } from "next";
import Link from "next/link";
import { database as getDb } from "@/lib/server/database";
import { currentUser } from "@/lib/server/session";
import { previewInvitation } from "@/lib/server/groups";
import { orNotFound } from "@/app/_server/guard";
import { AcceptInvitationButton } from "@/app/components/AcceptInvitationButton";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Invitation" };

/** An invitation link: which group and role; sign in or sign up first (the token rides along), then accept — only with the invited address. */
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
      ) : user.email.toLowerCase() !== invite.email.toLowerCase() ? (
        <p className="form-error" role="alert">
          You are signed in as <strong>{user.email}</strong>, but this invitation was sent to <strong>{invite.email}</strong>. Only that
          address can accept it: sign out and sign in with it (or create an account with it), or ask the group owner to invite {user.email}.
        </p>
      ) : (
        <>
          <p>
            You are signed in as <strong>{user.email}</strong>.
          </p>
          <AcceptInvitationButton token={token} />
        </>
      )}
    </div>
  );
}
