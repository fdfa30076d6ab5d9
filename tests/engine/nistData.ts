/** Loader for the NIST StRD reference files kept in tests/fixtures/nist-strd (used as published; README there). */
import { readFileSync } from "node:fs";

export interface NistDataset {
  name: string;
  kind: "linear" | "nonlinear";
  difficulty: string;
  model: string;
  observations: number;
  x?: number[];
  X?: number[][];
  y: number[];
  certified: {
    parameters: { name: string; value: number; stdError: number }[];
    residualSD: number;
    residualSumOfSquares: number;
    residualDegreesOfFreedom: number;
    rSquared?: number;
  };
  starts?: number[][];
}

const DIR = new URL("../fixtures/nist-strd/", import.meta.url);

export function loadNist(name: string): NistDataset {
  return JSON.parse(readFileSync(new URL(`${name}.json`, DIR), "utf8")) as NistDataset;
}

/** LRE with an absolute floor for a certified value of exactly zero (Wampler1's standard errors). */
export function lreOrAbs(actual: number, certified: number, absTol: number): number {
  if (certified === 0) return Math.abs(actual) <= absTol ? 15 : -Math.log10(Math.abs(actual));
  if (actual === certified) return 15;
  return Math.min(15, -Math.log10(Math.abs(actual - certified) / Math.abs(certified)));
}

/**
 * Column-major design of a NIST linear dataset as its model text gives it: Longley with an
 * intercept and its six predictors, NoInt1/2 through the origin, the others polynomials in x.
 */
export function nistLinearDesign(name: string): { a: Float64Array; n: number } {
  const d = loadNist(name);
  const m = d.y.length;
  if (name === "Longley") {
    const a = new Float64Array(m * 7);
    for (let i = 0; i < m; i++) {
      a[i] = 1;
      for (let j = 0; j < 6; j++) a[(j + 1) * m + i] = d.X![i]![j]!;
    }
    return { a, n: 7 };
  }
  if (name.startsWith("NoInt")) return { a: Float64Array.from(d.x!), n: 1 };
  const degree: Record<string, number> = { Norris: 1, Pontius: 2, Filip: 10, Wampler1: 5, Wampler2: 5, Wampler3: 5, Wampler4: 5, Wampler5: 5 };
  const n = degree[name]! + 1;
  const a = new Float64Array(m * n);
  d.x!.forEach((x, i) => {
    let p = 1;
    for (let j = 0; j < n; j++, p *= x) a[j * m + i] = p;
  });
  return { a, n };
}
