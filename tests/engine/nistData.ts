/** Loader for the NIST StRD reference files in ../shared/reference/nist-strd (used as published). */
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

const DIR = new URL("../../../shared/reference/nist-strd/", import.meta.url);

export function loadNist(name: string): NistDataset {
  return JSON.parse(readFileSync(new URL(`${name}.json`, DIR), "utf8")) as NistDataset;
}

/** LRE with an absolute floor for a certified value of exactly zero (Wampler1's standard errors). */
export function lreOrAbs(actual: number, certified: number, absTol: number): number {
  if (certified === 0) return Math.abs(actual) <= absTol ? 15 : -Math.log10(Math.abs(actual));
  if (actual === certified) return 15;
  return Math.min(15, -Math.log10(Math.abs(actual - certified) / Math.abs(certified)));
}
