/**
 * Page-side access checks. Every page calls one of these on the server (the proxy only
 * redirects): no session → /signin with a callbackUrl back here; not a member → 404
 * (a group the caller does not belong to does not exist for them).
 */
import { notFound, redirect } from "next/navigation";
import { database as getDb, type Db } from "@/lib/server/database";
import { currentUser } from "@/lib/server/session";
import { memberOf, type Member } from "@/lib/server/access";
import { NotFoundError } from "@/lib/engine/errors";
import type { UserInfo } from "@/lib/server/users";

export interface PageUser {
  db: Db;
  user: UserInfo;
}

export interface PageMember extends PageUser {
  member: Member;
}

/** The signed-in user, or a redirect to /signin that comes back to `returnTo`. */
export async function pageUser(returnTo: string): Promise<PageUser> {
  const user = await currentUser();
  if (!user) redirect(`/signin?callbackUrl=${encodeURIComponent(returnTo)}`);
  return { db: getDb(), user };
}

/** The caller's membership of group `slug`; notFound() for non-members. */
export async function pageMember(slug: string, returnTo: string): Promise<PageMember> {
  const { db, user } = await pageUser(returnTo);
  try {
    const member = await memberOf(db, user.id, slug);
    return { db, user, member };
  } catch (err) {
    if (err instanceof NotFoundError) notFound();
    throw err;
  }
}

/** Run a read that may throw NotFoundError (a record of another group, a bad id) → 404 page. */
export async function orNotFound<T>(read: () => Promise<T>): Promise<T> {
  try {
    return await read();
  } catch (err) {
    if (err instanceof NotFoundError) notFound();
    throw err;
  }
}
