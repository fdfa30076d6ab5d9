/**
 * Approval as a signature: what the reviewer states (one of a small fixed set of meanings, in
 * our own words), the note they write, the discussion threads still open that they acknowledge,
 * and how their identity was checked again in the approving request — the password of their
 * account, or (for accounts without a password, signed in through the institution's OpenID
 * Connect provider) a sign-in no older than FRESH_SIGN_IN_MINUTES. Wrong or missing proof
 * refuses before anything is written.
 */
import type { Db } from "../db/client";
import { ForbiddenError, InputError } from "../../engine/errors";
import type { Member } from "../access";
import type { Role } from "../permissions";
import { authenticate } from "../users";

/** What the reviewer's approval means (stored by key; the statement is stored beside it). */
export const SIGNATURE_MEANINGS = {
  publication: "I have reviewed this analysis and approve its results as final, fit for publication and for use outside the group.",
  internal: "I have reviewed this analysis and approve its results as final for use within the group; they are not yet cleared for publication.",
} as const;
export type SignatureMeaning = keyof typeof SIGNATURE_MEANINGS;
export const MEANING_KEYS = Object.keys(SIGNATURE_MEANINGS) as [SignatureMeaning, ...SignatureMeaning[]];
/** Short names of the meanings for tables and lists. */
export const MEANING_LABEL: Record<SignatureMeaning, string> = { publication: "approved for publication", internal: "approved for internal use" };

/** How long an institutional sign-in counts as fresh for signing. */
export const FRESH_SIGN_IN_MINUTES = 10;

export type SignMethod = "password" | "institution-sign-in";

export interface AcknowledgedThread {
  id: string;
  openedBy: string;
  excerpt: string;
}

/** The signature as sealed into the snapshot (and recorded in the audit event). */
export interface SealSignature {
  signerId: string;
  signerName: string;
  signerEmail: string;
  signerRole: Role;
  meaning: SignatureMeaning;
  statement: string;
  note: string;
  signedAt: string;
  method: SignMethod;
  acknowledgedThreads: AcknowledgedThread[];
}

/** What the approving request knows about the session besides the user. */
export interface SignerSession {
  /** When the session's institutional (OpenID Connect) sign-in happened; null for any other sign-in. */
  institutionSignInAt?: Date | null;
  /** Client address for sign-in throttling ("" unknown). */
  ip?: string;
}

/**
 * Check the signer's identity again. With a password on the account, `password` must be right
 * (throttled like sign-in; a wrong one is an InputError on field "password"). Without one, the
 * session must come from an institutional sign-in in the last FRESH_SIGN_IN_MINUTES, else
 * ForbiddenError saying what to do.
 */
export async function checkSignerIdentity(db: Db, member: Member, password: string | undefined, session: SignerSession, now = new Date()): Promise<{ method: SignMethod; name: string; email: string }> {
  const user = await db.user.findUnique({ where: { id: member.userId }, select: { email: true, name: true, passwordHash: true } });
  if (!user) throw new ForbiddenError("your account no longer exists");
  if (user.passwordHash) {
    if (!password) throw new InputError("enter your password to sign the approval", { field: "password" });
    // Counted and backed off like a sign-in (lib/server/auth/throttle.ts), per account and address.
    const outcome = await authenticate(db, user.email, password, { address: session.ip ?? null, deviceId: null });
    if (!outcome.ok) throw new InputError(outcome.reason === "throttled" ? `too many wrong passwords: wait ${Math.ceil(outcome.retryAfterMs / 1000)} s; nothing was sealed` : "the password is wrong; nothing was sealed", { field: "password" });
    return { method: "password", name: user.name, email: user.email };
  }
  const at = session.institutionSignInAt;
  if (at && now.getTime() - at.getTime() <= FRESH_SIGN_IN_MINUTES * 60_000 && at.getTime() <= now.getTime() + 60_000) return { method: "institution-sign-in", name: user.name, email: user.email };
  throw new ForbiddenError(
    at
      ? `your institutional sign-in is more than ${FRESH_SIGN_IN_MINUTES} minutes old: sign out, sign in again with your institution, and approve within ${FRESH_SIGN_IN_MINUTES} minutes; nothing was sealed`
      : "your account has no password and this session did not come from an institutional sign-in: ask a group owner for a password-set link, or sign in with your institution; nothing was sealed",
  );
}

/** Threads of the analysis still open, each with who opened it and the start of its first comment. */
export async function openThreads(db: Pick<Db, "thread">, analysisId: string): Promise<AcknowledgedThread[]> {
  const rows = await db.thread.findMany({
    where: { analysisId, state: "open" },
    orderBy: { createdAt: "asc" },
    select: { id: true, comments: { orderBy: { createdAt: "asc" }, take: 1, select: { body: true, author: { select: { name: true } } } } },
  });
  return rows.map((t) => {
    const first = t.comments[0];
    const body = (first?.body ?? "").replace(/\s+/g, " ").trim();
    return { id: t.id, openedBy: first?.author.name ?? "former member", excerpt: body.length > 120 ? `${body.slice(0, 120)}…` : body };
  });
}

/** Refuse unless every open thread is acknowledged by id; returns the acknowledged ones. */
export function requireAcknowledged(open: AcknowledgedThread[], acknowledgedIds: readonly string[]): AcknowledgedThread[] {
  const ack = new Set(acknowledgedIds);
  const missing = open.filter((t) => !ack.has(t.id));
  if (missing.length)
    throw new InputError(
      `${missing.length} discussion thread${missing.length === 1 ? " is" : "s are"} still open (${missing.map((t) => `${t.openedBy}: “${t.excerpt}”`).join("; ")}): resolve ${missing.length === 1 ? "it" : "them"}, or acknowledge each in the approval; nothing was sealed`,
      { field: "acknowledgedThreadIds" },
    );
  return open;
}
