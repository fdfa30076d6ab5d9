"use client";
/**
 * Section links (Home, Samples, Analyses, Series, Review, Notices with the unread count, Members,
 * Settings, Audit for owners) for the current group and the group switcher.
 * The current group comes from the path (/g/<slug>/...); elsewhere the links lead to the
 * first group. Switching keeps the section (samples of one group → samples of the other).
 */
import Link from "next/link";
import { usePathname, useRouter } from "next/navigation";
import { groupPaths, groupSlugOf } from "@/app/_lib/paths";

export interface NavGroup {
  slug: string;
  name: string;
  role: string;
  /** Unread in-app notices in this group. */
  unread?: number;
}

type Section = "home" | "samples" | "analyses" | "search" | "members" | "series" | "review" | "notices" | "settings" | "audit";

function section(pathname: string): Section | null {
  if (/^\/g\/[^/]+\/?$/.test(pathname)) return "home";
  if (/^\/g\/[^/]+\/analyses/.test(pathname)) return "analyses";
  if (/^\/g\/[^/]+\/search/.test(pathname)) return "search";
  if (/^\/g\/[^/]+\/(samples|measurements)/.test(pathname)) return "samples";
  if (/^\/g\/[^/]+\/members/.test(pathname)) return "members";
  const m = /^\/g\/[^/]+\/(series|review|notices|settings|audit)/.exec(pathname);
  if (m) return m[1] as Section;
  return null;
}

/** The unread-notices count beside "Notices": a small copper pill. */
const COUNT = { marginLeft: "0.35rem", padding: "0 0.4rem", borderRadius: "999px", background: "#9a4519", color: "#fff", fontSize: "0.75rem", fontWeight: 650 } as const;

export function GroupNav({ groups }: { groups: NavGroup[] }) {
  const pathname = usePathname() ?? "/";
  const router = useRouter();
  const current = groupSlugOf(pathname);
  const active = groups.find((g) => g.slug === current) ?? groups[0] ?? null;
  const where = section(pathname);
  if (!active) {
    return (
      <>
        <nav className="mainnav" aria-label="Main">
          <Link href="/groups" aria-current={pathname === "/groups" ? "page" : undefined}>My groups</Link>
        </nav>
        <span className="topbar-spacer" />
      </>
    );
  }
  const p = groupPaths(active.slug);
  const here = (s: Section) => (current === active.slug && where === s ? "page" : undefined);
  return (
    <>
      <nav className="mainnav" aria-label="Main">
        <Link href={p.home} aria-current={here("home")}>Home</Link>
        <Link href={p.samples} aria-current={here("samples")}>Samples</Link>
        <Link href={`${p.home}/analyses`} aria-current={here("analyses")}>Analyses</Link>
        <Link href={`${p.home}/series`} aria-current={here("series")}>Series</Link>
        <Link href={`${p.home}/review`} aria-current={here("review")}>Review</Link>
        <Link href={`${p.home}/notices`} aria-current={here("notices")} data-testid="nav-notices">Notices{active.unread ? <span className="nav-count" style={COUNT} aria-label={`${active.unread} unread`}>{active.unread}</span> : null}</Link>
        <Link href={p.members} aria-current={here("members")}>Members</Link>
        <Link href={`${p.home}/settings`} aria-current={here("settings")}>Settings</Link>
        {active.role === "owner" && <Link href={`${p.home}/audit`} aria-current={here("audit")}>Audit</Link>}
      </nav>
      <span className="topbar-spacer" />
      <div className="switcher">
        <label htmlFor="group-switcher">Group</label>
        <select
          id="group-switcher"
          data-testid="group-switcher"
          value={current && groups.some((g) => g.slug === current) ? current : ""}
          onChange={(e) => {
            const slug = e.target.value;
            if (!slug) return;
            if (slug === "__all") return router.push("/groups");
            const next = groupPaths(slug);
            router.push(where === "samples" ? next.samples : where === "members" ? next.members : where === "analyses" ? `${next.home}/analyses` : next.home);
          }}
        >
          {!(current && groups.some((g) => g.slug === current)) && <option value="">— choose —</option>}
          {groups.map((g) => (
            <option key={g.slug} value={g.slug}>
              {g.name} ({g.role})
            </option>
          ))}
          <option value="__all">All my groups…</option>
        </select>
      </div>
    </>
  );
}
