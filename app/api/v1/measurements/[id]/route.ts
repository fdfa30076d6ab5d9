import { v1, ENDPOINTS } from "@/lib/server/api";
import { getMeasurement } from "@/lib/server/measurements";

export const dynamic = "force-dynamic";

export const GET = v1(ENDPOINTS.getMeasurement, async ({ db, member, params }) => ({ measurement: await getMeasurement(db, member, params.id!) }));
