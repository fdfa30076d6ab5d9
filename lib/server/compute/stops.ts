/**
 * Budget stops kept by input hash (table "ComputeStop"), so a step that ran out of its time
 * budget is not run again on every open: with the same inputs and a budget no larger than the
 * one it ran out of, the stop is reported at once. A changed input (another hash) or a larger
 * budget (e.g. a background job's) computes it again.
 */
import { sqlRows, type Db } from "../db/client";
import type { StepSpec } from "../../engine/notebook";
import { budgetFailure } from "./chain";
import type { StoredStepOutput } from "./pool";

/** Known stops among steps[from..] by index, for this budget. */
export async function knownStops(db: Db, specs: readonly StepSpec[], hashes: readonly string[], from: number, budgetMs: number): Promise<Record<number, StoredStepOutput>> {
  const wanted = hashes.slice(from);
  if (wanted.length === 0) return {};
  const rows = await sqlRows<{ inputHash: string; budgetMs: number; error: string }>(db, `SELECT "inputHash", "budgetMs", "error" FROM "ComputeStop" WHERE "inputHash" = ANY($1::text[]) AND "budgetMs" >= $2`, [wanted, budgetMs]);
  const out: Record<number, StoredStepOutput> = {};
  for (const r of rows) {
    const i = hashes.indexOf(r.inputHash, from);
    if (i >= 0) out[i] = { ...budgetFailure(specs[i]!.kind, r.budgetMs), error: r.error } as StoredStepOutput;
  }
  return out;
}

/** Remember the steps stopped at `budgetMs` (the larger budget wins if one was recorded). */
export async function recordStops(db: Db, stops: { inputHash: string; kind: string; error: string }[], budgetMs: number): Promise<void> {
  if (stops.length === 0) return;
  await sqlRows(db, `INSERT INTO "ComputeStop" ("inputHash", "kind", "budgetMs", "error") SELECT * FROM unnest($1::text[], $2::text[], $3::int[], $4::text[])
    ON CONFLICT ("inputHash") DO UPDATE SET "budgetMs" = GREATEST("ComputeStop"."budgetMs", EXCLUDED."budgetMs"), "error" = EXCLUDED."error", "stoppedAt" = CURRENT_TIMESTAMP`,
    [stops.map((s) => s.inputHash), stops.map((s) => s.kind), stops.map(() => budgetMs), stops.map((s) => s.error)]);
}
