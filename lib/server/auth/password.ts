/**
 * Passwords: the rules for a new one, and hashing.
 *
 * Hash format "$hb2$" + bcrypt(base64(HMAC-SHA256("heatbook-password-v2", password))). bcrypt
 * reads only the first 72 bytes of its input; the pre-hash turns any password (up to
 * MAX_LENGTH characters) into 44 bytes first, so no byte of a long password is ignored. The HMAC
 * key is fixed and public: it only makes the pre-hash differ from a plain SHA-256, so leaked
 * unsalted SHA-256 hashes from elsewhere cannot be tried against our bcrypt hashes directly.
 * Plain bcrypt hashes from before (`$2a$`/`$2b$`) still verify; `needsRehash` tells the sign-in
 * to replace them. bcryptjs (pure JS); cost HEATBOOK_BCRYPT_COST (default 12, 4–14).
 */
import bcrypt from "bcryptjs";
import { createHmac } from "node:crypto";
import { isCommonPassword } from "./commonPasswords";

export const PASSWORD_MIN_LENGTH = 12;
export const PASSWORD_MAX_LENGTH = 1024;
const PREFIX = "$hb2$";

/** Why `password` may not be chosen (null when it may). `context` are words it must not equal (e-mail, name). */
export function passwordProblem(password: string, context: readonly string[] = []): string | null {
  const chars = [...password];
  if (chars.length < PASSWORD_MIN_LENGTH) return `password must have at least ${PASSWORD_MIN_LENGTH} characters`;
  if (chars.length > PASSWORD_MAX_LENGTH) return `password must have at most ${PASSWORD_MAX_LENGTH} characters`;
  if (new Set(chars).size < 4) return "password must use at least 4 different characters";
  if (isCommonPassword(password)) return "this password is on a list of common passwords: choose another";
  const lower = password.toLowerCase();
  for (const word of context) if (word && lower === word.toLowerCase()) return "password must not be your e-mail address or name";
  return null;
}

function cost(): number {
  const c = Number(process.env.HEATBOOK_BCRYPT_COST ?? 12);
  return Math.min(14, Math.max(4, Number.isFinite(c) ? Math.round(c) : 12));
}

function preHash(password: string): string {
  return createHmac("sha256", "heatbook-password-v2").update(password, "utf8").digest("base64");
}

export async function hashPassword(password: string): Promise<string> {
  return PREFIX + (await bcrypt.hash(preHash(password), cost()));
}

/** Check `password` against a stored hash of either format. */
export async function checkPasswordHash(password: string, hash: string): Promise<boolean> {
  if (hash.startsWith(PREFIX)) return bcrypt.compare(preHash(password), hash.slice(PREFIX.length));
  if (/^\$2[aby]\$/.test(hash)) return bcrypt.compare(password, hash);
  return false;
}

/** A stored hash of the old format, or of another cost than today's: replace it at the next sign-in. */
export function needsRehash(hash: string): boolean {
  if (!hash.startsWith(PREFIX)) return true;
  return bcrypt.getRounds(hash.slice(PREFIX.length)) !== cost();
}

let dummy: Promise<string> | undefined;

/**
 * Spend the time of a real check when there is no account (or no password) to check against,
 * so an unknown e-mail answers as slowly as a wrong password. The dummy hash is made once per
 * process at today's cost.
 */
export async function checkAgainstDummy(password: string): Promise<false> {
  dummy ??= hashPassword("no account has this password " + Math.random());
  await checkPasswordHash(password, await dummy);
  return false;
}
