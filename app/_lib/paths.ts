/** Path helpers shared by server pages and client forms (no I/O). */

/** Only same-site relative paths may be used as a post-sign-in destination; anything else → fallback. */
export function safeReturnPath(value: string | string[] | null | undefined, fallback = "/"): string {
  const v = Array.isArray(value) ? value[0] : value;
  if (!v || !v.startsWith("/") || v.startsWith("//") || v.startsWith("/\\")) return fallback;
  return v;
}

/** The group slug of an app path like /g/<slug>/..., or null. */
export function groupSlugOf(pathname: string | null): string | null {
  const m = /^\/g\/([^/]+)/.exec(pathname ?? "");
  return m ? decodeURIComponent(m[1]!) : null;
}

export const groupPaths = (slug: string) => ({
  home: `/g/${encodeURIComponent(slug)}`,
  samples: `/g/${encodeURIComponent(slug)}/samples`,
  members: `/g/${encodeURIComponent(slug)}/members`,
  sample: (id: string) => `/g/${encodeURIComponent(slug)}/samples/${id}`,
  measurement: (id: string) => `/g/${encodeURIComponent(slug)}/measurements/${id}`,
  api: `/api/groups/${encodeURIComponent(slug)}`,
});
