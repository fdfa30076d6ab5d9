/** The signed-in user of the current request (server components, route handlers, actions). */
import { getServerSession } from "next-auth";
import { authOptions } from "./auth/options";
import { UnauthenticatedError } from "../engine/errors";
import type { UserInfo } from "./users";
import { getDb } from "./db/client";

export async function currentUser(): Promise<UserInfo | null> {
  const session = await getServerSession(authOptions);
  const id = (session?.user as { id?: string } | undefined)?.id;
  if (!id) return null;
  const user = await getDb().user.findUnique({ where: { id }, select: { id: true, email: true, name: true } });
  return user ?? null;
}

export async function requireUser(): Promise<UserInfo> {
  const user = await currentUser();
  if (!user) throw new UnauthenticatedError();
  return user;
}
