import { NextResponse } from "next/server";
import { route } from "@/lib/server/http";
import { pingDatabase } from "@/lib/server/database";

export const dynamic = "force-dynamic";

/** The answer as JSON text, never cached (a stale "ok" would hide an outage). */
const answer = (json: string) => new NextResponse(json, { headers: { "content-type": "application/json", "cache-control": "no-store" } });

/**
 * Health check for a load balancer or an orchestrator; public, reveals no data.
 * `GET /api/health`: this process serves requests (liveness), `{"status":"ok"}`; it does not
 * touch the database, so a database outage does not take every instance out of rotation.
 * `GET /api/health?db=1`: and PostgreSQL answers `SELECT 1` (readiness),
 * `{"status":"ok","database":"ok"}`, else 503 with the reason.
 */
export const GET = route(async (req: Request) => {
  if (new URL(req.url).searchParams.get("db") !== "1") return answer('{"status":"ok"}');
  await pingDatabase(); // when PostgreSQL is unreachable, route() answers 503 with the reason
  return answer('{"status":"ok","database":"ok"}');
});
