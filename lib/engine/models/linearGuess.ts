/**
 * Rough starting values for the γT + βT³ part: a straight line through C/T vs T² on the
 * lowest and highest thirds of the data (no solver involved; only used to start LM).
 */
import type { HeatCapacityData } from "./types";

/** { gamma, beta } from the data, β floored at a small positive value. */
export function guessGammaBeta(data: HeatCapacityData): { gamma: number; beta: number } {
  const n = data.temperatureK.length;
  const idx = Array.from({ length: n }, (_, i) => i).sort((a, b) => data.temperatureK[a] - data.temperatureK[b]);
  const third = Math.max(1, Math.floor(n / 3));
  const mean = (ids: number[], f: (i: number) => number) => ids.reduce((s, i) => s + f(i), 0) / ids.length;
  const low = idx.slice(0, third);
  const high = idx.slice(n - third);
  const x = (i: number) => data.temperatureK[i] ** 2;
  const y = (i: number) => data.heatCapacity[i] / data.temperatureK[i];
  const dx = mean(high, x) - mean(low, x);
  const beta = dx > 0 ? (mean(high, y) - mean(low, y)) / dx : 0;
  const gamma = mean(low, y) - beta * mean(low, x);
  return { gamma: Number.isFinite(gamma) ? gamma : 1e-3, beta: Number.isFinite(beta) && beta > 0 ? beta : 1e-5 };
}
