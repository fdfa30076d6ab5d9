import { v1, ENDPOINTS, getApiAnalysis } from "@/lib/server/api";

export const dynamic = "force-dynamic";

export const GET = v1(ENDPOINTS.getAnalysis, ({ db, member, params, query }) => getApiAnalysis(db, member, params.id!, query));
