import { v1, ENDPOINTS, listApiAnalyses } from "@/lib/server/api";

export const dynamic = "force-dynamic";

export const GET = v1(ENDPOINTS.listAnalyses, async ({ db, member, query }) => {
  const page = await listApiAnalyses(db, member, query);
  return { analyses: page.items, nextCursor: page.nextCursor };
});
