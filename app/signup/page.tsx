import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { currentUser } from "@/lib/server/session";
import { safeReturnPath } from "@/app/_lib/paths";
import { SignUpForm } from "@/app/components/SignUpForm";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Create account" };

export default async function SignUpPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const params = await searchParams;
  const callbackUrl = safeReturnPath(params.callbackUrl, "/groups");
  if (await currentUser()) redirect(callbackUrl);
  const signinHref = `/signin${callbackUrl !== "/groups" ? `?callbackUrl=${encodeURIComponent(callbackUrl)}` : ""}`;
  return (
    <div className="narrow">
      <h1>Create an account</h1>
      <p className="lede">One account for all the groups you work with. Group owners invite you with a link.</p>
      <div className="sheet">
        <SignUpForm callbackUrl={callbackUrl} />
      </div>
      <p>
        Already have an account? <Link href={signinHref}>Sign in</Link>.
      </p>
    </div>
  );
}
