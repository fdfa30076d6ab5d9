/**
 * Sign-in throttling: after 5 failed attempts for one e-mail (or 30 from one known address) within
 * 15 minutes, further attempts are refused until the window passes. Attempts are kept in
 * PostgreSQL so the limit holds across app instances.
 */
import type { Db } from "../db/client";

export const THROTTLE = { windowMs: 15 * 60_000, perEmail: 5, perIp: 30 } as const;

export async function isThrottled(db: Db, email: string, ip: string, now = new Date()): Promise<boolean> {
  const since = new Date(now.getTime() - THROTTLE.windowMs);
  const [byEmail, byIp] = await Promise.all([
    db.signInAttempt.count({ where: { email, succeeded: false, at: { gte: since } } }),
    // An unknown address ("") is never counted as one client.
    ip ? db.signInAttempt.count({ where: { ip, succeeded: false, at: { gte: since } } }) : Promise.resolve(0),
  ]);
  return byEmail >= THROTTLE.perEmail || byIp >= THROTTLE.perIp;
}

export async function recordAttempt(db: Db, email: string, ip: string, succeeded: boolean): Promise<void> {
  await db.signInAttempt.create({ data: { email, ip, succeeded } });
  if (succeeded) {
    // A success clears the e-mail's failure streak.
    await db.signInAttempt.deleteMany({ where: { email, succeeded: false } });
  }
}
