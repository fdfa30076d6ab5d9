import type { Metadata } from "next";
import { database as getDb } from "@/lib/server/database";
import { describePasswordLink } from "@/lib/server/passwordLinks";
import { orNotFound } from "@/app/_server/guard";
import { SetPasswordForm } from "@/app/components/PasswordLink";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Set your password" };

/** A password-set link issued by a group owner: set the password once, before it expires. */
export default async function SetPasswordPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const link = await orNotFound(() => describePasswordLink(getDb(), token));
  return (
    <div className="narrow">
      <h1>Set your password</h1>
      <p>Account <strong>{link.email}</strong> ({link.name}).</p>
      {link.state === "valid" ? (
        <SetPasswordForm token={token} email={link.email} />
      ) : (
        <p className="form-error" role="alert">This link {link.state === "used" ? "was already used" : "has expired"}. Ask a group owner for a new one.</p>
      )}
    </div>
  );
}
