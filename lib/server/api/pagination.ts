/**
 * Keyset pagination for list endpoints: `?limit=&cursor=`, ordered by (createdAt, id) ascending.
 * The cursor is opaque to clients (base64url of the last row's createdAt and id); a page answer
 * carries `nextCursor` (null on the last page). Rows inserted meanwhile never shift a page.
 */
import { z } from "zod";
import { InputError } from "../../engine/errors";

export const MAX_PAGE = 200;

export const pageQuery = z.object({
  limit: z.coerce.number().int().min(1).max(MAX_PAGE).default(50),
  cursor: z.string().max(200).optional(),
});

export interface Cursor {
  at: Date;
  id: string;
}

export function encodeCursor(c: Cursor): string {
  return Buffer.from(JSON.stringify([c.at.toISOString(), c.id])).toString("base64url");
}

/** Decode a cursor or throw InputError (field "cursor"). */
export function decodeCursor(text: string): Cursor {
  try {
    const [at, id] = JSON.parse(Buffer.from(text, "base64url").toString("utf8")) as [string, string];
    const date = new Date(at);
    if (Number.isNaN(date.getTime()) || !/^[0-9a-f-]{36}$/i.test(id)) throw new Error("bad");
    return { at: date, id };
  } catch {
    throw new InputError("invalid cursor: use the nextCursor of a previous page", { field: "cursor" });
  }
}

/** The Prisma `where` fragment for rows after the cursor (none when absent). */
export function afterCursor(cursor: string | undefined): object {
  if (!cursor) return {};
  const c = decodeCursor(cursor);
  return { OR: [{ createdAt: { gt: c.at } }, { createdAt: c.at, id: { gt: c.id } }] };
}

export const PAGE_ORDER = [{ createdAt: "asc" as const }, { id: "asc" as const }];

/** Rows fetched with `take: limit + 1` → the page and its next cursor. */
export function pageOf<T extends { createdAt: Date; id: string }, U>(rows: T[], limit: number, map: (row: T) => U): { items: U[]; nextCursor: string | null } {
  const more = rows.length > limit;
  const page = more ? rows.slice(0, limit) : rows;
  const last = page[page.length - 1];
  return { items: page.map(map), nextCursor: more && last ? encodeCursor({ at: last.createdAt, id: last.id }) : null };
}
