import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { currentUser } from "@/lib/server/session";
import { safeReturnPath } from "@/app/_lib/paths";
import { SignInForm } from "@/app/components/SignInForm";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const params = await searchParams;
  const callbackUrl = safeReturnPath(params.callbackUrl, "/");
  if (await currentUser()) redirect(callbackUrl);
  const signupHref = `/signup${callbackUrl !== "/" ? `?callbackUrl=${encodeURIComponent(callbackUrl)}` : ""}`;
  return (
    <div className="narrow">
      <h1>Sign in</h1>
      <p className="lede">Use the e-mail address and password of your Heatbook account.</p>
      <div className="sheet">
        <SignInForm callbackUrl={callbackUrl} />
      </div>
      <p>
        No account yet? <Link href={signupHref}>Create one</Link>.
      </p>
    </div>
  );
}
