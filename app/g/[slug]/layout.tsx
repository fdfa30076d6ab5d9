import type { ReactNode } from "react";
import { pageMember } from "@/app/_server/guard";

export const dynamic = "force-dynamic";

/** Every page under /g/<slug> belongs to a group: non-members get 404 here (and each page checks again). */
export default async function GroupLayout({ children, params }: { children: ReactNode; params: Promise<{ slug: string }> }) {
  const { slug } = await params;
  await pageMember(slug, `/g/${encodeURIComponent(slug)}`);
  return <>{children}</>;
}
