/**
 * Invented C(T) data sets with known truth for the recommendation tests (test data only):
 * C = γT + βT³ (β from Θ_D, r = 1) plus one extra term, σ a fixed fraction of C, points
 * spaced evenly in ln T, seeded Gaussian noise.
 */
import { GAS_CONSTANT_J_PER_MOL_K as R } from "../../lib/engine/constants";
import { schottkyHeatCapacity, einsteinHeatCapacity } from "../../lib/engine/models";
import { seededNormal } from "./uncertainty.random";

export type Extra =
  | { kind: "none" }
  | { kind: "schottky"; n: number; gapK: number }
  | { kind: "t5"; delta: number }
  | { kind: "nuclear"; A: number }
  | { kind: "einstein"; nE: number; thetaEK: number };

export interface Truth {
  readonly gamma: number;
  readonly thetaDK: number;
  readonly extra: Extra;
  readonly tLoK: number;
  readonly tHiK: number;
  readonly points: number;
  /** σ/C. */
  readonly relSigma: number;
}

/** β [J mol⁻¹ K⁻⁴] of a Debye solid with Θ_D (r = 1): 12π⁴R/(5Θ³). */
export const betaOf = (thetaDK: number) => (12 * Math.PI ** 4 * R) / (5 * thetaDK ** 3);

export function extraTerm(e: Extra, t: number): number {
  switch (e.kind) {
    case "none": return 0;
    case "schottky": return schottkyHeatCapacity(t, e.gapK, 1, e.n);
    case "t5": return e.delta * t ** 5;
    case "nuclear": return e.A / (t * t);
    case "einstein": return einsteinHeatCapacity(t, e.thetaEK, e.nE);
  }
}

export function makeData(truth: Truth, seed: number, withSigma = true) {
  const noise = seededNormal(seed);
  const { tLoK: a, tHiK: b, points: m } = truth;
  const beta = betaOf(truth.thetaDK);
  const T = Array.from({ length: m }, (_, i) => a * (b / a) ** (i / (m - 1)));
  const clean = T.map((t) => truth.gamma * t + beta * t ** 3 + extraTerm(truth.extra, t));
  const sigma = clean.map((c) => truth.relSigma * c);
  const C = clean.map((c, i) => c + sigma[i] * noise());
  return { temperatureK: T, heatCapacity: C, ...(withSigma ? { sigma } : {}) };
}
