/**
 * subtractAddenda: C_net(T) = C_total(T) − C_addenda(T) on the sample temperatures.
 */
import { InputError } from "../errors";
import { interpolateLinear, sortCurve } from "./interpolate";
import { evaluateSmoothing, fitSmoothing } from "./smooth";
import type { PolynomialSmoothing, SmoothingAbscissa } from "./smooth";
import type { Provenance, SampleCurve } from "./types";
import { checkCurve } from "./validate";

export interface AddendaOptions {
  method: "linear" | "smooth";
  /** Polynomial degree for "smooth"; chosen by AICc when omitted. */
  smoothingDegree?: number;
  /** Abscissa of the smoothing polynomial; "auto" = ln T when T_max/T_min > 10, else T. */
  smoothingIn?: SmoothingAbscissa | "auto";
  /** Sample points outside the addenda's T range: "refuse" (throw, default) or "flag" (leave out, list, warn). */
  outsideRange?: "refuse" | "flag";
  /** Warn where C_addenda / C_total exceeds this (default 0.5, common practice). */
  addendaFractionWarning?: number;
}

export interface AddendaResult {
  temperatureK: number[];
  heatCapacityJPerK: number[];
  /** σ_net = √(σ_sample² + σ_addenda²); present when the sample has σ. */
  sigma?: number[];
  addendaJPerK: number[];
  addendaSigma?: number[];
  /** Index into the sample arrays of each output point. */
  sourceIndex: number[];
  excluded: { index: number; temperatureK: number; reason: string }[];
  warnings: string[];
  provenance: Provenance;
  smoothing?: PolynomialSmoothing;
}

const fmtK = (t: number) => `${Number(t.toPrecision(4))} K`;

/** Contiguous runs (in T order) of flagged points, as "a–b K (n points)". */
function runs(t: number[], flagged: boolean[]): string[] {
  const order = t.map((_, i) => i).sort((a, b) => t[a] - t[b]);
  const out: string[] = [];
  for (let k = 0; k < order.length; k++) {
    if (!flagged[order[k]]) continue;
    let end = k;
    while (end + 1 < order.length && flagged[order[end + 1]]) end++;
    const n = end - k + 1;
    out.push(n === 1 ? `${fmtK(t[order[k]])} (1 point)` : `${fmtK(t[order[k]])}–${fmtK(t[order[end]])} (${n} points)`);
    k = end;
  }
  return out;
}

/**
 * Subtract an addenda (empty platform + grease) curve from a sample's total heat capacity.
 * "linear": piecewise-linear interpolation in T between addenda points (σ by linear propagation);
 * "smooth": a weighted least-squares polynomial in T or ln T through the addenda (see smooth.ts).
 * σ_net² = σ_sample² + σ_addenda(T)². Sample points outside [T_min, T_max] of the addenda are never
 * extrapolated: they are refused (InputError naming the first and the count) or, with
 * outsideRange "flag", left out and listed in `excluded` with a warning. Warnings name the T ranges
 * where the addenda exceed `addendaFractionWarning` of the total, and where C_net ≤ 0.
 * Units: T in K, C and σ in J/K. Throws InputError on inconsistent or unphysical input.
 */
export function subtractAddenda(sample: SampleCurve, addenda: SampleCurve, options: AddendaOptions): AddendaResult {
  checkCurve(sample, "sample");
  checkCurve(addenda, "addenda");
  if (options?.method !== "linear" && options?.method !== "smooth") throw new InputError(`invalid method: ${JSON.stringify(options?.method)} (linear or smooth)`, { field: "method" });
  const sorted = sortCurve(addenda);
  const tMin = sorted.t[0], tMax = sorted.t[sorted.t.length - 1];
  const inRange = sample.temperatureK.map((t) => t >= tMin && t <= tMax);
  const outside = inRange.filter((x) => !x).length;
  const mode = options.outsideRange ?? "refuse";
  if (outside > 0 && mode === "refuse") {
    const first = inRange.indexOf(false);
    throw new InputError(`sample point at ${fmtK(sample.temperatureK[first])} is outside the addenda range ${fmtK(tMin)}–${fmtK(tMax)}` +
      `${outside > 1 ? ` (${outside} points outside in all)` : ""}; extend the addenda or use outsideRange "flag"`, { field: "sample.temperatureK", line: first + 1 });
  }
  const abscissa = options.smoothingIn === "T" || options.smoothingIn === "logT" ? options.smoothingIn : tMax / tMin > 10 ? "logT" : "T";
  const smoothing = options.method === "smooth" ? fitSmoothing(sorted, abscissa, options.smoothingDegree) : undefined;
  const evaluate = (t: number) => (smoothing ? evaluateSmoothing(smoothing, t) : interpolateLinear(sorted, t));
  const hasAddendaSigma = smoothing !== undefined || sorted.s !== null;
  const r: AddendaResult = { temperatureK: [], heatCapacityJPerK: [], addendaJPerK: [], sourceIndex: [], excluded: [], warnings: [], provenance: { step: "addenda-subtraction", method: options.method, parameters: {} } };
  if (sample.sigma) r.sigma = [];
  if (hasAddendaSigma) r.addendaSigma = [];
  const tooLarge: boolean[] = [], nonPositive: boolean[] = [];
  const limit = options.addendaFractionWarning ?? 0.5;
  sample.temperatureK.forEach((t, i) => {
    if (!inRange[i]) {
      r.excluded.push({ index: i, temperatureK: t, reason: `outside the addenda range ${fmtK(tMin)}–${fmtK(tMax)}` });
      return;
    }
    const a = evaluate(t);
    const total = sample.heatCapacityJPerK[i];
    const net = total - a.value;
    r.temperatureK.push(t);
    r.heatCapacityJPerK.push(net);
    r.addendaJPerK.push(a.value);
    r.sourceIndex.push(i);
    if (r.addendaSigma) r.addendaSigma.push(a.sigma ?? 0);
    if (r.sigma && sample.sigma) r.sigma.push(Math.sqrt(sample.sigma[i] ** 2 + (a.sigma ?? 0) ** 2));
    tooLarge.push(a.value > limit * Math.abs(total));
    nonPositive.push(net <= 0);
  });
  addWarnings(r, tooLarge, nonPositive, limit, outside, tMin, tMax, Boolean(sample.sigma), hasAddendaSigma);
  r.provenance.parameters = {
    addendaPoints: addenda.temperatureK.length, addendaDistinctTemperatures: sorted.t.length, addendaRangeK: [tMin, tMax],
    outsideRange: mode, pointsUsed: r.temperatureK.length, pointsExcluded: r.excluded.length, addendaFractionWarning: limit,
    ...(smoothing ? { smoothingDegree: smoothing.degree, smoothingIn: smoothing.abscissa, degreeChosen: options.smoothingDegree === undefined ? "AICc" : "given",
      chiSquareReduced: smoothing.chiSquareReduced, sigmaEstimated: smoothing.sigmaEstimated } : {}),
  };
  if (smoothing) r.smoothing = smoothing;
  return r;
}

function addWarnings(
  r: AddendaResult, tooLarge: boolean[], nonPositive: boolean[], limit: number, outside: number,
  tMin: number, tMax: number, sampleSigma: boolean, addendaSigma: boolean,
): void {
  const large = runs(r.temperatureK, tooLarge);
  if (large.length) r.warnings.push(`addenda exceed ${Math.round(limit * 100)} % of the total heat capacity at ${large.join(", ")}: the net result there depends strongly on the addenda`);
  const negative = runs(r.temperatureK, nonPositive);
  if (negative.length) r.warnings.push(`net heat capacity is zero or negative at ${negative.join(", ")}`);
  if (outside) r.warnings.push(`${outside} sample point${outside > 1 ? "s" : ""} outside the addenda range ${fmtK(tMin)}–${fmtK(tMax)} left out (not extrapolated)`);
  if (!sampleSigma && addendaSigma) r.warnings.push("the sample has no σ: net σ not computed (addenda σ is in addendaSigma)");
}
