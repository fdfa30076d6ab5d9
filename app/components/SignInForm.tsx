"use client";
import { signIn } from "next-auth/react";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";

/** E-mail + password sign-in through next-auth's "password" credentials provider. */
export function SignInForm({ callbackUrl }: { callbackUrl: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    setBusy(true);
    setError(null);
    const res = await signIn("password", { email: String(form.get("email") ?? ""), password: String(form.get("password") ?? ""), redirect: false });
    if (!res || res.error) {
      setBusy(false);
      setError(res?.error && res.error !== "CredentialsSignin" ? res.error : "E-mail or password is wrong");
      return;
    }
    router.push(callbackUrl);
    router.refresh();
  }

  return (
    <form className="stack" onSubmit={submit} noValidate>
      <div className="field">
        <label htmlFor="signin-email">E-mail</label>
        <input id="signin-email" name="email" type="email" autoComplete="username" required autoFocus />
      </div>
      <div className="field">
        <label htmlFor="signin-password">Password</label>
        <input id="signin-password" name="password" type="password" autoComplete="current-password" required {...(error ? { "aria-invalid": true, "aria-describedby": "signin-error" } : {})} />
      </div>
      {error && (
        <p className="form-error" id="signin-error" role="alert">
          {error}
        </p>
      )}
      <div className="actions">
        <button type="submit" disabled={busy}>{busy ? "Signing in…" : "Sign in"}</button>
      </div>
    </form>
  );
}
