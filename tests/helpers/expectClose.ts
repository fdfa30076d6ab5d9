import { expect } from "vitest";

/**
 * Assert |actual − expected| ≤ max(abs, rel·|expected|). With neither given, rel = 1e-12.
 * The message names both numbers and the tolerance that failed.
 */
export function expectClose(
  actual: number,
  expected: number,
  tol: { rel?: number; abs?: number } = {},
  label = "",
): void {
  const rel = tol.rel ?? (tol.abs === undefined ? 1e-12 : 0);
  const abs = tol.abs ?? 0;
  const allowed = Math.max(abs, rel * Math.abs(expected));
  const diff = Math.abs(actual - expected);
  expect(
    Number.isFinite(actual) && diff <= allowed,
    `${label ? label + ": " : ""}${actual} vs ${expected} (|Δ| = ${diff}, allowed ${allowed})`,
  ).toBe(true);
}

/**
 * Log relative error, the number of correct significant digits as NIST's StRD
 * papers count them: LRE = −log10(|actual − certified| / |certified|), capped at 15.
 */
export function logRelativeError(actual: number, certified: number): number {
  if (actual === certified) return 15;
  const denom = certified === 0 ? 1 : Math.abs(certified);
  return Math.min(15, -Math.log10(Math.abs(actual - certified) / denom));
}
