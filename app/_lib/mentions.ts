/** @mentions in discussion text: what is being typed at the caret, and handles that match no member. */

export interface Mentionable {
  handle: string;
  name: string;
}

/** The "@word" being typed at the caret, if any: its start index and the text after "@". */
export function mentionAt(text: string, caret: number): { start: number; query: string } | null {
  const m = /(?:^|[^\w@.])@([\w.\-]*)$/.exec(text.slice(0, caret));
  return m ? { start: caret - m[1]!.length - 1, query: m[1]!.toLowerCase() } : null;
}

/** Handles written in `text` that belong to no member (lower-cased, each once). */
export function unknownMentions(text: string, members: readonly Mentionable[]): string[] {
  const known = new Set(members.map((m) => m.handle.toLowerCase()));
  const written = [...text.matchAll(/(?:^|[^\w@.])@([A-Za-z0-9][\w.\-]*)/g)].map((m) => m[1]!.replace(/[.\-]+$/, "").toLowerCase());
  return [...new Set(written.filter((h) => !known.has(h)))];
}

