/** Accounts: sign-up and password sign-in (throttled), mapped to a plain domain type. */
import { z } from "zod";
import type { Db } from "./db/client";
import { InputError } from "../engine/errors";
import { checkAgainstDummy, checkPasswordHash, hashPassword, needsRehash, passwordProblem } from "./auth/password";
import { reserveAttempt, settleSuccess, UNIDENTIFIED, type SignInClient } from "./auth/throttle";
import { recordAudit } from "./audit";
import { uuidOrNone } from "./ids";

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

/** What sign-up answers, for a new address and for one that already has an account alike. */
export const SIGN_UP_ANSWER = "If this address can be used, its account is ready: sign in with it and the password you chose. If it already had an account, a notice went to that address and its old password still applies.";

/**
 * Sign up. The answer does not tell whether the address already had an account: a new address
 * gets its account; an existing one gets a message in the outbox ("someone tried to sign up
 * with your address"), and its account is not changed. Both spend one password hash, so they
 * take about the same time. Invalid input (name, e-mail, a weak password) is refused the same
 * way for both.
 */
export async function signUp(db: Db, input: unknown): Promise<{ message: string }> {
  const parsed = signUpSchema.safeParse(input);
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!;
    throw new InputError(issue.message, { field: String(issue.path[0] ?? "") });
  }
  const { email, name, password } = parsed.data;
  const problem = passwordProblem(password, [email, email.split("@")[0]!, name]);
  if (problem) throw new InputError(problem, { field: "password" });
  const passwordHash = await hashPassword(password);
  await db.$transaction(async (tx) => {
    const created = await tx.$queryRawUnsafe<{ id: string }[]>(
      `INSERT INTO "User" ("id", "email", "name", "passwordHash") VALUES (gen_random_uuid(), $1, $2, $3) ON CONFLICT ("email") DO NOTHING RETURNING "id"::text`,
      email, name, passwordHash,
    );
    if (created.length === 1) {
      await recordAudit(tx, { actorId: created[0]!.id, action: "user.signup", objectType: "user", objectId: created[0]!.id });
    } else {
      await tx.outbox.create({
        data: {
          toEmail: email,
          subject: "Someone tried to create a Heatbook account with your address",
          body: "Someone asked to create a Heatbook account with this e-mail address, which already has one. Nothing was changed: your password still applies. If this was you, sign in instead. If it was not, you need not do anything.",
        },
      });
    }
  });
  return { message: SIGN_UP_ANSWER };
}

export type SignInOutcome = { ok: true; user: UserInfo } | { ok: false; reason: "invalid" } | { ok: false; reason: "throttled"; retryAfterMs: number };

/**
 * Password sign-in: the attempt is counted first (lib/server/auth/throttle.ts), then the password
 * is checked — against the account's hash, or a dummy hash when there is no such account, so
 * both take the same time and give the same answer. A correct password takes the counted
 * failure back and, if the stored hash is of the old format or cost, replaces it.
 */
export async function authenticate(db: Db, emailRaw: string, password: string, client: SignInClient = UNIDENTIFIED): Promise<SignInOutcome> {
  const email = normaliseEmail(emailRaw);
  const reservation = await reserveAttempt(db, email, client);
  if (!reservation.ok) return { ok: false, reason: "throttled", retryAfterMs: reservation.retryAfterMs };
  const user = await db.user.findUnique({ where: { email } });
  const good = user?.passwordHash ? await checkPasswordHash(password, user.passwordHash) : await checkAgainstDummy(password);
  if (!good || !user) return { ok: false, reason: "invalid" };
  await settleSuccess(db, reservation);
  if (needsRehash(user.passwordHash!)) await db.user.update({ where: { id: user.id }, data: { passwordHash: await hashPassword(password) } });
  return { ok: true, user: { id: user.id, email: user.email, name: user.name } };
}

/**
 * Whether `password` is the signed-in user's password (re-entry before a consequential step,
 * e.g. approval). Not throttled here and not counted: the caller is already signed in; callers
 * that expose it to repeated tries should limit it themselves. An account without a password
 * (institutional sign-in only) never matches; the time spent is the same as a real check.
 */
export async function verifyUserPassword(db: Db, userId: string, password: string): Promise<boolean> {
  const user = await db.user.findUnique({ where: { id: uuidOrNone(userId) }, select: { passwordHash: true } });
  if (!user?.passwordHash) return checkAgainstDummy(password);
  return checkPasswordHash(password, user.passwordHash);
}

/** For institutional (OpenID Connect) sign-in: find or create the account by e-mail. */
export async function findOrCreateExternalUser(db: Db, emailRaw: string, name: string): Promise<UserInfo> {
  const email = normaliseEmail(emailRaw);
  const user = await db.user.upsert({ where: { email }, update: {}, create: { email, name: name || email } });
  return { id: user.id, email: user.email, name: user.name };
}
