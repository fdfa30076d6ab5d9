/**
 * Does a model describe the data in a window? Three tests on the window's residuals in
 * temperature order, each at the level α (default 0.01):
 *   χ²      (only with known σ) the upper tail probability P(χ²_ν ≥ χ²) with ν = k − p must
 *           be ≥ α: χ²_red consistent with its degrees of freedom. A χ² far below ν (σ too
 *           large) is not a failure of the model and is not tested.
 *   runs    Wald–Wolfowitz runs test on the residual signs (runsTest.ts): the one-sided
 *           probability P(Z ≤ z) = ½ Q(½, z²/2) (z < 0; erfc as an incomplete gamma) must be
 *           ≥ α (too few runs means the residuals have structure; α = 0.01: z ≥ −2.326).
 *   trend   the k residuals in units of their own scatter s (s² = Σ z²/(k − p), z = weighted
 *           residual) are cut into B = min(8, max(3, ⌊k/12⌋)) consecutive bins of equal count;
 *           the statistic Σ_b k_b z̄_b² / s² is referred to χ²(B): probability ≥ α. A smooth
 *           missing term leaves residuals that share a sign over a stretch of temperature,
 *           which moves the bin means long before it moves χ². Using s as the scale makes
 *           the test independent of how well σ is known, so it serves unweighted fits too.
 * Without σ only runs and trend apply (the residual-based criterion of unweighted fits).
 * The χ²(B) reference ignores the p constraints the fit puts on the residuals, which makes
 * the trend test slightly conservative (it rejects a little less often than α).
 */
import { runsTest } from "../fit/runsTest";
import { chiSquareSurvival, upperRegularizedGamma } from "./tail";

export const DEFAULT_TEST_LEVEL = 0.01;
/** P(Z ≤ z) of the standard normal distribution for z ≤ 0 (erfc(x) = Q(½, x²)). */
function lowerNormalTail(z: number): number {
  return z >= 0 ? 1 : 0.5 * upperRegularizedGamma(0.5, (z * z) / 2);
}

export interface WindowTests {
  /** P(χ²_ν ≥ χ²); null without σ. */
  readonly chiSquareProbability: number | null;
  /** Runs-test z; null when it does not apply (fewer than 10 nonzero residuals or one sign). */
  readonly runsZ: number | null;
  /** Probability of the binned-residual statistic under "no trend"; null when k < 9. */
  readonly trendProbability: number | null;
  readonly acceptable: boolean;
  /** Names of the failed tests: "chi-square", "runs", "trend". */
  readonly failed: readonly string[];
}

function trendProbability(z: ArrayLike<number>, p: number): number | null {
  const k = z.length;
  if (k < 9 || k - p < 1) return null;
  let ss = 0;
  for (let i = 0; i < k; i++) ss += z[i] * z[i];
  const s2 = ss / (k - p);
  if (!(s2 > 0)) return 1;
  const bins = Math.min(8, Math.max(3, Math.floor(k / 12)));
  let stat = 0;
  for (let b = 0; b < bins; b++) {
    const lo = Math.floor((b * k) / bins);
    const hi = Math.floor(((b + 1) * k) / bins);
    let sum = 0;
    for (let i = lo; i < hi; i++) sum += z[i];
    stat += (sum * sum) / (hi - lo);
  }
  return chiSquareSurvival(stat / s2, bins);
}

/**
 * The tests of one window: `z` the weighted residuals (y − f)/σ (or y − f without σ) in
 * temperature order, `p` the number of free parameters, `chiSquare` Σ z².
 */
export function testWindow(z: ArrayLike<number>, p: number, chiSquare: number, sigmaKnown: boolean, level = DEFAULT_TEST_LEVEL): WindowTests {
  const dof = z.length - p;
  const chiP = sigmaKnown && dof > 0 ? chiSquareSurvival(chiSquare, dof) : null;
  const runs = runsTest(z);
  const trend = trendProbability(z, p);
  const failed: string[] = [];
  if (chiP !== null && !(chiP >= level)) failed.push("chi-square");
  if (runs && !(lowerNormalTail(runs.z) >= level)) failed.push("runs");
  if (trend !== null && !(trend >= level)) failed.push("trend");
  if (dof < 1) failed.push("dof");
  return { chiSquareProbability: chiP, runsZ: runs ? runs.z : null, trendProbability: trend, acceptable: failed.length === 0, failed };
}
