import { v1, ENDPOINTS } from "@/lib/server/api";
import { listSeries } from "@/lib/server/series";

export const dynamic = "force-dynamic";

export const GET = v1(ENDPOINTS.listSeries, async ({ db, member }) => ({ series: await listSeries(db, member) }));
