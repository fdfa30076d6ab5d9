/**
 * Comparing two JSON-safe values: exactly (canonical JSON equal), or with every number within a
 * relative tolerance |a − b| ≤ rel · max(|a|, |b|) and everything else (strings, booleans, nulls,
 * keys, array lengths) equal. Reports the largest relative difference and the first path that
 * does not match.
 */
import { canonicalJson } from "../../engine/canonical";

export interface Comparison {
  equal: boolean;
  exact: boolean;
  maxRelDiff: number;
  /** JSON path of the first mismatch beyond tolerance, e.g. "result.fit.parameters[0].value". */
  firstDifference: string | null;
}

function relDiff(a: number, b: number): number {
  if (a === b) return 0;
  return Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b));
}

function walk(a: unknown, b: unknown, path: string, rel: number, acc: { max: number; first: string | null }): void {
  if (typeof a === "number" && typeof b === "number") {
    const d = relDiff(a, b);
    if (d > acc.max) acc.max = d;
    if (d > rel && acc.first === null) acc.first = path || "(value)";
    return;
  }
  if (Array.isArray(a) && Array.isArray(b)) {
    if (a.length !== b.length) { acc.first ??= `${path || "(value)"} (length ${a.length} vs ${b.length})`; acc.max = Infinity; return; }
    a.forEach((v, i) => walk(v, b[i], `${path}[${i}]`, rel, acc));
    return;
  }
  if (a && b && typeof a === "object" && typeof b === "object" && !Array.isArray(a) && !Array.isArray(b)) {
    const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
    for (const k of [...keys].sort()) {
      const av = (a as Record<string, unknown>)[k], bv = (b as Record<string, unknown>)[k];
      if (av === undefined || bv === undefined) { acc.first ??= `${path ? path + "." : ""}${k} (present on one side only)`; acc.max = Infinity; continue; }
      walk(av, bv, path ? `${path}.${k}` : k, rel, acc);
    }
    return;
  }
  if (a !== b) { acc.first ??= path || "(value)"; acc.max = Infinity; }
}

/** Compare `a` with `b`; `rel` = 0 asks for exact equality. */
export function compareJson(a: unknown, b: unknown, rel = 0): Comparison {
  const exact = canonicalJson(a) === canonicalJson(b);
  if (exact) return { equal: true, exact: true, maxRelDiff: 0, firstDifference: null };
  const acc = { max: 0, first: null as string | null };
  walk(a, b, "", rel, acc);
  return { equal: rel > 0 && acc.first === null, exact: false, maxRelDiff: acc.max, firstDifference: acc.first ?? "(formatting only)" };
}
