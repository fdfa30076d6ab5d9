/**
 * `npm run bench -- auth`: what the server-side session check and the shared API rate limit
 * cost per request, side by side in one run.
 *
 * 1. The sample list's one statement (membership + the sample list), as before sessions (no
 *    session check) and as now (the session row checked, last use refreshed once a minute),
 *    by a bare `pg` loop on a pool of 10 at 1 and 32 concurrent clients.
 * 2. A v1 API request (GET /api/v1/samples through the real route handler, in-process, no HTTP)
 *    with the PostgreSQL rate limit and with a limiter that always allows (what the API would
 *    cost with no limit at all; the in-memory one it replaced cost about as little).
 * Blocks alternate A, B, A, B, … so drift of the machine's speed hits both alike.
 */
import pg from "pg";
import { opsDatabase, opsFixture } from "../tests/ops/harness";
import { memberStatement } from "../lib/server/handler";
import { sampleListSql } from "../lib/server/samples";
import { createSession } from "../lib/server/auth/sessions";
import { liveSessionSql } from "../lib/server/auth/sessions";
import { createSample } from "../lib/server/samples";
import { createToken } from "../lib/server/tokens";
import { setApiLimiter, type RateLimiter } from "../lib/server/api";

const OLD_MEMBER_SQL = (extra: string) => `WITH mem AS (
      SELECT m."role"::text AS "role", g."id"::text AS "id", g."slug", g."name", g."allowSelfApproval", u."email", u."name" AS "userName"
      FROM "Membership" m JOIN "Group" g ON g."id" = m."groupId" JOIN "User" u ON u."id" = m."userId"
      WHERE m."userId" = $1::uuid AND g."slug" = $2)
    SELECT (SELECT row_to_json(mem)::text FROM mem) AS "member", (${extra}) AS "extra"`;

interface Stats { perSecond: number; p50: number; p99: number }

async function loop(concurrency: number, ms: number, once: () => Promise<unknown>): Promise<Stats> {
  const times: number[] = [];
  const end = performance.now() + ms;
  await Promise.all(Array.from({ length: concurrency }, async () => {
    while (performance.now() < end) {
      const t0 = performance.now();
      await once();
      times.push(performance.now() - t0);
    }
  }));
  times.sort((a, b) => a - b);
  return { perSecond: times.length / (ms / 1000), p50: times[Math.floor(times.length / 2)]!, p99: times[Math.floor(times.length * 0.99)]! };
}

const fmt = (s: Stats) => `${Math.round(s.perSecond)} | ${s.p50.toFixed(2)} | ${s.p99.toFixed(2)}`;

export async function runAuthBench(): Promise<string> {
  const ops = await opsDatabase("bench-auth");
  try {
    process.env.DATABASE_URL = ops.url;
    const f = await opsFixture(ops.db, "auth");
    for (let i = 0; i < 40; i++) await createSample(ops.db, f.analyst, { label: `S-${i}`, formula: "Cu", massMg: 10 + i });
    const sid = await createSession(ops.db, f.analyst.userId);
    const pool = new pg.Pool({ connectionString: ops.url, max: 10 });
    const page = [false, 200, 0];
    const extra = sampleListSql(`(SELECT "id"::uuid FROM mem)`, (k: number) => `$${k + 3}`);
    const oldText = OLD_MEMBER_SQL(extra);
    const newText = memberStatement(false, sampleListSql);
    const before = () => pool.query({ name: "before", text: oldText, values: [f.analyst.userId, f.slug, ...page] });
    const after = () => pool.query({ name: "after", text: newText, values: [f.analyst.userId, f.slug, ...liveSessionSql(3).values(sid), ...page] });
    const check = await after();
    if (!check.rows[0].live || !check.rows[0].member) throw new Error("the session statement did not find the live session");

    const { token } = await createToken(ops.db, f.analyst, { name: "bench", scope: "read" });
    const samples = await import("../app/api/v1/samples/route");
    const v1 = async () => {
      const res = await samples.GET(new Request("http://localhost/api/v1/samples?limit=50", { headers: { authorization: `Bearer ${token}` } }), { params: Promise.resolve({}) });
      if (res.status !== 200) throw new Error(`v1 answered ${res.status}`);
      await res.arrayBuffer();
    };
    const allowAll: RateLimiter = { take: async () => ({ allowed: true, limit: 1e9, remaining: 1e9, retryAfterSeconds: 0 }) };
    process.env.HEATBOOK_API_BURST = "1000000000";
    process.env.HEATBOOK_API_RATE_PER_MINUTE = "1000000000";

    const rows: string[] = [];
    const rounds = 3;
    for (const c of [1, 32]) {
      const acc: Record<string, Stats[]> = { before: [], after: [], none: [], pg: [] };
      await loop(c, 500, before); await loop(c, 500, after);
      for (let r = 0; r < rounds; r++) {
        acc.before!.push(await loop(c, 2000, before));
        acc.after!.push(await loop(c, 2000, after));
        setApiLimiter(allowAll);
        acc.none!.push(await loop(c, 2000, v1));
        setApiLimiter(undefined);
        acc.pg!.push(await loop(c, 2000, v1));
      }
      const med = (xs: Stats[]): Stats => { const m = (k: keyof Stats) => [...xs].sort((a, b) => a[k] - b[k])[Math.floor(xs.length / 2)]![k]; return { perSecond: m("perSecond"), p50: m("p50"), p99: m("p99") }; };
      rows.push(`| sample-list statement, no session check (before) | ${c} | ${fmt(med(acc.before!))} |`);
      rows.push(`| sample-list statement with the session check (now) | ${c} | ${fmt(med(acc.after!))} |`);
      rows.push(`| v1 GET /samples, no rate limit | ${c} | ${fmt(med(acc.none!))} |`);
      rows.push(`| v1 GET /samples, rate limit in PostgreSQL (now) | ${c} | ${fmt(med(acc.pg!))} |`);
    }
    await pool.end();
    return [
      `### Sessions and the shared rate limit (medians of ${rounds} alternating 2 s blocks; pool of 10)`,
      "",
      "| case | concurrent | per second | p50 ms | p99 ms |",
      "|---|---:|---:|---:|---:|",
      ...rows,
    ].join("\n");
  } finally {
    await ops.close();
  }
}
