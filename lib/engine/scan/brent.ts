/**
 * Brent's minimiser of a function of one variable on [a, b]: golden-section steps with
 * parabolic interpolation through the three best points whenever the parabola's step is
 * inside the bracket and shorter than half the step before last. Stops when the bracket
 * is within 2·tol of the best point or after maxEvaluations. Returns the best point seen.
 * Reference: Brent, Algorithms for Minimization without Derivatives (1973), ch. 5
 * (procedure localmin; written here from memory).
 */

export interface Minimum {
  readonly x: number;
  readonly f: number;
  readonly evaluations: number;
}

const GOLD = 0.3819660112501051; // (3 − √5)/2

export function minimizeBrent(f: (x: number) => number, a0: number, b0: number, tol: number, maxEvaluations = 40): Minimum {
  let a = Math.min(a0, b0);
  let b = Math.max(a0, b0);
  let x = a + GOLD * (b - a);
  let w = x;
  let v = x;
  let fx = f(x);
  let fw = fx;
  let fv = fx;
  let evaluations = 1;
  let d = 0;
  let e = 0;
  while (evaluations < maxEvaluations) {
    const m = 0.5 * (a + b);
    const t1 = tol * Math.abs(x) + tol;
    const t2 = 2 * t1;
    if (Math.abs(x - m) <= t2 - 0.5 * (b - a)) break;
    let golden = true;
    if (Math.abs(e) > t1) {
      const r = (x - w) * (fx - fv);
      let q = (x - v) * (fx - fw);
      let p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      else q = -q;
      if (Math.abs(p) < Math.abs(0.5 * q * e) && p > q * (a - x) && p < q * (b - x)) {
        e = d;
        d = p / q;
        const u = x + d;
        if (u - a < t2 || b - u < t2) d = x < m ? t1 : -t1;
        golden = false;
      }
    }
    if (golden) {
      e = (x < m ? b : a) - x;
      d = GOLD * e;
    }
    const u = Math.abs(d) >= t1 ? x + d : x + (d > 0 ? t1 : -t1);
    const fu = f(u);
    evaluations++;
    if (fu <= fx) {
      if (u < x) b = x;
      else a = x;
      [v, fv, w, fw, x, fx] = [w, fw, x, fx, u, fu];
    } else {
      if (u < x) a = u;
      else b = u;
      if (fu <= fw || w === x) {
        [v, fv, w, fw] = [w, fw, u, fu];
      } else if (fu <= fv || v === x || v === w) {
        v = u;
        fv = fu;
      }
    }
  }
  return { x, f: fx, evaluations };
}
