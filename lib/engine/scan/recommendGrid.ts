/**
 * The window grid of the recommendation (recommend.ts): `size` lower edges spaced evenly in
 * ln T from the lowest temperature up to the geometric middle of the data (√(T_lo·T_hi)),
 * and `size` upper edges evenly in ln T from T_lo·(T_hi/T_lo)^0.3 up to the highest
 * temperature, each snapped to the nearest data temperature. A window [T_min, T_max] is kept
 * when T_max ≥ spanRatio·T_min (default 2: below that γT and βT³ are hard to tell apart)
 * and it holds at least minPoints points. Every candidate model is fitted on the same
 * windows, so AICc values of one window compare models on common data.
 */
import { lowerIndex, upperIndex } from "./grid";
import type { WindowSpan } from "./updating";

export interface RecommendWindow extends WindowSpan {
  readonly tMinK: number;
  readonly tMaxK: number;
}

function nearest(sortedT: Float64Array, t: number): number {
  const i = lowerIndex(sortedT, t);
  if (i >= sortedT.length) return sortedT[sortedT.length - 1];
  if (i === 0) return sortedT[0];
  return t - sortedT[i - 1] < sortedT[i] - t ? sortedT[i - 1] : sortedT[i];
}

/** Data temperatures nearest to `size` points spaced evenly in ln T over [a, b] (unique, ascending). */
export function logEdges(sortedT: Float64Array, a: number, b: number, size: number): number[] {
  const out = new Set<number>();
  for (let k = 0; k < size; k++) out.add(nearest(sortedT, size === 1 ? a : a * (b / a) ** (k / (size - 1))));
  return [...out].sort((x, y) => x - y);
}

/** The windows of the grid (see the module comment), ordered by T_min then T_max. */
export function recommendationWindows(
  sortedT: Float64Array,
  options: { readonly size: number; readonly minPoints: number; readonly spanRatio: number; readonly tMinGridK?: readonly number[]; readonly tMaxGridK?: readonly number[] },
): RecommendWindow[] {
  const m = sortedT.length;
  if (m === 0) return [];
  const lo = sortedT[0];
  const hi = sortedT[m - 1];
  if (!(lo > 0)) return [];
  const lower = options.tMinGridK ? [...options.tMinGridK].sort((x, y) => x - y) : logEdges(sortedT, lo, Math.sqrt(lo * hi), options.size);
  const upper = options.tMaxGridK ? [...options.tMaxGridK].sort((x, y) => x - y) : logEdges(sortedT, lo * (hi / lo) ** 0.3, hi, options.size);
  const out: RecommendWindow[] = [];
  for (const tMinK of lower) {
    for (const tMaxK of upper) {
      if (tMaxK < options.spanRatio * tMinK) continue;
      const i = lowerIndex(sortedT, tMinK);
      const j = upperIndex(sortedT, tMaxK);
      if (j - i + 1 >= options.minPoints) out.push({ lo: i, hi: j, tMinK, tMaxK });
    }
  }
  return out;
}
