/** Accounts: sign-up and password sign-in (throttled), mapped to a plain domain type. */
import { z } from "zod";
import type { Db } from "./db/client";
import { InputError } from "../engine/errors";
import { hashPassword, passwordProblem, verifyPassword } from "./auth/password";
import { isThrottled, recordAttempt } from "./auth/throttle";
import { recordAudit } from "./audit";

export interface UserInfo {
  id: string;
  email: string;
  name: string;
}

export const signUpSchema = z.object({
  email: z.string().trim().toLowerCase().email("a valid e-mail address is needed"),
  name: z.string().trim().min(1, "a name is needed").max(120),
  password: z.string().min(1, "a password is needed"),
});

export function normaliseEmail(email: string): string {
  return email.trim().toLowerCase();
}

export async function signUp(db: Db, input: unknown): Promise<UserInfo> {
  const parsed = signUpSchema.safeParse(input);
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!;
    throw new InputError(issue.message, { field: String(issue.path[0] ?? "") });
  }
  const { email, name, password } = parsed.data;
  const problem = passwordProblem(password);
  if (problem) throw new InputError(problem, { field: "password" });
  const existing = await db.user.findUnique({ where: { email } });
  if (existing) throw new InputError("an account with this e-mail already exists", { field: "email" });
  const passwordHash = await hashPassword(password);
  return db.$transaction(async (tx) => {
    const user = await tx.user.create({ data: { email, name, passwordHash } });
    await recordAudit(tx, { actorId: user.id, action: "user.signup", objectType: "user", objectId: user.id });
    return { id: user.id, email: user.email, name: user.name };
  });
}

export type SignInOutcome = { ok: true; user: UserInfo } | { ok: false; reason: "invalid" | "throttled" };

export async function authenticate(db: Db, emailRaw: string, password: string, ip: string): Promise<SignInOutcome> {
  const email = normaliseEmail(emailRaw);
  if (await isThrottled(db, email, ip)) return { ok: false, reason: "throttled" };
  const user = await db.user.findUnique({ where: { email } });
  const good = !!user?.passwordHash && (await verifyPassword(password, user.passwordHash));
  await recordAttempt(db, email, ip, good);
  if (!good || !user) return { ok: false, reason: "invalid" };
  return { ok: true, user: { id: user.id, email: user.email, name: user.name } };
}

/** For institutional (OpenID Connect) sign-in: find or create the account by e-mail. */
export async function findOrCreateExternalUser(db: Db, emailRaw: string, name: string): Promise<UserInfo> {
  const email = normaliseEmail(emailRaw);
  const user = await db.user.upsert({ where: { email }, update: {}, create: { email, name: name || email } });
  return { id: user.id, email: user.email, name: user.name };
}
