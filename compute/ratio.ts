/**
 * Period ratios: continued-fraction convergents, the nearest small-denominator fraction,
 * and the chance that a random ratio lands at least as close to one.
 */
import { LimitError } from './limits.js';
import { propagate, sigmaOf, type Quantity } from './quantity.js';

/** A fraction p/q in lowest terms, q ≥ 1. */
export interface Fraction {
  readonly p: number;
  readonly q: number;
}

/** Largest denominator bound accepted by {@link fareyChance} and the `ratio` statement. */
export const MAX_RATIO_DENOMINATOR = 1000;

export interface ContinuedFraction {
  /** Partial quotients a0; a1, a2, … as far as the convergents go. */
  readonly terms: readonly number[];
  /** Convergents p/q with q ≤ the bound, in order (the first is a0/1). */
  readonly convergents: readonly Fraction[];
}

/**
 * Regular continued fraction of x and its convergents up to a denominator bound, by the
 * recurrence pₙ = aₙpₙ₋₁ + pₙ₋₂, qₙ = aₙqₙ₋₁ + qₙ₋₂ (Hardy & Wright, An Introduction to the
 * Theory of Numbers, ch. 10, Thm 149).
 *
 * Double precision limits the depth: expansion stops when the remainder vanishes (x rational
 * in binary) or a denominator would exceed `maxDenominator`. Fine for bounds up to ~10⁷.
 * @param x a finite number ≥ 0
 * @param maxDenominator bound on q, an integer ≥ 1
 * @throws RangeError for negative or non-finite x or a bound below 1
 */
export function continuedFraction(x: number, maxDenominator: number): ContinuedFraction {
  if (!Number.isFinite(x) || x < 0) throw new RangeError(`continued fraction needs a finite number ≥ 0, got ${x}`);
  if (!(Number.isInteger(maxDenominator) && maxDenominator >= 1)) throw new RangeError(`denominator bound must be an integer ≥ 1, got ${maxDenominator}`);
  const terms: number[] = [];
  const convergents: Fraction[] = [];
  let pPrev = 1, pPrev2 = 0, qPrev = 0, qPrev2 = 1;
  let rest = x;
  for (;;) {
    const a = Math.floor(rest);
    const p = a * pPrev + pPrev2;
    const q = a * qPrev + qPrev2;
    if (q > maxDenominator) break;
    terms.push(a);
    convergents.push({ p, q });
    pPrev2 = pPrev; pPrev = p;
    qPrev2 = qPrev; qPrev = q;
    const frac = rest - a;
    // A remainder below 2⁻⁴⁰ is rounding noise: the next quotient would be meaningless.
    if (frac < 2 ** -40) break;
    rest = 1 / frac;
  }
  return { terms, convergents };
}

/**
 * The fraction p/q with q ≤ maxDenominator nearest to x (the smallest q among ties), by
 * checking round(x·q)/q for every q — exact and O(maxDenominator).
 * @param x a finite number
 * @returns the fraction in lowest terms and its distance |x − p/q|
 */
export function nearestFraction(x: number, maxDenominator: number): Fraction & { readonly distance: number } {
  if (!Number.isFinite(x)) throw new RangeError(`nearest fraction needs a finite number, got ${x}`);
  if (!(Number.isInteger(maxDenominator) && maxDenominator >= 1)) throw new RangeError(`denominator bound must be an integer ≥ 1, got ${maxDenominator}`);
  let best = { p: Math.round(x), q: 1, distance: Math.abs(x - Math.round(x)) };
  for (let q = 2; q <= maxDenominator; q++) {
    const p = Math.round(x * q);
    const d = Math.abs(x - p / q);
    if (d < best.distance) best = { p, q, distance: d };
  }
  const g = gcd(Math.abs(best.p), best.q);
  return { p: best.p / g, q: best.q / g, distance: best.distance };
}

/**
 * Probability that x drawn uniformly from a unit interval [m, m+1) lies within `distance`
 * of some fraction with denominator ≤ maxDenominator: the measure of the union of intervals
 * of half-width `distance` about the Farey fractions of order N (shifted by m). Consecutive
 * Farey fractions a/b < c/d differ by 1/(bd) (Hardy & Wright ch. 3, Thm 28), so the union
 * has measure Σ min(1/(bd), 2·distance) over consecutive pairs — exact, no simulation.
 * @param distance half-width, ≥ 0 (|x − p/q| of the observed ratio)
 * @param maxDenominator N, 1 … {@link MAX_RATIO_DENOMINATOR}
 * @returns probability in [0, 1]
 * @throws LimitError when N is above {@link MAX_RATIO_DENOMINATOR}
 */
export function fareyChance(distance: number, maxDenominator: number): number {
  if (!(distance >= 0)) throw new RangeError(`distance must be ≥ 0, got ${distance}`);
  checkDenominator(maxDenominator);
  const n = maxDenominator;
  const width = 2 * distance;
  // Next-term recurrence of the Farey sequence (Hardy & Wright ch. 3, §3.1).
  let a = 0, b = 1, c = 1, d = n;
  let sum = Math.min(1 / (b * d), width);
  while (!(c === 1 && d === 1)) {
    const k = Math.floor((n + b) / d);
    const e = k * c - a;
    const f = k * d - b;
    a = c; b = d; c = e; d = f;
    sum += Math.min(1 / (b * d), width);
  }
  return Math.min(1, sum);
}

function checkDenominator(n: number): void {
  if (!(Number.isInteger(n) && n >= 1)) throw new RangeError(`denominator bound must be an integer ≥ 1, got ${n}`);
  if (n > MAX_RATIO_DENOMINATOR) {
    throw new LimitError(`denominator bound ${n} is above the limit of ${MAX_RATIO_DENOMINATOR}`, 'up-to',
      `write \`up-to ${MAX_RATIO_DENOMINATOR}\` or less`);
  }
}

export function gcd(a: number, b: number): number {
  let x = Math.abs(a), y = Math.abs(b);
  while (y !== 0) { const t = x % y; x = y; y = t; }
  return x;
}

export interface ConvergentRow extends Fraction {
  /** |ratio − p/q|. */
  readonly distance: number;
  /** True when p/q lies within one standard uncertainty of the ratio (the data cannot tell them apart). */
  readonly withinSigma: boolean;
}

export interface RatioAnalysis {
  /** The ratio with propagated uncertainty (dimensionless). */
  readonly ratio: Quantity;
  readonly maxDenominator: number;
  readonly terms: readonly number[];
  readonly convergents: readonly ConvergentRow[];
  /** Nearest fraction with q ≤ N and |ratio − p/q|. */
  readonly nearest: Fraction & { readonly distance: number };
  /** Fractional offset ratio/(p/q) − 1, with propagated uncertainty. */
  readonly offset: Quantity;
  /** Chance under {@link RatioAnalysis.nullModel} of landing at least as close to some p/q with q ≤ N. */
  readonly chance: number;
  /** The null model in words. */
  readonly nullModel: string;
}

/**
 * Everything the `ratio` statement reports about a ratio of two periods.
 * @param ratio a dimensionless quantity ≥ 1 by convention (longer over shorter period; a
 *   ratio below 1/(2N) would be nearest to 0/1); its uncertainty is carried to the offset
 * @param maxDenominator N, 1 … {@link MAX_RATIO_DENOMINATOR}
 * @throws RangeError for a ratio ≤ 0; LimitError for N too large
 */
export function analyseRatio(ratio: Quantity, maxDenominator: number): RatioAnalysis {
  const r = ratio.value;
  if (!(r > 0) || !Number.isFinite(r)) throw new RangeError(`a period ratio must be a positive finite number, got ${r}`);
  checkDenominator(maxDenominator);
  const sigma = sigmaOf(ratio);
  const cf = continuedFraction(r, maxDenominator);
  const convergents = cf.convergents.map((f) => {
    const distance = Math.abs(r - f.p / f.q);
    return { ...f, distance, withinSigma: distance <= sigma };
  });
  const nearest = nearestFraction(r, maxDenominator);
  const target = nearest.p / nearest.q;
  const offset = propagate(r / target - 1, 'none', [[ratio, 1 / target]]);
  const m = Math.floor(r);
  return {
    ratio,
    maxDenominator,
    terms: cf.terms,
    convergents,
    nearest,
    offset,
    chance: fareyChance(nearest.distance, maxDenominator),
    nullModel: `ratio uniform in [${m}, ${m + 1}) (the unit interval that holds it); chance = measure of the points within ${nearest.distance.toPrecision(3)} of a fraction with denominator ≤ ${maxDenominator}, summed exactly over the Farey sequence of order ${maxDenominator}`,
  };
}
