"use client";
import { signIn } from "next-auth/react";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { callJson, errorFor, type ApiResult } from "@/app/_lib/api";
import { FieldError, invalidProps } from "./FieldError";

/**
 * Sign-up (POST /api/signup), then sign in with the same credentials. The server answers alike
 * for a new address and one that already has an account; if signing in then fails, the form
 * says so without telling which it was. Errors sit under the field the server names.
 */
export function SignUpForm({ callbackUrl }: { callbackUrl: string }) {
  const router = useRouter();
  const [result, setResult] = useState<ApiResult<unknown> | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    const body = { name: String(form.get("name") ?? ""), email: String(form.get("email") ?? ""), password: String(form.get("password") ?? "") };
    setBusy(true);
    const res = await callJson<{ message: string }>("/api/signup", "POST", body);
    if (!res.ok) {
      setResult(res);
      setBusy(false);
      return;
    }
    const login = await signIn("password", { email: body.email, password: body.password, redirect: false });
    if (!login || login.error) {
      setBusy(false);
      const why = login?.error && login.error !== "CredentialsSignin" ? ` (${login.error})` : "";
      setResult({ ...res, ok: false, error: `Signing in with this address and password did not work${why}. If the address already had an account, sign in with its own password.`, field: null });
      return;
    }
    router.push(callbackUrl);
    router.refresh();
  }

  const err = (f: string) => errorFor(result, f);
  const general = result && !result.ok && !["name", "email", "password"].some((f) => err(f)) ? result.error : null;
  return (
    <form className="stack" onSubmit={submit} noValidate>
      <div className="field">
        <label htmlFor="signup-name">Name</label>
        <input id="signup-name" name="name" type="text" autoComplete="name" required {...invalidProps("signup-name", err("name"))} />
        <FieldError id="signup-name-error" message={err("name")} />
      </div>
      <div className="field">
        <label htmlFor="signup-email">E-mail</label>
        <input id="signup-email" name="email" type="email" autoComplete="email" required {...invalidProps("signup-email", err("email"))} />
        <FieldError id="signup-email-error" message={err("email")} />
      </div>
      <div className="field">
        <label htmlFor="signup-password">Password</label>
        <input id="signup-password" name="password" type="password" autoComplete="new-password" required aria-describedby="signup-password-hint" {...invalidProps("signup-password", err("password"))} />
        <span className="hint" id="signup-password-hint">At least 12 characters; common passwords are refused.</span>
        <FieldError id="signup-password-error" message={err("password")} />
      </div>
      {general && <p className="form-error" role="alert">{general}</p>}
      <div className="actions">
        <button type="submit" disabled={busy}>{busy ? "Creating…" : "Create account"}</button>
      </div>
    </form>
  );
}
