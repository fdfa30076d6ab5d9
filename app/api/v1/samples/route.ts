import { v1, ENDPOINTS, pageSamples } from "@/lib/server/api";
import { createSample } from "@/lib/server/samples";

export const dynamic = "force-dynamic";

export const GET = v1(ENDPOINTS.listSamples, ({ db, member, query }) => pageSamples(db, member, query));

export const POST = v1(ENDPOINTS.createSample, async ({ db, member, body }) => ({ sample: await createSample(db, member, body) }));
