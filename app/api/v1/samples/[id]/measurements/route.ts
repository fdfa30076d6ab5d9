import { v1, ENDPOINTS, pageMeasurements, uploadMeasurement } from "@/lib/server/api";

export const dynamic = "force-dynamic";

export const GET = v1(ENDPOINTS.listSampleMeasurements, ({ db, member, params, query }) => pageMeasurements(db, member, params.id!, query));

export const POST = v1(ENDPOINTS.uploadMeasurement, async ({ req, db, member, params, query }) => ({ measurement: await uploadMeasurement(req, db, member, params.id!, query) }));
