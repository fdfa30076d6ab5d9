/**
 * Quadrature used for thermodynamic integrals: the cumulative trapezoid on tabulated data
 * (with the variance of each partial integral for independent point errors) and composite
 * Simpson on a smooth function.
 */
import { invalid } from "../errors";

/**
 * Check tabulated x (strictly increasing, finite) and y (same length, finite); ≥ 2 points.
 * Throws InputError naming the array and index.
 */
export function checkTable(x: readonly number[], y: readonly number[], xName: string, yName: string): void {
  if (x.length !== y.length) throw invalid(yName, `${y.length} values`, `expected ${x.length} (one per ${xName})`);
  if (x.length < 2) throw invalid(xName, `${x.length} points`, "need at least 2");
  for (let i = 0; i < x.length; i++) {
    if (!Number.isFinite(x[i])) throw invalid(`${xName}[${i}]`, x[i], "not a finite number");
    if (!Number.isFinite(y[i])) throw invalid(`${yName}[${i}]`, y[i], "not a finite number");
    if (i > 0 && x[i] <= x[i - 1]) throw invalid(`${xName}[${i}]`, x[i], "values must be strictly increasing");
  }
}

/**
 * Cumulative trapezoid I_k = ∫_{x_0}^{x_k} y dx (I_0 = 0). With σ_y (independent errors) also
 * returns σ(I_k) = √(Σ_i c_ik² σ_i²), c_ik the trapezoid weight of point i in I_k.
 * Throws InputError on bad tables (see checkTable) or a σ array of the wrong length.
 */
export function cumulativeTrapezoid(x: readonly number[], y: readonly number[], sigmaY?: readonly number[]): { integral: number[]; stdError: number[] | null } {
  checkTable(x, y, "x", "y");
  if (sigmaY && sigmaY.length !== x.length) throw invalid("sigma", `${sigmaY.length} values`, `expected ${x.length}`);
  const integral = [0];
  const stdError: number[] | null = sigmaY ? [0] : null;
  let variance = 0; // points 0…k−1 with their final weights in I_k
  for (let k = 1; k < x.length; k++) {
    const h = x[k] - x[k - 1];
    integral.push(integral[k - 1] + (h * (y[k] + y[k - 1])) / 2);
    if (sigmaY && stdError) {
      const hPrev = k >= 2 ? x[k - 1] - x[k - 2] : 0;
      // point k−1 now carries its final weight (hPrev + h)/2; point k carries h/2 in I_k only
      variance += ((hPrev + h) / 2) ** 2 * sigmaY[k - 1] ** 2;
      stdError.push(Math.sqrt(variance + (h / 2) ** 2 * sigmaY[k] ** 2));
    }
  }
  return { integral, stdError };
}

/**
 * Composite Simpson ∫_a^b f dx with n (even, ≥ 2, default 200) intervals; exact for cubics.
 * Throws InputError on b < a, an odd n, or a non-finite f.
 */
export function simpson(f: (x: number) => number, a: number, b: number, n = 200): number {
  if (!(b >= a)) throw invalid("upper limit", b, `must be ≥ lower limit ${a}`);
  if (!Number.isInteger(n) || n < 2 || n % 2) throw invalid("intervals", n, "must be an even integer ≥ 2");
  if (b === a) return 0;
  const h = (b - a) / n;
  let sum = f(a) + f(b);
  for (let i = 1; i < n; i++) sum += (i % 2 ? 4 : 2) * f(a + i * h);
  if (!Number.isFinite(sum)) throw invalid("integrand", sum, "not finite on the interval");
  return (sum * h) / 3;
}
