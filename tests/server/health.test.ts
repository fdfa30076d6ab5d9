/** GET /api/health: liveness without the database, readiness (?db=1) with it; public, no data. */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import pg from "pg";
import * as health from "../../app/api/health/route";

let t: TestDatabase;
const call = async (query = "") => {
  const res = await health.GET(new Request(`http://localhost/api/health${query}`), {});
  return { status: res.status, body: (await res.json()) as Record<string, string>, cache: res.headers.get("cache-control") };
};

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
});
afterAll(async () => { await t.drop(); });

describe("GET /api/health", () => {
  it("answers ok without a session and is never cached", async () => {
    expect(await call()).toEqual({ status: 200, body: { status: "ok" }, cache: "no-store" });
  });

  it("with ?db=1 also asks PostgreSQL, and says so", async () => {
    expect(await call("?db=1")).toEqual({ status: 200, body: { status: "ok", database: "ok" }, cache: "no-store" });
  });

  it("stays ready after PostgreSQL closes the pool's idle connections (no unhandled pool error)", async () => {
    expect((await call("?db=1")).status).toBe(200);
    const admin = new pg.Client({ connectionString: t.url });
    await admin.connect();
    const killed = await admin.query(`SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE datname = current_database() AND pid <> pg_backend_pid()`);
    await admin.end();
    expect(killed.rowCount).toBeGreaterThan(0);
    await new Promise((ok) => setTimeout(ok, 200)); // the pool hears of the closed connections
    expect(await call("?db=1")).toEqual({ status: 200, body: { status: "ok", database: "ok" }, cache: "no-store" });
  });
});
