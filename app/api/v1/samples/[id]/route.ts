import { v1, ENDPOINTS } from "@/lib/server/api";
import { getSample, updateSample } from "@/lib/server/samples";

export const dynamic = "force-dynamic";

export const GET = v1(ENDPOINTS.getSample, async ({ db, member, params }) => ({ sample: await getSample(db, member, params.id!) }));

export const POST = v1(ENDPOINTS.updateSample, async ({ db, member, params, body }) => ({ sample: await updateSample(db, member, params.id!, body) }));
