/**
 * When no candidate describes the data: where do they depart from C = γT + βT³, and which
 * term is likely missing? γT + βT³ is fitted to the core of the data (the middle half in
 * ln T) and extrapolated. In the low part (below the core) and the high part (above it) the
 * mean weighted residual z̄ is judged against its own standard error s/√k (s² = χ²_red of the
 * core, at least 1 with known σ); |z̄|√k/s > 5 counts as a departure:
 *   low, above the line  → an upturn: a nuclear (A/T²) or Schottky term;
 *   low, below the line  → a downturn: a gap opening (superconducting fraction) or an
 *                          impurity term of the other sign;
 *   high, above the line → extra curvature: a T⁵/T⁷ term, an Einstein (optical) mode or the
 *                          full Debye function;
 *   high, below the line → the lattice falls below T³: the full Debye function, or δT⁵ < 0;
 *   both ends below      → the core sits on a bump: an Einstein (optical) mode or a Schottky
 *                          peak inside the range.
 * The thresholds are our choice (common practice for "clearly significant").
 */
import { solveLinearLeastSquares } from "../linalg/lstsq";
import type { SortedSeries } from "./linearCells";

export interface Departure {
  readonly part: "low" | "high";
  readonly sign: 1 | -1;
  readonly significance: number;
  readonly fromK: number;
  readonly toK: number;
}

const SIGNIFICANT = 5;

/** Departures of the data from γT + βT³ fitted to their core (see the module comment). */
export function departures(s: SortedSeries): Departure[] {
  const m = s.T.length;
  if (m < 12) return [];
  const lo = s.T[0];
  const rho = s.T[m - 1] / lo;
  const a = lo * rho ** 0.25;
  const b = lo * rho ** 0.75;
  const core: number[] = [];
  for (let i = 0; i < m; i++) if (s.T[i] >= a && s.T[i] <= b) core.push(i);
  if (core.length < 6) return [];
  const k = core.length;
  const design = new Float64Array(2 * k);
  core.forEach((i, r) => {
    design[r] = s.T[i];
    design[k + r] = s.T[i] ** 3;
  });
  const fit = solveLinearLeastSquares(design, k, 2, core.map((i) => s.C[i]), s.S ? { sigma: core.map((i) => s.S![i]) } : {});
  if (!fit.fullRank) return [];
  const [g, bt] = fit.coefficients;
  const red = fit.chiSquare / (k - 2);
  const scatter = Math.sqrt(s.S ? Math.max(1, red) : red);
  const z = (i: number) => (s.C[i] - g * s.T[i] - bt * s.T[i] ** 3) / (s.S ? s.S[i] : 1);
  const out: Departure[] = [];
  const judge = (part: "low" | "high", idx: number[]) => {
    if (idx.length < 3 || !(scatter > 0)) return;
    const mean = idx.reduce((acc, i) => acc + z(i), 0) / idx.length;
    const significance = (Math.abs(mean) * Math.sqrt(idx.length)) / scatter;
    if (significance > SIGNIFICANT) out.push({ part, sign: mean > 0 ? 1 : -1, significance, fromK: s.T[idx[0]], toK: s.T[idx[idx.length - 1]] });
  };
  judge("low", Array.from({ length: m }, (_, i) => i).filter((i) => s.T[i] < a));
  judge("high", Array.from({ length: m }, (_, i) => i).filter((i) => s.T[i] > b));
  return out;
}

const k3 = (v: number) => Number(v.toPrecision(3));

/** The likely missing term in words, or null when the data do not depart from γT + βT³ at either end. */
export function missingTermText(list: readonly Departure[]): string | null {
  const low = list.find((d) => d.part === "low");
  const high = list.find((d) => d.part === "high");
  if (low && high && low.sign < 0 && high.sign < 0) {
    return `a bump between ${k3(low.toK)} and ${k3(high.fromK)} K (the data at both ends fall below the γT + βT³ of the middle): an Einstein (optical) mode or a Schottky peak inside the range`;
  }
  const parts = list.map((d) => {
    const where = `${k3(d.fromK)}–${k3(d.toK)} K`;
    if (d.part === "low") return d.sign > 0
      ? `an upturn at the lowest temperatures (${where}): a nuclear (A/T²) or Schottky term of another form than the candidates'`
      : `a downturn at the lowest temperatures (${where}): a gap opening (e.g. a superconducting fraction)`;
    return d.sign > 0
      ? `extra curvature at high temperature (${where}): a T⁵/T⁷ term, an Einstein (optical) mode or the full Debye function`
      : `the lattice falls below T³ at high temperature (${where}): the full Debye function`;
  });
  return parts.length ? parts.join("; and ") : null;
}
