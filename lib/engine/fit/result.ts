/**
 * The fit result: plain, frozen, JSON-safe data (no NaN/Infinity — those become null).
 *
 * Standard errors: unweighted fits (no σ) scale the covariance (AᵀA)⁻¹ by the residual
 * variance s² = RSS/dof; weighted fits report the absolute (AᵀWA)⁻¹ unless `scaleErrors`
 * asks for scaling by χ²_red. AICc = n ln(χ²/n) + 2k + 2k(k+1)/(n−k−1), BIC = n ln(χ²/n) + k ln n
 * (k free parameters; the constant terms are dropped, so only differences between models
 * fitted to the same points mean anything). R² = 1 − χ²/Σw²(y − ȳ_w)² (weighted, centred).
 */

export interface FitParameter {
  readonly name: string;
  readonly value: number;
  readonly stdError: number | null;
  readonly unit: string;
  readonly initial: number | null;
  readonly fixed: boolean;
  readonly bounds: readonly [number | null, number | null];
  readonly atBound: boolean;
}

export interface NamedMatrix {
  readonly names: readonly string[];
  readonly matrix: readonly (readonly (number | null)[])[];
}

export interface FitResult {
  readonly model: string;
  readonly method: "linear-qr" | "levenberg-marquardt";
  readonly parameters: readonly FitParameter[];
  readonly covariance: NamedMatrix | null;
  readonly correlation: NamedMatrix | null;
  readonly nData: number;
  readonly nFree: number;
  readonly dof: number;
  readonly chiSquare: number | null;
  readonly reducedChiSquare: number | null;
  readonly rSquared: number | null;
  readonly aicc: number | null;
  readonly bic: number | null;
  /** y − f at each point (unweighted), in the data's order. */
  readonly residuals: readonly (number | null)[];
  readonly weighted: boolean;
  readonly errorsScaledByReducedChiSquare: boolean;
  readonly converged: boolean;
  readonly uncertaintiesEstimated: boolean;
  readonly message: string;
  readonly evaluations: number;
  readonly warnings: readonly string[];
}

export interface ResultInput {
  model: string;
  method: FitResult["method"];
  names: readonly string[];
  units: readonly string[];
  values: ArrayLike<number>;
  initial: readonly (number | null)[];
  fixed: readonly boolean[];
  atBound: readonly boolean[];
  lower: ArrayLike<number>;
  upper: ArrayLike<number>;
  /** Unscaled covariance over `covNames` (row-major), or null. */
  covariance: Float64Array | null;
  covNames: readonly string[];
  /** Number of parameters actually adjusted (free and not pinned on a bound). */
  nFree: number;
  residuals: ArrayLike<number>;
  y: ArrayLike<number>;
  w: ArrayLike<number> | null;
  scaleErrors: boolean;
  converged: boolean;
  message: string;
  evaluations: number;
  warnings: string[];
}

const safe = (v: number): number | null => (Number.isFinite(v) ? v : null);

function deepFreeze<T>(o: T): T {
  if (o && typeof o === "object") {
    Object.values(o as object).forEach((v) => deepFreeze(v));
    Object.freeze(o);
  }
  return o;
}

function goodness(input: ResultInput) {
  const { residuals, y, w } = input;
  const n = y.length;
  let chi = 0;
  let sw = 0;
  let swy = 0;
  for (let i = 0; i < n; i++) {
    const wi = w ? w[i] * w[i] : 1;
    chi += wi * residuals[i] * residuals[i];
    sw += wi;
    swy += wi * y[i];
  }
  const mean = swy / sw;
  let tss = 0;
  for (let i = 0; i < n; i++) tss += (w ? w[i] * w[i] : 1) * (y[i] - mean) ** 2;
  return { chi, tss };
}

/** Assemble the frozen FitResult from solver output. */
export function buildFitResult(input: ResultInput): FitResult {
  const nData = input.y.length;
  const k = input.nFree;
  const dof = nData - k;
  const { chi, tss } = goodness(input);
  const redChi = dof > 0 ? chi / dof : NaN;
  const scaled = !input.w || input.scaleErrors;
  const factor = scaled ? redChi : 1;
  const warnings = [...input.warnings];
  const cov = input.covariance && Number.isFinite(factor) ? Array.from(input.covariance, (c) => c * factor) : null;
  if (input.covariance && !cov) warnings.push("no degrees of freedom left: standard errors cannot be estimated");
  const nc = input.covNames.length;
  const seOf = (name: string): number | null => {
    const j = input.covNames.indexOf(name);
    return cov && j >= 0 && cov[j * nc + j] >= 0 ? safe(Math.sqrt(cov[j * nc + j])) : null;
  };
  const parameters: FitParameter[] = input.names.map((name, j) => ({
    name,
    value: input.values[j],
    stdError: input.fixed[j] || input.atBound[j] || !input.converged ? null : seOf(name),
    unit: input.units[j],
    initial: input.initial[j],
    fixed: input.fixed[j],
    bounds: [safe(input.lower[j]), safe(input.upper[j])] as const,
    atBound: input.atBound[j],
  }));
  const logTerm = nData * Math.log(chi / nData);
  const uncertaintiesEstimated = input.converged && cov !== null && parameters.every((p) => p.fixed || p.atBound || p.stdError !== null);
  return deepFreeze({
    model: input.model,
    method: input.method,
    parameters,
    covariance: cov && input.converged ? matrix(input.covNames, cov, (i, j) => cov[i * nc + j]) : null,
    correlation: cov && input.converged ? matrix(input.covNames, cov, (i, j) => cov[i * nc + j] / Math.sqrt(cov[i * nc + i] * cov[j * nc + j])) : null,
    nData,
    nFree: k,
    dof,
    chiSquare: safe(chi),
    reducedChiSquare: safe(redChi),
    rSquared: tss > 0 ? safe(1 - chi / tss) : null,
    aicc: nData - k - 1 > 0 ? safe(logTerm + 2 * k + (2 * k * (k + 1)) / (nData - k - 1)) : null,
    bic: safe(logTerm + k * Math.log(nData)),
    residuals: Array.from(input.residuals, safe),
    weighted: input.w !== null,
    errorsScaledByReducedChiSquare: scaled && cov !== null,
    converged: input.converged,
    uncertaintiesEstimated,
    message: input.message,
    evaluations: input.evaluations,
    warnings,
  });
}

function matrix(names: readonly string[], _cov: number[], at: (i: number, j: number) => number): NamedMatrix {
  return { names: [...names], matrix: names.map((_, i) => names.map((__, j) => safe(at(i, j)))) };
}
