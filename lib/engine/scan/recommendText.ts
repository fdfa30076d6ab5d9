/**
 * The words of a recommendation (recommend.ts): the rules applied (`method`) and what came
 * of them (`reason`), with γ and β as value(stat)(syst) in mJ mol⁻¹ K⁻² and mJ mol⁻¹ K⁻⁴.
 */
import { MIN_ACCEPTABLE, type CandidateScan, type Recommendation } from "./recommend";
import type { SortedSeries } from "./linearCells";
import type { RecommendWindow } from "./recommendGrid";
import { formatStatSyst } from "./statSyst";

const k3 = (v: number) => String(Number(v.toPrecision(3)));
const pct = (level: number) => `${Number((level * 100).toPrecision(3))} %`;

/** The rules in words (the same for every outcome). */
export function methodText(weighting: "sigma" | "none", level: number): string {
  const tests = weighting === "sigma"
    ? `its χ² tail probability is at least ${pct(level)}, the runs test of the residual signs and a test for a trend in the binned residuals pass at ${pct(level)}`
    : `the runs test of the residual signs and a test for a trend in the binned residuals (scaled by the residual scatter, as σ is unknown) pass at ${pct(level)}`;
  return [
    `Fit variable C(T), ${weighting === "sigma" ? "weighted by 1/σ²" : "unweighted (no σ: standard errors from the residual scatter)"}.`,
    `Every candidate is fitted on every window of one grid; a fit is acceptable when ${tests}.`,
    `The model is the one with the lowest AICc, among those acceptable, on the acceptable window with the most points (common data); it must be acceptable on at least ${MIN_ACCEPTABLE} windows.`,
    "The window is that model's acceptable window with the smallest statistical σ(γ).",
    "Systematic σ: the 1/σ²-weighted root-mean-square deviation of γ (β) over all acceptable fits of all candidates from the recommended value.",
  ].join(" ");
}

type Chosen = Omit<Recommendation, "method" | "reason">;

export function describeRecommendation(r: Chosen, level: number): { method: string; reason: string } {
  const next = r.comparison.find((c, k) => k > 0 && c.acceptable);
  const cw = r.commonWindow!;
  const w = r.window!;
  const g = formatStatSyst(r.gamma! * 1e3, r.gammaStdError! * 1e3, r.gammaSystematicError! * 1e3);
  const b = r.beta !== null && r.betaStdError !== null ? `, β = ${formatStatSyst(r.beta * 1e3, r.betaStdError * 1e3, (r.betaSystematicError ?? 0) * 1e3)} mJ mol⁻¹ K⁻⁴` : "";
  const quality = r.reducedChiSquare !== null ? `χ²_red = ${r.reducedChiSquare.toFixed(2)}` : `residual standard deviation ${k3(r.residualStdDev! * 1e3)} mJ mol⁻¹ K⁻¹`;
  const reason = [
    `${r.modelTitle}: lowest AICc on the common window ${k3(cw.tMinK)}–${k3(cw.tMaxK)} K (${cw.nPoints} points)${next ? `, ΔAICc = ${next.deltaAicc!.toFixed(1)} to ${next.title}` : ", the only candidate acceptable there"}.`,
    `Window ${k3(w.tMinK)}–${k3(w.tMaxK)} K (${w.nPoints} points, ${quality}): its acceptable window with the smallest statistical σ(γ).`,
    `${r.acceptableFits} of ${r.totalFits} (model, window) fits acceptable; the systematic σ is the 1/σ²-weighted root-mean-square deviation of γ (β) over them from the recommended value.`,
    `γ = ${g} mJ mol⁻¹ K⁻²${b} (stat)(syst).`,
  ].join(" ");
  return { method: methodText(r.weighting, level), reason };
}

export function describeRefusal(
  s: SortedSeries, windows: readonly RecommendWindow[], candidates: readonly CandidateScan[], level: number, missingTerm: string | null,
  tooFew: { title: string; count: number } | null,
): { method: string; reason: string } {
  const weighting = s.S ? "sigma" : "none";
  const method = methodText(weighting, level);
  if (windows.length === 0) {
    return { method, reason: `Not recommended: no window of the grid spans a factor 2 in T with enough points (data ${k3(s.T[0])}–${k3(s.T[s.T.length - 1])} K, ${s.T.length} points).` };
  }
  const counts = new Map<string, number>();
  let bestRed = Infinity;
  for (const c of candidates.flatMap((x) => x.cells)) {
    for (const f of c.tests?.failed ?? []) counts.set(f, (counts.get(f) ?? 0) + 1);
    if (c.reducedChiSquare !== null) bestRed = Math.min(bestRed, c.reducedChiSquare);
  }
  const words: Record<string, string> = { "chi-square": "χ²", runs: "runs", trend: "trend", dof: "too few points" };
  const failed = [...counts.entries()].sort((a, b) => b[1] - a[1]).map(([k, n]) => `${words[k] ?? k} ${n}×`).join(", ");
  const scatter = s.S && Number.isFinite(bestRed) && bestRed > 1.5 && !missingTerm ? ` The smallest χ²_red of any fit is ${bestRed.toFixed(2)}: the σ of the data may be too small.` : "";
  const head = tooFew
    ? `Not recommended: the candidate chosen by AICc on the widest acceptable window, ${tooFew.title}, describes the data in only ${tooFew.count} of the ${windows.length} windows (at least ${MIN_ACCEPTABLE} are needed to judge how γ depends on the window)`
    : `Not recommended: no candidate (${candidates.map((c) => c.title).join("; ")}) describes the data in any of the ${windows.length} windows`;
  return {
    method,
    reason: `${head} (tests failed: ${failed || "none counted"}).`
      + (missingTerm ? ` Likely missing: ${missingTerm}.` : "") + scatter,
  };
}
