/**
 * One-dimensional root finding and minimisation without derivatives, after R. P. Brent,
 * Algorithms for Minimization without Derivatives (Prentice-Hall, 1973): `zero` (chapter 4)
 * and `localmin` (chapter 5), in the form of the netlib routines zeroin.f and fmin.f.
 *
 * Both only call `f`; callers count evaluations (and charge a budget) inside `f`.
 */

const EPS = Number.EPSILON;

/**
 * A root of `f` in [a, b], where f(a) and f(b) have opposite signs (or one is zero).
 * Brent's method: bisection safeguarding secant and inverse quadratic interpolation;
 * never worse than bisection, superlinear on smooth functions.
 * @param fa, fb the values at a and b, when the caller has them already (saves two calls)
 * @param toleranceX absolute tolerance on the root, in the units of x (> 0)
 * @returns x with |x − root| ≤ 4·ε·|x| + toleranceX (within the bracket)
 * @throws RangeError when f(a) and f(b) have the same sign
 */
export function findRoot(f: (x: number) => number, a: number, b: number, toleranceX: number, fa = f(a), fb = f(b)): number {
  if (fa === 0) return a;
  if (fb === 0) return b;
  if ((fa > 0) === (fb > 0)) throw new RangeError('findRoot: f(a) and f(b) have the same sign');
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let iter = 0; iter < 200; iter++) {
    if ((fb > 0) === (fc > 0)) { c = a; fc = fa; d = b - a; e = d; }
    if (Math.abs(fc) < Math.abs(fb)) { a = b; b = c; c = a; fa = fb; fb = fc; fc = fa; }
    const tol = 2 * EPS * Math.abs(b) + 0.5 * toleranceX;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol || fb === 0) return b;
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      // Interpolate: secant when only two points differ, inverse quadratic otherwise.
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * m * s;
        q = 1 - s;
      } else {
        const qq = fa / fc;
        const r = fb / fc;
        p = s * (2 * m * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q; else p = -p;
      if (2 * p < Math.min(3 * m * q - Math.abs(tol * q), Math.abs(e * q))) { e = d; d = p / q; } else { d = m; e = m; }
    } else {
      d = m; e = m;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol ? d : (m > 0 ? tol : -tol);
    fb = f(b);
  }
  return b;
}

/** A minimum found by {@link findMinimum}. */
export interface Minimum { readonly x: number; readonly fx: number }

const GOLDEN = 0.5 * (3 - Math.sqrt(5));

/**
 * A local minimum of `f` on [a, b]: Brent's method (golden-section search with parabolic
 * interpolation). For a unimodal f it is the minimum; for a V-shaped minimum (a kink) the
 * parabolic steps are rejected and golden-section steps converge on it all the same.
 * @param toleranceX absolute tolerance on the abscissa (> 0); the result is within
 *   about 2·(√ε·|x| ∧ 4ε|x|) + toleranceX of a local minimum
 * @param start an interior point to start from (default: the golden-section point)
 */
export function findMinimum(f: (x: number) => number, a: number, b: number, toleranceX: number, start?: { x: number; fx: number }): Minimum {
  if (b < a) [a, b] = [b, a];
  let x = start && start.x > a && start.x < b ? start.x : a + GOLDEN * (b - a);
  let fx = start && x === start.x ? start.fx : f(x);
  let v = x, w = x, fv = fx, fw = fx;
  let d = 0;
  let e = 0;
  for (let iter = 0; iter < 200; iter++) {
    const xm = 0.5 * (a + b);
    // Relative part 4ε|x| (not √ε|x|): times are large numbers of days, and we want seconds.
    const tol1 = 4 * EPS * Math.abs(x) + toleranceX / 3;
    const tol2 = 2 * tol1;
    if (Math.abs(x - xm) <= tol2 - 0.5 * (b - a)) break;
    let useGolden = true;
    if (Math.abs(e) > tol1) {
      let r = (x - w) * (fx - fv);
      let q = (x - v) * (fx - fw);
      let p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      q = Math.abs(q);
      r = e;
      e = d;
      if (Math.abs(p) < Math.abs(0.5 * q * r) && p > q * (a - x) && p < q * (b - x)) {
        d = p / q;
        const u = x + d;
        if (u - a < tol2 || b - u < tol2) d = xm >= x ? tol1 : -tol1;
        useGolden = false;
      }
    }
    if (useGolden) {
      e = x >= xm ? a - x : b - x;
      d = GOLDEN * e;
    }
    const u = Math.abs(d) >= tol1 ? x + d : x + (d > 0 ? tol1 : -tol1);
    const fu = f(u);
    if (fu <= fx) {
      if (u >= x) a = x; else b = x;
      v = w; fv = fw; w = x; fw = fx; x = u; fx = fu;
    } else {
      if (u < x) a = u; else b = u;
      if (fu <= fw || w === x) { v = w; fv = fw; w = u; fw = fu; } else if (fu <= fv || v === x || v === w) { v = u; fv = fu; }
    }
  }
  return { x, fx };
}
