/**
 * Integer relations among mean motions: Σ kᵢ·nᵢ ≈ 0 with |kᵢ| ≤ K.
 *
 * Score (the lead's decision, the literal reading of "ranked by residual"): the absolute
 * residual frequency |Σ kᵢnᵢ|, smallest first, i.e. the circulation period 1/|Σ kᵢnᵢ| of the
 * resonant angle Σ kᵢλᵢ, longest first: the slowest-circulating angle ranks first. Ties: smaller
 * Σ|kᵢ| first. A multiple of a relation has a larger residual and says nothing new, so only
 * primitive relations (gcd of the kᵢ = 1) with the first non-zero kᵢ positive and at least two
 * non-zero kᵢ are listed.
 *
 * Search: meet in the middle (Horowitz & Sahni 1974 for subset sums). The coefficients of the
 * first ⌈m/2⌉ motions form table A (sign-normalised), the rest table B, whose partial sums are
 * bucket-sorted. For an entry of A with partial sum a, only the B entries with partial sum in
 * [−a − r*, −a + r*] can beat the current bound r*: an interval query on the sorted table, so a
 * whole search costs about |A| + |B| ≈ (2K+1)^⌈m/2⌉ operations instead of (2K+1)^m.
 */
import type { Budget } from './limits.js';
import { LimitError } from './limits.js';
import { gcd } from './ratio.js';
import { abs, propagate, reciprocal, sigmaOf, type Quantity } from './quantity.js';
import { createRng } from './random.js';

/** Default coefficient bound K. */
export const DEFAULT_RELATION_BOUND = 4;
/** Fewest and most mean motions one search takes. */
export const MIN_RELATION_BODIES = 2;
export const MAX_RELATION_BODIES = 8;
/** Largest half table (entries) a search may build: bounds memory and time per trial. */
export const MAX_HALF_TABLE = 1_000_000;
/**
 * Most table entries a Monte-Carlo estimate may walk in all (trials × (|A| + |B|)), checked
 * before the first trial: several seconds on one core at the ~25 ns per entry measured here
 * (7 motions, |k| ≤ 4, 10⁴ trials walk 4·10⁷ entries, about one second).
 */
export const MAX_RELATION_WORK = 300_000_000;

/** The precomputed coefficient tables of a search over m motions with |kᵢ| ≤ K. */
export interface RelationPlan {
  readonly bodies: number;
  readonly bound: number;
  /** Size of the search space counted before searching: sign-deduplicated non-zero vectors, ((2K+1)^m − 1)/2. */
  readonly combinations: number;
  readonly hA: number;
  readonly hB: number;
  /** Table A: sign-normalised coefficient vectors of motions 0 … hA−1 (the zero vector first), row-major. */
  readonly coeffA: Int8Array;
  readonly sizeA: number;
  /** Table B: every coefficient vector of motions hA … m−1, row-major. */
  readonly coeffB: Int8Array;
  readonly sizeB: number;
  /** Per B entry: whether its first non-zero coefficient is positive (for pairing with the zero A vector). */
  readonly positiveB: Uint8Array;
  /** Per B entry: its number of non-zero coefficients, capped at 2. */
  readonly nonzeroB: Uint8Array;
  /** Per P entry: its number of non-zero coefficients, capped at 2. */
  readonly nonzeroP: Uint8Array;
  /** Prefix table: sign-normalised vectors of motions 0 … hA−2 (zero vector first), for the per-trial walk. */
  readonly coeffP: Int8Array;
  readonly sizeP: number;
  /** Prefix table of B: every vector of its first hB − 1 motions, in table B's odometer order. */
  readonly coeffQ: Int8Array;
  readonly sizeQ: number;
}

/**
 * Count the search space and build the coefficient tables.
 * @param bodies number of mean motions, 2 … 8
 * @param bound K, an integer ≥ 1
 * @throws RangeError for a body count outside 2 … 8 or K < 1
 * @throws LimitError when a half table would exceed {@link MAX_HALF_TABLE} entries
 */
export function planRelationSearch(bodies: number, bound: number): RelationPlan {
  if (!(Number.isInteger(bodies) && bodies >= MIN_RELATION_BODIES && bodies <= MAX_RELATION_BODIES)) {
    throw new RangeError(`a relation search takes ${MIN_RELATION_BODIES} to ${MAX_RELATION_BODIES} mean motions, got ${bodies}`);
  }
  if (!(Number.isInteger(bound) && bound >= 1 && bound <= 127)) throw new RangeError(`the coefficient bound must be an integer from 1 to 127, got ${bound}`);
  const base = 2 * bound + 1;
  const hA = Math.ceil(bodies / 2);
  const hB = bodies - hA;
  const fullA = base ** hA;
  if (fullA / 2 > MAX_HALF_TABLE || base ** hB > MAX_HALF_TABLE) {
    throw new LimitError(`a relation search over ${bodies} mean motions with |k| ≤ ${bound} needs tables of ${Math.ceil(fullA / 2)} entries (limit ${MAX_HALF_TABLE})`,
      'up-to', 'lower `up-to`, or list fewer bodies');
  }
  const coeffA = enumerate(hA, bound, true);
  const coeffB = enumerate(hB, bound, false);
  const sizeB = coeffB.length / Math.max(1, hB);
  const positiveB = new Uint8Array(sizeB);
  for (let j = 0; j < sizeB; j++) {
    for (let c = 0; c < hB; c++) {
      const v = coeffB[j * hB + c]!;
      if (v !== 0) { positiveB[j] = v > 0 ? 1 : 0; break; }
    }
  }
  const coeffP = enumerate(hA - 1, bound, true);
  const coeffQ = enumerate(hB - 1, bound, false);
  const sizeP = hA > 1 ? coeffP.length / (hA - 1) : 1;
  return {
    bodies, bound, combinations: (base ** bodies - 1) / 2, hA, hB,
    coeffA, sizeA: coeffA.length / hA, coeffB, sizeB, positiveB,
    nonzeroB: countNonzero(coeffB, hB, sizeB), nonzeroP: countNonzero(coeffP, hA - 1, sizeP),
    coeffP, sizeP,
    coeffQ, sizeQ: hB > 1 ? coeffQ.length / (hB - 1) : 1,
  };
}

/** Non-zero coefficients per row (capped at 2: the statistic only asks "at least two motions?"). */
function countNonzero(rows: Int8Array, h: number, size: number): Uint8Array {
  const out = new Uint8Array(size);
  for (let j = 0; j < size; j++) {
    let c = 0;
    for (let i = 0; i < h; i++) if (rows[j * h + i] !== 0) c++;
    out[j] = c > 2 ? 2 : c;
  }
  return out;
}

/** All vectors in [−K, K]^h (row-major); with `signNormalised`, the zero vector and those whose first non-zero entry is positive. */
function enumerate(h: number, bound: number, signNormalised: boolean): Int8Array {
  const base = 2 * bound + 1;
  const total = base ** h;
  const rows: number[] = [];
  const k = new Array<number>(h).fill(-bound);
  // The zero vector first, so that index 0 of table A is "no A motions involved".
  if (signNormalised) rows.push(...new Array<number>(h).fill(0));
  for (let idx = 0; idx < total; idx++) {
    let first = 0;
    for (const v of k) if (v !== 0) { first = v; break; }
    if (!signNormalised || first > 0) rows.push(...k);
    for (let c = h - 1; c >= 0; c--) {
      if (k[c]! < bound) { k[c] = k[c]! + 1; break; }
      k[c] = -bound;
    }
  }
  return Int8Array.from(rows);
}

/** One relation found by a search. */
export interface FoundRelation {
  /** Coefficients kᵢ, one per mean motion, primitive, first non-zero positive. */
  readonly k: readonly number[];
  /** Σ kᵢnᵢ in the unit of the input frequencies. */
  readonly residual: number;
  /** The ranking score |Σ kᵢnᵢ| (same unit as the residual): smaller ranks first. */
  readonly score: number;
}

/** Scratch arrays reused across searches of one plan (one per thread of work). */
class Workspace {
  readonly sA: Float64Array;
  readonly sB: Float64Array;
  readonly sortedS: Float64Array;
  readonly sortedNz: Uint8Array;
  readonly sortedIdx: Int32Array;
  readonly start: Int32Array;
  readonly fill: Int32Array;
  readonly bucketOf: Int32Array;
  readonly buckets: number;
  range = 0;
  width = 1;

  constructor(readonly plan: RelationPlan, withA = false) {
    this.sA = new Float64Array(withA ? plan.sizeA : 0);
    this.sB = new Float64Array(plan.sizeB);
    this.sortedS = new Float64Array(plan.sizeB);
    this.sortedNz = new Uint8Array(plan.sizeB);
    this.sortedIdx = new Int32Array(plan.sizeB);
    // Four to eight buckets per entry: most queries then find an empty range and stop at
    // once (measured best against two and sixteen in the relation benchmark's setting).
    let nb = 1;
    while (nb < 4 * plan.sizeB) nb <<= 1;
    this.buckets = nb;
    this.start = new Int32Array(nb + 1);
    this.fill = new Int32Array(nb);
    this.bucketOf = new Int32Array(plan.sizeB);
  }

  /** Partial sums of table A for these motions (the listing search). */
  loadA(n: ArrayLike<number>): void {
    const { hA, coeffA, sizeA } = this.plan;
    for (let i = 0; i < sizeA; i++) {
      let s = 0;
      for (let c = 0; c < hA; c++) s += coeffA[i * hA + c]! * n[c]!;
      this.sA[i] = s;
    }
  }

  /** Partial sums of table B for these motions, sorted by sum (counting sort into buckets). */
  loadB(n: ArrayLike<number>): void {
    const { hA, hB, coeffQ, sizeQ, sizeB, bound, nonzeroB } = this.plan;
    let range = 0;
    for (let c = 0; c < hB; c++) range += Math.abs(n[hA + c]!);
    range = range > 0 ? range * bound : 1;
    this.range = range;
    this.width = (2 * range) / this.buckets;
    const inv = 1 / this.width;
    const top = this.buckets - 1;
    const { sB, bucketOf, sortedS, sortedNz, sortedIdx, fill } = this;
    const count = this.start;
    count.fill(0);
    // Table B is in odometer order (last coefficient fastest): entry = prefix · (2K+1) + (k_last + K),
    // so each sum is a prefix sum plus one term.
    const hQ = hB - 1;
    const nLast = n[hA + hQ]!;
    let j = 0;
    for (let q = 0; q < sizeQ; q++) {
      let sq = 0;
      for (let c = 0; c < hQ; c++) sq += coeffQ[q * hQ + c]! * n[hA + c]!;
      for (let kc = -bound; kc <= bound; kc++, j++) {
        const s = sq + kc * nLast;
        sB[j] = s;
        const x = (s + range) * inv;
        const bk = x <= 0 ? 0 : x >= top ? top : x | 0;
        bucketOf[j] = bk;
        count[bk + 1]! += 1;
      }
    }
    for (let bk = 0; bk < top + 1; bk++) count[bk + 1]! += count[bk]!;
    // Counting sort: `fill` walks each bucket's next free slot.
    fill.set(count.subarray(0, top + 1));
    for (let j = 0; j < sizeB; j++) {
      const bk = bucketOf[j]!;
      const at = fill[bk]!;
      fill[bk] = at + 1;
      sortedS[at] = sB[j]!;
      sortedNz[at] = nonzeroB[j]!;
      sortedIdx[at] = j;
    }
  }

  bucket(s: number): number {
    const b = Math.floor((s + this.range) / this.width);
    return b < 0 ? 0 : b >= this.buckets ? this.buckets - 1 : b;
  }
}

/**
 * The smallest absolute residual |Σ kᵢnᵢ| over the relations of the search space (at least two
 * non-zero kᵢ), if it is ≤ `bound`: the per-trial fast path. Table A is not stored: its vectors
 * are a prefix table over the first hA − 1 motions times the last A motion's coefficient, walked
 * with running sums; each is matched against the sorted table B at once by an interval query.
 * Non-primitive vectors need no test: a multiple of a relation has a larger residual.
 * @param enough stop as soon as a relation has |residual| ≤ this (the caller only compares with
 *   thresholds ≥ it, so any such residual counts the same)
 * @returns the best |residual| (or the first ≤ `enough`), or Infinity when none is ≤ `bound`
 */
function bestScoreIn(ws: Workspace, n: ArrayLike<number>, bound: number, enough = -1): number {
  const { hA, bound: K, coeffP, sizeP, nonzeroP } = ws.plan;
  const { sortedS, sortedNz, start } = ws;
  const range = ws.range;
  const inv = 1 / ws.width;
  const topBucket = ws.buckets - 1;
  const hP = hA - 1;
  const nLast = n[hP]!;
  let best = Infinity;
  // lim = min(best, bound): a candidate must have |sa + sb| ≤ lim, i.e. sb ∈ [−sa − lim, −sa + lim].
  let lim = bound;
  for (let p = 0; p < sizeP; p++) {
    let sp = 0;
    for (let c = 0; c < hP; c++) sp += coeffP[p * hP + c]! * n[c]!;
    const nzP = nonzeroP[p]!;
    // Prefix 0 is the zero vector: the last A coefficient then starts at 0 (sign normalisation).
    for (let kc = p === 0 ? 0 : -K; kc <= K; kc++) {
      const sa = sp + kc * nLast;
      const nzA = kc === 0 ? nzP : nzP + 1;
      // Clamped bucket range of [−sa − lim, −sa + lim], without data-dependent branches
      // (random motions make them unpredictable); lim ≥ range clamps to every bucket.
      const x = (range - sa) * inv;
      const hw = lim * inv;
      const b0 = Math.max(0, Math.min(topBucket, x - hw)) | 0;
      const b1 = Math.max(0, Math.min(topBucket, x + hw)) | 0;
      for (let j = start[b0]!, end = start[b1 + 1]!; j < end; j++) {
        const r = sa + sortedS[j]!;
        const ar = r < 0 ? -r : r;
        // Fewer than two non-zero coefficients (the zero vector, or one motion alone) is no relation.
        if (ar <= lim && nzA + sortedNz[j]! >= 2 && ar < best) {
          best = ar; lim = ar;
          if (ar <= enough) return ar;
        }
      }
    }
  }
  return best;
}

/**
 * The `top` best primitive relations Σ kᵢnᵢ ≈ 0 with |kᵢ| ≤ K, ranked by absolute residual
 * |Σ kᵢnᵢ| (longest circulation period first; ties: smaller Σ|kᵢ| first), by meet in the middle.
 * @param freqs mean motions nᵢ > 0 in any one frequency unit (2 … 8 of them)
 * @param bound K ≥ 1
 * @param top how many relations to return, ≥ 1
 * @param budget ticked once per table entry before the search (the work is counted first); cancellable
 * @throws RangeError for bad arguments, LimitError when the tables would be too large or the budget is spent
 */
export function searchRelations(freqs: readonly number[], bound: number, top: number, budget?: Budget, plan = planRelationSearch(freqs.length, bound)): FoundRelation[] {
  checkFreqs(freqs);
  if (!(Number.isInteger(top) && top >= 1)) throw new RangeError(`top must be an integer ≥ 1, got ${top}`);
  budget?.tick(plan.sizeA + plan.sizeB);
  const ws = new Workspace(plan, true);
  ws.loadA(freqs);
  ws.loadB(freqs);
  const { hA, hB, coeffA, coeffB, sizeA, positiveB } = plan;
  const { sA, sortedS, sortedIdx, start } = ws;
  const kept: Array<FoundRelation & { weight: number }> = [];
  const k = new Array<number>(plan.bodies).fill(0);
  for (let i = 0; i < sizeA; i++) {
    if ((i & 1023) === 0) budget?.checkCancelled();
    const worst = kept.length < top ? Infinity : kept[kept.length - 1]!.score;
    const target = -sA[i]!;
    const b0 = Number.isFinite(worst) ? ws.bucket(target - worst) : 0;
    const b1 = Number.isFinite(worst) ? ws.bucket(target + worst) : ws.buckets - 1;
    for (let j = start[b0]!, end = start[b1 + 1]!; j < end; j++) {
      const r = sA[i]! + sortedS[j]!;
      const e = Math.abs(r);
      const limit = kept.length < top ? Infinity : kept[kept.length - 1]!.score;
      if (e > limit) continue;
      const jb = sortedIdx[j]!;
      if (i === 0 && positiveB[jb] !== 1) continue; // −k of a vector already counted (or the zero vector)
      let g = 0, weight = 0;
      for (let c = 0; c < hA; c++) { k[c] = coeffA[i * hA + c]!; g = gcd(g, k[c]!); weight += Math.abs(k[c]!); }
      for (let c = 0; c < hB; c++) { k[hA + c] = coeffB[jb * hB + c]!; g = gcd(g, k[hA + c]!); weight += Math.abs(k[hA + c]!); }
      // A multiple of a primitive relation says nothing new; a unit vector (weight 1) involves one motion only.
      if (g !== 1 || weight < 2) continue;
      insertRanked(kept, { k: k.slice(), residual: r, score: e, weight }, top);
    }
  }
  return kept.map(({ k: kk, residual, score }) => ({ k: kk, residual, score }));
}

function insertRanked(kept: Array<FoundRelation & { weight: number }>, item: FoundRelation & { weight: number }, top: number): void {
  let at = kept.length;
  while (at > 0) {
    const prev = kept[at - 1]!;
    if (prev.score < item.score || (prev.score === item.score && prev.weight <= item.weight)) break;
    at--;
  }
  if (at >= top) return;
  kept.splice(at, 0, item);
  if (kept.length > top) kept.pop();
}

/**
 * The same search by brute force over every vector of the box: (2K+1)^m evaluations. Kept as
 * the baseline for the benchmark and as an independent cross-check of the fast search.
 */
export function searchRelationsExhaustive(freqs: readonly number[], bound: number, top: number): FoundRelation[] {
  checkFreqs(freqs);
  const m = freqs.length;
  const k = new Array<number>(m).fill(-bound);
  const kept: Array<FoundRelation & { weight: number }> = [];
  const total = (2 * bound + 1) ** m;
  for (let idx = 0; idx < total; idx++) {
    let s = 0, first = 0, g = 0, weight = 0;
    for (let c = 0; c < m; c++) {
      const v = k[c]!;
      s += v * freqs[c]!;
      if (first === 0) first = v;
      g = gcd(g, v);
      weight += Math.abs(v);
    }
    if (first > 0 && g === 1 && weight >= 2) insertRanked(kept, { k: k.slice(), residual: s, score: Math.abs(s), weight }, top);
    for (let c = m - 1; c >= 0; c--) {
      if (k[c]! < bound) { k[c] = k[c]! + 1; break; }
      k[c] = -bound;
    }
  }
  return kept.map(({ k: kk, residual, score }) => ({ k: kk, residual, score }));
}

/** Smallest |Σ kᵢnᵢ| over the vectors of the box with at least two non-zero kᵢ, by brute force (the benchmark's per-trial baseline). */
export function bestScoreExhaustive(freqs: readonly number[], bound: number): number {
  const m = freqs.length;
  const k = new Array<number>(m).fill(-bound);
  const total = (2 * bound + 1) ** m;
  let best = Infinity;
  for (let idx = 0; idx < total; idx++) {
    let s = 0, nonzero = 0;
    for (let c = 0; c < m; c++) {
      s += k[c]! * freqs[c]!;
      if (k[c] !== 0) nonzero++;
    }
    if (nonzero >= 2 && Math.abs(s) < best) best = Math.abs(s);
    for (let c = m - 1; c >= 0; c--) {
      if (k[c]! < bound) { k[c] = k[c]! + 1; break; }
      k[c] = -bound;
    }
  }
  return best;
}

function checkFreqs(freqs: readonly number[]): void {
  for (const f of freqs) {
    if (!(f > 0) || !Number.isFinite(f)) throw new RangeError(`mean motions must be positive finite numbers, got ${f}`);
  }
}

/** Result of the Monte-Carlo chance estimate. */
export interface RelationChance {
  readonly trials: number;
  readonly seed: number;
  /** Per threshold (in the order given): trials whose best relation has |residual| ≤ the threshold. */
  readonly hits: readonly number[];
  /** The null model in words. */
  readonly nullModel: string;
}

/**
 * Chance that random motions have a relation at least as good: for each threshold rⱼ, the
 * fraction of trials whose best relation over the same search space (same m and K, at least
 * two motions) has |Σ kᵢnᵢ| ≤ rⱼ. Null model: periods drawn independently log-uniform between
 * the shortest and longest observed period (the statistic does not depend on their order).
 * @param periods the observed periods (any one unit), 2 … 8, > 0
 * @param thresholds absolute residuals to test, in cycles per unit of `periods` (e.g. the
 *   scores of the reported relations when their motions are 1/period)
 * @param trials number of trials, checked against the budget's trial limit first
 * @param seed seed of the generator ({@link createRng})
 * @param budget ticked once per trial; cancellable
 * @throws LimitError when the trials exceed the budget's trial limit, or the total work
 *   {@link MAX_RELATION_WORK} (both checked before the first trial); CancelledError
 */
export function relationChance(periods: readonly number[], bound: number, thresholds: readonly number[], trials: number, seed: number, budget?: Budget, plan = planRelationSearch(periods.length, bound)): RelationChance {
  checkFreqs(periods);
  if (!(Number.isInteger(trials) && trials >= 1)) throw new RangeError(`trials must be an integer ≥ 1, got ${trials}`);
  budget?.checkTrials(trials);
  const work = trials * (plan.sizeA + plan.sizeB);
  if (work > MAX_RELATION_WORK) {
    throw new LimitError(`${trials} Monte-Carlo trials over ${periods.length} mean motions with |k| ≤ ${bound} would walk ${work.toExponential(1)} table entries (limit ${MAX_RELATION_WORK.toExponential(0)})`,
      'up-to', 'lower `up-to` or list fewer bodies');
  }
  const lo = Math.min(...periods);
  const hi = Math.max(...periods);
  const logLo = Math.log(lo);
  const logSpan = Math.log(hi) - logLo;
  const cap = thresholds.length > 0 ? Math.max(...thresholds) : 0;
  const floor = thresholds.length > 0 ? Math.min(...thresholds) : -1;
  const rng = createRng(seed);
  const ws = new Workspace(plan);
  const n = new Float64Array(periods.length);
  const bests = new Float64Array(trials);
  for (let t = 0; t < trials; t++) {
    budget?.tick(1);
    for (let c = 0; c < n.length; c++) n[c] = Math.exp(-(logLo + logSpan * rng.uniform()));
    ws.loadB(n);
    bests[t] = bestScoreIn(ws, n, cap, floor);
  }
  bests.sort();
  const hits = thresholds.map((r) => upperBound(bests, r));
  return {
    trials, seed, hits,
    nullModel: `periods drawn independently log-uniform in [${formatPlain(lo)}, ${formatPlain(hi)}] (the observed range); statistic: the smallest absolute residual |Σ kᵢnᵢ| over the same search space (${periods.length} motions, |k| ≤ ${bound})`,
  };
}

/** Smallest |Σ kᵢnᵢ| of a plan's search (relations of at least two motions) for given motions, no listing: the fast path used per trial. */
export function bestScore(freqs: readonly number[], bound: number, plan = planRelationSearch(freqs.length, bound)): number {
  checkFreqs(freqs);
  const ws = new Workspace(plan);
  ws.loadB(freqs);
  return bestScoreIn(ws, freqs, Infinity);
}

/** Number of sorted values ≤ x. */
function upperBound(sorted: Float64Array, x: number): number {
  let lo = 0, hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (sorted[mid]! <= x) lo = mid + 1; else hi = mid;
  }
  return lo;
}

function formatPlain(x: number): string {
  return Number(x.toPrecision(6)).toString();
}

/** A relation read with uncertainties, for display. */
export interface RelationReading {
  readonly k: readonly number[];
  /** Σ kᵢnᵢ (frequency, cycles/day) with propagated uncertainty. */
  readonly residual: Quantity;
  /** 1/|Σ kᵢnᵢ| (days) with propagated uncertainty; undefined when the residual is exactly 0. */
  readonly circulation?: Quantity;
  /** True when |residual| ≤ 2σ: the data are consistent with an exact commensurability. */
  readonly consistentWithZero: boolean;
  /** Σ kᵢ. Zero means the angle Σ kᵢλᵢ needs no pericentre terms (d'Alembert rule). */
  readonly coefficientSum: number;
  /**
   * The relation as pair synodic frequencies: over the involved motions i₁ < … < i_r,
   * Σ kᵢnᵢ = Σⱼ Cⱼ·(n_{iⱼ} − n_{iⱼ₊₁}) + (Σk)·n_{i_r}, with Cⱼ the partial sums of k.
   */
  readonly pairs: ReadonlyArray<{ readonly from: number; readonly to: number; readonly coefficient: number }>;
}

/**
 * Residual, circulation period, Σk and the pair-synodic reading of a relation.
 * @param k integer coefficients, one per motion
 * @param freqs mean motions as frequency quantities (cycles/day), same order
 */
export function readRelation(k: readonly number[], freqs: readonly Quantity[]): RelationReading {
  if (k.length !== freqs.length) throw new RangeError('one coefficient per mean motion');
  let value = 0;
  for (let i = 0; i < k.length; i++) value += k[i]! * freqs[i]!.value;
  const residual = propagate(value, 'frequency', freqs.map((q, i) => [q, k[i]!] as const));
  const consistentWithZero = Math.abs(value) <= 2 * sigmaOf(residual);
  const involved = k.map((v, i) => (v !== 0 ? i : -1)).filter((i) => i >= 0);
  const pairs: Array<{ from: number; to: number; coefficient: number }> = [];
  let partial = 0;
  for (let j = 0; j + 1 < involved.length; j++) {
    partial += k[involved[j]!]!;
    pairs.push({ from: involved[j]!, to: involved[j + 1]!, coefficient: partial });
  }
  const reading: RelationReading = {
    k, residual, consistentWithZero,
    coefficientSum: k.reduce((a, b) => a + b, 0), pairs,
  };
  return value === 0 ? reading : { ...reading, circulation: reciprocal(abs(residual)) };
}
