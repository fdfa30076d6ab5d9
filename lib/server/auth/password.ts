/**
 * Password hashing with bcrypt (adaptive cost; bcryptjs, a maintained pure-JS implementation).
 * Cost 12 in production, lower under tests (HEATBOOK_BCRYPT_COST) to keep the suite fast.
 */
import bcrypt from "bcryptjs";

const MIN_LENGTH = 10;

export function passwordProblem(password: string): string | null {
  if (password.length < MIN_LENGTH) return `password must have at least ${MIN_LENGTH} characters`;
  if (password.length > 200) return "password must have at most 200 characters";
  return null;
}

export async function hashPassword(password: string): Promise<string> {
  const cost = Number(process.env.HEATBOOK_BCRYPT_COST ?? 12);
  return bcrypt.hash(password, Math.min(14, Math.max(4, cost)));
}

export async function verifyPassword(password: string, hash: string): Promise<boolean> {
  return bcrypt.compare(password, hash);
}
