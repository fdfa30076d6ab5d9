"use server";
/**
 * Server action of the notebook page: note steps rendered from Markdown to sanitised HTML on the
 * server (lib/server/markdown.ts), for the client after it re-fetches the notebook. Checks the
 * session and the group membership itself, like every handler.
 */
import { database as getDb } from "@/lib/server/database";
import { currentUser } from "@/lib/server/session";
import { memberOf } from "@/lib/server/access";
import { renderMarkdown } from "@/lib/server/markdown";

/** HTML per Markdown text (same order); at most 200 texts. */
export async function renderNotes(slug: string, texts: string[]): Promise<string[]> {
  const user = await currentUser();
  if (!user) throw new Error("sign in first");
  await memberOf(getDb(), user.id, slug);
  if (!Array.isArray(texts) || texts.length > 200) throw new Error("invalid texts");
  return texts.map((t) => renderMarkdown(String(t)));
}
