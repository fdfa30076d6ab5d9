/**
 * The floor of the load benchmark: the rows a notebook read and a sample list touch, read by
 * a bare `pg` query loop (no HTTP, no Next, no Prisma, no computation) with the same pool size
 * as one app process, at a given concurrency for a given time.
 */
import pg from "pg";

export interface FloorIds {
  userId: string;
  slug: string;
  groupId: string;
  analysisId: string;
  revisionId: string;
  sampleId: string;
  measurementId: string;
}

export interface LoopResult {
  requestsPerSecond: number;
  p50Ms: number;
  p99Ms: number;
  errors: number;
}

/** The queries of one notebook read (session user, membership, analysis + revisions, steps, sample, measurement points). */
export async function notebookQueries(c: pg.Pool, ids: FloorIds): Promise<void> {
  await c.query(`SELECT "id", "email", "name" FROM "User" WHERE "id" = $1`, [ids.userId]);
  await c.query(`SELECT m."role", g."id", g."slug", g."name", g."allowSelfApproval" FROM "Membership" m JOIN "Group" g ON g."id" = m."groupId" WHERE m."userId" = $1 AND g."slug" = $2`, [ids.userId, ids.slug]);
  await c.query(`SELECT a.*, s."label" FROM "Analysis" a JOIN "Sample" s ON s."id" = a."sampleId" WHERE a."id" = $1 AND a."groupId" = $2`, [ids.analysisId, ids.groupId]);
  await c.query(`SELECT * FROM "AnalysisRevision" WHERE "analysisId" = $1 ORDER BY "number" DESC`, [ids.analysisId]);
  await c.query(`SELECT * FROM "Step" WHERE "revisionId" = $1 ORDER BY "position"`, [ids.revisionId]);
  await c.query(`SELECT * FROM "Sample" WHERE "id" = $1 AND "groupId" = $2`, [ids.sampleId, ids.groupId]);
  await c.query(`SELECT m.*, f."sha256" FROM "Measurement" m JOIN "StoredFile" f ON f."id" = m."fileId" WHERE m."id" = ANY($1::uuid[]) AND m."groupId" = $2`, [[ids.measurementId], ids.groupId]);
}

/** The queries of one sample list (session user, membership, the group's samples). */
export async function sampleListQueries(c: pg.Pool, ids: FloorIds): Promise<void> {
  await c.query(`SELECT "id", "email", "name" FROM "User" WHERE "id" = $1`, [ids.userId]);
  await c.query(`SELECT m."role", g."id" FROM "Membership" m JOIN "Group" g ON g."id" = m."groupId" WHERE m."userId" = $1 AND g."slug" = $2`, [ids.userId, ids.slug]);
  await c.query(`SELECT * FROM "Sample" WHERE "groupId" = $1 AND "archivedAt" IS NULL ORDER BY "seriesLabel", "compositionValue", "label" LIMIT 200`, [ids.groupId]);
}

/** Run `op` in `concurrency` loops for `seconds`; latencies per op. */
export async function queryLoop(url: string, concurrency: number, seconds: number, op: (c: pg.Pool) => Promise<void>, poolSize = 10): Promise<LoopResult> {
  const pool = new pg.Pool({ connectionString: url, max: poolSize });
  const latencies: number[] = [];
  let errors = 0;
  const end = performance.now() + seconds * 1000;
  await Promise.all(
    Array.from({ length: concurrency }, async () => {
      while (performance.now() < end) {
        const t0 = performance.now();
        try {
          await op(pool);
          latencies.push(performance.now() - t0);
        } catch {
          errors++;
        }
      }
    }),
  );
  await pool.end();
  latencies.sort((a, b) => a - b);
  const q = (p: number) => latencies[Math.min(latencies.length - 1, Math.floor(p * latencies.length))] ?? NaN;
  return { requestsPerSecond: latencies.length / seconds, p50Ms: q(0.5), p99Ms: q(0.99), errors };
}
