/**
 * The floating-mean (generalised) Lomb–Scargle periodogram and what a practitioner reads off it:
 * peaks, their widths, false-alarm probabilities and matches against computed periods.
 *
 * Power is the fraction of the variance about the weighted mean that a sinusoid plus offset
 * explains at each trial frequency (Zechmeister & Kürster 2009, A&A 496, 577, eqs. 4–5), so
 * 0 ≤ p ≤ 1. Frequencies are in cycles per day, times in days, throughout.
 *
 * Pure: no I/O; long loops call {@link Budget.tick} so they can be cancelled and bounded.
 */
import type { Budget } from './limits.js';
import { LimitError } from './limits.js';

/** Samples to analyse. Times need not be sorted or evenly spaced. */
export interface SampledSeries {
  /** Sample times in days (any origin: the periodogram does not depend on it). */
  readonly tDays: ArrayLike<number>;
  readonly values: ArrayLike<number>;
  /** Optional 1σ measurement errors (same unit as values, all > 0); equal weights when absent. */
  readonly sigmas?: ArrayLike<number>;
}

/** A uniform frequency grid f_k = f0 + k·df, k = 0 … count−1, in cycles per day. */
export interface FrequencyGrid {
  readonly f0PerDay: number;
  readonly dfPerDay: number;
  readonly count: number;
}

/** Normalisations of the power (VanderPlas 2018, ApJS 236, 16, §7.4 gives the same four). */
export type Normalisation =
  /** p = (χ²₀ − χ²)/χ²₀ in 0…1 (ZK09 eq. 5). */
  | 'standard'
  /** (χ²₀ − χ²)/χ² = p/(1 − p), the "model" ratio. */
  | 'model'
  /** −ln(1 − p). */
  | 'log'
  /** (χ²₀ − χ²)/2 with χ² in units of the weights (equal weights: in value units² when σ are absent). */
  | 'psd';

/** Default number of grid points per peak width 1/T (VanderPlas 2018 §7.1 recommends 5–10). */
export const DEFAULT_OVERSAMPLING = 10;

/** Fewest samples a periodogram is computed for: three parameters plus at least two degrees of freedom. */
export const MIN_PERIODOGRAM_SAMPLES = 5;

/** Work units per frequency charged to the budget: one unit per 1000 sample-frequency products. */
function unitsPerFrequency(n: number): number { return Math.max(1, Math.ceil(n / 1000)); }

/** Samples prepared once: centred time and value, normalised weights. */
export interface Prepared {
  readonly n: number;
  /** Times minus the weighted mean time, days. */
  readonly t: Float64Array;
  /** Normalised weights, Σw = 1. */
  readonly w: Float64Array;
  /** w·(y − ȳ_w). */
  readonly wy: Float64Array;
  /** Σ w (y − ȳ)², the weighted variance about the mean (ZK09 eq. 10, "YY"). */
  readonly yy: number;
  /** Σ (y − ȳ)²/σ² (or Σ (y − ȳ)² for equal weights): χ² of the constant model. */
  readonly chi2Ref: number;
  /** Weighted variance of the times, days² (Baluev 2008 D_t). */
  readonly timeVarianceDays2: number;
  /** Last minus first time, days. */
  readonly spanDays: number;
  /** Weighted mean time, days (the origin of `t`). */
  readonly tMeanDays: number;
  readonly meanValue: number;
}

/**
 * Validate and centre a series.
 * @throws RangeError when lengths differ, a value is not finite, a σ is not > 0, fewer than
 *   {@link MIN_PERIODOGRAM_SAMPLES} samples are given, or all values (or all times) are equal.
 */
export function prepare(s: SampledSeries): Prepared {
  const n = s.tDays.length;
  if (s.values.length !== n) throw new RangeError(`${n} times but ${s.values.length} values`);
  if (s.sigmas && s.sigmas.length !== n) throw new RangeError(`${n} times but ${s.sigmas.length} errors`);
  if (n < MIN_PERIODOGRAM_SAMPLES) throw new RangeError(`a periodogram needs at least ${MIN_PERIODOGRAM_SAMPLES} samples, got ${n}`);
  const w = new Float64Array(n);
  let wSum = 0;
  let tMin = Infinity;
  let tMax = -Infinity;
  for (let i = 0; i < n; i++) {
    const t = s.tDays[i]!;
    const y = s.values[i]!;
    if (!Number.isFinite(t) || !Number.isFinite(y)) throw new RangeError(`sample ${i + 1} is not a finite number`);
    const sig = s.sigmas ? s.sigmas[i]! : 1;
    if (!(sig > 0) || !Number.isFinite(sig)) throw new RangeError(`error of sample ${i + 1} must be a positive number`);
    const wi = 1 / (sig * sig);
    w[i] = wi;
    wSum += wi;
    if (t < tMin) tMin = t;
    if (t > tMax) tMax = t;
  }
  let tMean = 0;
  let yMean = 0;
  for (let i = 0; i < n; i++) {
    w[i] = w[i]! / wSum;
    tMean += w[i]! * s.tDays[i]!;
    yMean += w[i]! * s.values[i]!;
  }
  const t = new Float64Array(n);
  const wy = new Float64Array(n);
  let yy = 0;
  let tVar = 0;
  let chi2Ref = 0;
  for (let i = 0; i < n; i++) {
    const dt = s.tDays[i]! - tMean;
    const dy = s.values[i]! - yMean;
    t[i] = dt;
    wy[i] = w[i]! * dy;
    yy += w[i]! * dy * dy;
    tVar += w[i]! * dt * dt;
    chi2Ref += w[i]! * wSum * dy * dy;
  }
  if (!(yy > 0)) throw new RangeError('all values are equal: there is no variation to analyse');
  if (!(tMax > tMin)) throw new RangeError('all sample times are equal');
  return { n, t, w, wy, yy, chi2Ref, timeVarianceDays2: tVar, spanDays: tMax - tMin, tMeanDays: tMean, meanValue: yMean };
}

/**
 * The ZK09 power from the weighted sums at one frequency (ZK09 eqs. 5, 8–13; centred y so Y = 0).
 * Returns 0 where the sinusoid basis is degenerate (D ≈ 0, e.g. at the sampling frequency of an even grid).
 */
function powerFromSums(sC: number, sS: number, sYC: number, sYS: number, sCC: number, sCS: number, yy: number): number {
  const cc = sCC - sC * sC;
  const ss = (1 - sCC) - sS * sS; // Σw sin² = 1 − Σw cos² since Σw = 1
  const cs = sCS - sC * sS;
  const d = cc * ss - cs * cs;
  if (!(d > 1e-14 * Math.max(cc * ss, 1e-300))) return 0;
  const p = (ss * sYC * sYC + cc * sYS * sYS - 2 * cs * sYC * sYS) / (yy * d);
  return p < 0 ? 0 : p > 1 ? 1 : p;
}

/**
 * Standard (0…1) power at one frequency, computed directly with sin/cos of every sample.
 * @param fPerDay frequency in cycles per day (> 0)
 */
export function powerAt(prep: Prepared, fPerDay: number): number {
  const omega = 2 * Math.PI * fPerDay;
  let sC = 0, sS = 0, sYC = 0, sYS = 0, sCC = 0, sCS = 0;
  for (let i = 0; i < prep.n; i++) {
    const x = omega * prep.t[i]!;
    const c = Math.cos(x);
    const s = Math.sin(x);
    const w = prep.w[i]!;
    const wy = prep.wy[i]!;
    sC += w * c; sS += w * s; sYC += wy * c; sYS += wy * s; sCC += w * c * c; sCS += w * c * s;
  }
  return powerFromSums(sC, sS, sYC, sYS, sCC, sCS, prep.yy);
}

/** Frequencies between exact re-seeds of the trigonometric recurrence (bounds round-off drift to ~1e-13). */
const RESEED_EVERY = 1024;

/**
 * Standard (0…1) power over a uniform frequency grid.
 *
 * Instead of sin/cos per (sample, frequency), each sample's phase is advanced from one frequency to
 * the next by a rotation: cos(θ+δ) = cos θ − (α cos θ + β sin θ), sin(θ+δ) = sin θ − (α sin θ − β cos θ),
 * α = 2 sin²(δ/2), β = sin δ (Press et al., Numerical Recipes, 2nd ed., 1992, eq. 5.5.6, the form
 * used by their §13.8 periodogram routine), re-seeded exactly every {@link RESEED_EVERY} frequencies.
 * Cost: about 20 floating-point operations per sample and frequency, no trigonometric calls.
 *
 * @param budget charged {@link unitsPerFrequency} units per frequency; throws LimitError/CancelledError from it.
 */
export function powerOnGrid(prep: Prepared, grid: FrequencyGrid, budget?: Budget): Float64Array {
  const { n, t, w, wy, yy } = prep;
  const out = new Float64Array(grid.count);
  // One interleaved record per sample (cos, sin, α, β, w, w·y): a single stream through memory.
  const st = new Float64Array(6 * n);
  const len = 6 * n;
  const twoPi = 2 * Math.PI;
  for (let i = 0; i < n; i++) {
    const delta = twoPi * grid.dfPerDay * t[i]!;
    const h = Math.sin(delta / 2);
    st[6 * i + 2] = 2 * h * h;
    st[6 * i + 3] = Math.sin(delta);
    st[6 * i + 4] = w[i]!;
    st[6 * i + 5] = wy[i]!;
  }
  const units = unitsPerFrequency(n);
  // Two frequencies per pass over the samples: halves the memory traffic, which dominates.
  for (let k = 0; k < grid.count; k += 2) {
    if (k % RESEED_EVERY === 0) {
      const omega = twoPi * (grid.f0PerDay + k * grid.dfPerDay);
      for (let i = 0; i < n; i++) {
        const x = omega * t[i]!;
        st[6 * i] = Math.cos(x);
        st[6 * i + 1] = Math.sin(x);
      }
    }
    budget?.tick(2 * units);
    let aC = 0, aS = 0, aYC = 0, aYS = 0, aCC = 0, aCS = 0;
    let bC = 0, bS = 0, bYC = 0, bYS = 0, bCC = 0, bCS = 0;
    for (let j = 0; j < len; j += 6) {
      const c1 = st[j]!, s1 = st[j + 1]!, al = st[j + 2]!, be = st[j + 3]!, wi = st[j + 4]!, wyi = st[j + 5]!;
      const wc1 = wi * c1;
      aC += wc1; aS += wi * s1; aYC += wyi * c1; aYS += wyi * s1; aCC += wc1 * c1; aCS += wc1 * s1;
      const c2 = c1 - (al * c1 + be * s1);
      const s2 = s1 - (al * s1 - be * c1);
      const wc2 = wi * c2;
      bC += wc2; bS += wi * s2; bYC += wyi * c2; bYS += wyi * s2; bCC += wc2 * c2; bCS += wc2 * s2;
      st[j] = c2 - (al * c2 + be * s2);
      st[j + 1] = s2 - (al * s2 - be * c2);
    }
    out[k] = powerFromSums(aC, aS, aYC, aYS, aCC, aCS, yy);
    if (k + 1 < grid.count) out[k + 1] = powerFromSums(bC, bS, bYC, bYS, bCC, bCS, yy);
  }
  return out;
}

/**
 * A uniform frequency grid covering periods [minPeriodDays, maxPeriodDays] with `oversampling`
 * points per peak width 1/T, T the time span (VanderPlas 2018, ApJS 236, 16, §7.1: the peak
 * width is ~1/T, and 5–10 points per width keep the grid from missing a peak's top).
 * @throws RangeError for non-positive or reversed periods, or a span of zero.
 */
export function frequencyGrid(spanDays: number, minPeriodDays: number, maxPeriodDays: number, oversampling = DEFAULT_OVERSAMPLING): FrequencyGrid {
  if (!(minPeriodDays > 0) || !(maxPeriodDays > minPeriodDays)) throw new RangeError('the period range must be positive and increasing');
  if (!(spanDays > 0)) throw new RangeError('the series spans no time');
  if (!(oversampling >= 1)) throw new RangeError('oversampling must be at least 1');
  const fMin = 1 / maxPeriodDays;
  const fMax = 1 / minPeriodDays;
  const dfWanted = 1 / (oversampling * spanDays);
  const count = Math.max(3, Math.ceil((fMax - fMin) / dfWanted) + 1);
  return { f0PerDay: fMin, dfPerDay: (fMax - fMin) / (count - 1), count };
}

/** Convert a standard power to another normalisation. `chi2Ref` from {@link Prepared}. */
export function normalise(pStandard: number, kind: Normalisation, chi2Ref: number): number {
  switch (kind) {
    case 'standard': return pStandard;
    case 'model': return pStandard >= 1 ? Infinity : pStandard / (1 - pStandard);
    case 'log': return pStandard >= 1 ? Infinity : -Math.log(1 - pStandard);
    case 'psd': return 0.5 * chi2Ref * pStandard;
  }
}

/**
 * ln Γ(x) for x > 0: shift x up to ≥ 10 by Γ(x) = Γ(x + k)/(x(x+1)…(x+k−1)), then Stirling's series
 * (Abramowitz & Stegun 6.1.41) through the x⁻¹³ term, coefficients B₂ₙ/(2n(2n−1)); error < 1e-14.
 */
export function lnGamma(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) throw new RangeError('lnGamma needs a finite x > 0');
  let shift = 0;
  let v = x;
  while (v < 10) { shift += Math.log(v); v += 1; }
  const inv = 1 / v;
  const inv2 = inv * inv;
  const series = inv * (1 / 12 + inv2 * (-1 / 360 + inv2 * (1 / 1260 + inv2 * (-1 / 1680 + inv2 * (1 / 1188 + inv2 * (-691 / 360360 + inv2 / 156))))));
  return (v - 0.5) * Math.log(v) - v + 0.5 * Math.log(2 * Math.PI) + series - shift;
}

/**
 * False-alarm probability of a peak of standard power `p`: the chance that white Gaussian noise
 * sampled at the same times gives a maximum at least this high anywhere in the band.
 *
 * Baluev 2008, MNRAS 385, 1279, §§2–3, for the floating-mean periodogram with the noise level
 * unknown (his z₁ = N_H·p/2, N_H = N − 1, N_K = N − 3; equation numbers from memory omitted):
 * single-frequency tail P₁ = (1 − p)^(N_K/2), the Davies-bound term
 * τ = γ_H · W · (1 − p)^((N_K − 1)/2) · √z₁ with W = Δf·T_eff, T_eff = √(4π·D_t),
 * γ_H = √(2/N_H)·Γ(N_H/2)/Γ((N_H − 1)/2), and his alias-free estimate FAP ≈ 1 − (1 − P₁)·e^(−τ).
 * Δf is the searched band's width (he takes [0, f_max]; the up-crossing count scales with width).
 * Accurate when FAP ≲ 0.1; it is an upper bound and may exceed the true value at large FAP.
 *
 * @param p standard power, 0…1
 * @param n number of samples (≥ 5)
 * @param timeVarianceDays2 weighted variance of the sample times, days²
 * @param bandwidthPerDay width of the searched frequency band, cycles per day
 * @returns probability in [0, 1]
 */
export function baluevFap(p: number, n: number, timeVarianceDays2: number, bandwidthPerDay: number): number {
  if (!(p > 0)) return 1;
  if (p >= 1) return 0;
  const nH = n - 1;
  const nK = n - 3;
  const single = Math.pow(1 - p, 0.5 * nK);
  const gammaH = Math.sqrt(2 / nH) * Math.exp(lnGamma(nH / 2) - lnGamma((nH - 1) / 2));
  const w = bandwidthPerDay * Math.sqrt(4 * Math.PI * timeVarianceDays2);
  const tau = gammaH * w * Math.pow(1 - p, 0.5 * (nK - 1)) * Math.sqrt(0.5 * nH * p);
  const fap = 1 - (1 - single) * Math.exp(-tau);
  return Math.min(1, Math.max(0, fap));
}

/** One peak of the periodogram. */
export interface Peak {
  /** Refined frequency, cycles per day. */
  readonly frequencyPerDay: number;
  readonly periodDays: number;
  /** Standard power 0…1 at the refined frequency. */
  readonly power: number;
  /** Half width at half maximum in frequency, cycles per day (read off the grid, interpolated). */
  readonly halfWidthPerDay: number;
  /** Baluev 2008 false-alarm probability of a maximum this high in the band. */
  readonly fap: number;
  /** Index of the grid point nearest the peak. */
  readonly gridIndex: number;
}

/** Least separation of two listed peaks, in peak widths 1/T. */
export const PEAK_SEPARATION_WIDTHS = 2;

/** Peaks with a false-alarm probability above this are not used to match computed periods. */
export const MATCH_MAX_FAP = 0.05;

/** Half width at half maximum around grid index k, cycles per day (linear interpolation at the crossings). */
function halfWidth(power: Float64Array, grid: FrequencyGrid, k: number): number {
  const half = power[k]! / 2;
  const side = (dir: 1 | -1): number => {
    let j = k;
    while (j + dir >= 0 && j + dir < power.length && power[j + dir]! > half) j += dir;
    const next = j + dir;
    if (next < 0 || next >= power.length) return Math.abs(j - k) * grid.dfPerDay; // runs off the band
    const frac = (power[j]! - half) / (power[j]! - power[next]!);
    return (Math.abs(j - k) + frac) * grid.dfPerDay;
  };
  const left = side(-1);
  const right = side(1);
  return 0.5 * (left + right);
}

/**
 * The `count` highest distinct local maxima: interior grid maxima, ranked by power, each at least
 * {@link PEAK_SEPARATION_WIDTHS}/T from every higher one, so that the first side lobes of a strong
 * peak (at about ±1.4/T, some 5 % of its power, for a sinc²-like spectral window) are not listed
 * as peaks of their own. Two real periods closer than that are not resolved separately.
 * Each is refined by a parabola through its three grid points and a direct evaluation there.
 */
export function findPeaks(prep: Prepared, grid: FrequencyGrid, power: Float64Array, count: number): Peak[] {
  const candidates: number[] = [];
  for (let k = 1; k < power.length - 1; k++) {
    if (power[k]! > power[k - 1]! && power[k]! >= power[k + 1]!) candidates.push(k);
  }
  candidates.sort((a, b) => power[b]! - power[a]!);
  const separationPerDay = PEAK_SEPARATION_WIDTHS / prep.spanDays;
  const bandwidth = grid.dfPerDay * (grid.count - 1);
  const out: Peak[] = [];
  for (const k of candidates) {
    if (out.length >= count) break;
    const fGrid = grid.f0PerDay + k * grid.dfPerDay;
    if (out.some((p) => Math.abs(p.frequencyPerDay - fGrid) < separationPerDay)) continue;
    const y0 = power[k - 1]!;
    const y1 = power[k]!;
    const y2 = power[k + 1]!;
    const denom = y0 - 2 * y1 + y2;
    const shift = denom < 0 ? Math.max(-0.5, Math.min(0.5, 0.5 * (y0 - y2) / denom)) : 0;
    let f = fGrid + shift * grid.dfPerDay;
    let pw = powerAt(prep, f);
    if (pw < y1) { f = fGrid; pw = y1; }
    out.push({
      frequencyPerDay: f, periodDays: 1 / f, power: pw,
      halfWidthPerDay: halfWidth(power, grid, k),
      fap: baluevFap(pw, prep.n, prep.timeVarianceDays2, bandwidth),
      gridIndex: k,
    });
  }
  return out;
}

/** A computed period set against the peaks. */
export interface PeriodMatch {
  readonly label: string;
  readonly periodDays: number;
  /** 1σ of the period, days (0 when exact). */
  readonly sigmaDays: number;
  /** Index into the peaks list of the nearest significant peak (FAP ≤ maxFap) in frequency, or −1 when none is. */
  readonly peakIndex: number;
  /** Frequency offset from that peak, cycles per day (signed: mark − peak). */
  readonly offsetPerDay: number;
  /** Tolerance used, cycles per day: √(HWHM² + (2σ_f)²). */
  readonly tolerancePerDay: number;
  readonly matched: boolean;
  /**
   * Chance that a period drawn at random, uniform in frequency over the searched band, lands within
   * tolerance of at least one significant listed peak (the union of their tolerance intervals over the
   * band width); 0 when no listed peak is significant.
   */
  readonly chance: number;
}

/**
 * Set computed periods against the significant listed peaks (FAP ≤ `maxFap`): a period that lands on
 * a peak noise could have made is no match. Null model for the chance: the computed period is
 * unrelated to the data, its frequency uniform over the searched band (stated in the result's details).
 * @param marks periods in days with 1σ in days
 */
export function matchPeriods(peaks: readonly Peak[], grid: FrequencyGrid, marks: ReadonlyArray<{ label: string; periodDays: number; sigmaDays: number }>, maxFap = MATCH_MAX_FAP): PeriodMatch[] {
  const fLo = grid.f0PerDay;
  const fHi = grid.f0PerDay + grid.dfPerDay * (grid.count - 1);
  const band = fHi - fLo;
  return marks.map((m) => {
    const f = 1 / m.periodDays;
    const sigmaF = m.sigmaDays / (m.periodDays * m.periodDays);
    const tolOf = (p: Peak): number => Math.sqrt(p.halfWidthPerDay ** 2 + (2 * sigmaF) ** 2);
    let best = -1;
    for (let j = 0; j < peaks.length; j++) {
      if (peaks[j]!.fap > maxFap) continue;
      if (best < 0 || Math.abs(f - peaks[j]!.frequencyPerDay) < Math.abs(f - peaks[best]!.frequencyPerDay)) best = j;
    }
    // Union of tolerance intervals of the significant peaks, clipped to the band.
    const intervals = peaks.filter((p) => p.fap <= maxFap).map((p) => [Math.max(fLo, p.frequencyPerDay - tolOf(p)), Math.min(fHi, p.frequencyPerDay + tolOf(p))] as const)
      .filter(([a, b]) => b > a).sort((x, y) => x[0] - y[0]);
    let covered = 0;
    let curA = -Infinity;
    let curB = -Infinity;
    for (const [a, b] of intervals) {
      if (a > curB) { if (curB > curA) covered += curB - curA; curA = a; curB = b; } else curB = Math.max(curB, b);
    }
    if (curB > curA) covered += curB - curA;
    const peak = best >= 0 ? peaks[best]! : undefined;
    const offset = peak ? f - peak.frequencyPerDay : NaN;
    const tol = peak ? tolOf(peak) : 0;
    return {
      label: m.label, periodDays: m.periodDays, sigmaDays: m.sigmaDays, peakIndex: best,
      offsetPerDay: offset, tolerancePerDay: tol, matched: peak !== undefined && Math.abs(offset) <= tol,
      chance: band > 0 ? Math.min(1, covered / band) : 0,
    };
  });
}

/**
 * Probability that at least `k` of the marks match by chance, each independently with its own
 * chance (a Poisson-binomial tail, computed exactly by recursion over the marks).
 */
export function chanceAtLeast(k: number, chances: readonly number[]): number {
  let dist = [1];
  for (const p of chances) {
    const next = new Array<number>(dist.length + 1).fill(0);
    for (let j = 0; j < dist.length; j++) {
      next[j] = next[j]! + dist[j]! * (1 - p);
      next[j + 1] = next[j + 1]! + dist[j]! * p;
    }
    dist = next;
  }
  let tail = 0;
  for (let j = k; j < dist.length; j++) tail += dist[j]!;
  return Math.min(1, tail);
}

export interface PeriodogramOptions {
  /** Shortest period searched, days; default twice the median sampling interval (a pseudo-Nyquist limit). */
  readonly minPeriodDays?: number;
  /** Longest period searched, days; default the time span. */
  readonly maxPeriodDays?: number;
  /** Grid points per peak width; default {@link DEFAULT_OVERSAMPLING}. */
  readonly oversampling?: number;
  /** How many peaks to list; default 3. */
  readonly peaks?: number;
  readonly budget?: Budget;
}

export interface Periodogram {
  readonly prepared: Prepared;
  readonly grid: FrequencyGrid;
  /** Standard power per grid frequency. */
  readonly power: Float64Array;
  readonly peaks: readonly Peak[];
  readonly minPeriodDays: number;
  readonly maxPeriodDays: number;
  /** Median interval between consecutive sorted samples, days. */
  readonly medianStepDays: number;
}

/** Median interval between consecutive (sorted) times, days. */
export function medianStep(tDays: ArrayLike<number>): number {
  const ts = Array.from(tDays).sort((a, b) => a - b);
  const steps: number[] = [];
  for (let i = 1; i < ts.length; i++) { const d = ts[i]! - ts[i - 1]!; if (d > 0) steps.push(d); }
  steps.sort((a, b) => a - b);
  if (steps.length === 0) return 0;
  const m = steps.length >> 1;
  return steps.length % 2 ? steps[m]! : 0.5 * (steps[m - 1]! + steps[m]!);
}

/**
 * Compute the periodogram of a series over a period range and list its top peaks.
 * @throws RangeError for unusable input (see {@link prepare}, {@link frequencyGrid});
 *   LimitError when the grid would exceed the budget (checked before any work), CancelledError when cancelled.
 */
export function periodogram(series: SampledSeries, options: PeriodogramOptions = {}): Periodogram {
  const prepared = prepare(series);
  const medianStepDays = medianStep(series.tDays);
  const minPeriodDays = options.minPeriodDays ?? 2 * medianStepDays;
  const maxPeriodDays = options.maxPeriodDays ?? prepared.spanDays;
  const grid = frequencyGrid(prepared.spanDays, minPeriodDays, maxPeriodDays, options.oversampling ?? DEFAULT_OVERSAMPLING);
  const budget = options.budget;
  if (budget) {
    const need = grid.count * unitsPerFrequency(prepared.n);
    const left = budget.limits.maxEvaluations - budget.evaluations;
    if (need > left) {
      throw new LimitError(`the periodogram needs ${grid.count} frequencies × ${prepared.n} samples (${need} work units), more than the ${left} left of max-evaluations`,
        'max-evaluations', 'narrow the period range (a longer shortest period needs fewer frequencies), or raise orbitNotes.limits.maxEvaluations / the CLI flag --max-evaluations');
    }
  }
  const power = powerOnGrid(prepared, grid, budget);
  const peaks = findPeaks(prepared, grid, power, options.peaks ?? 3);
  return { prepared, grid, power, peaks, minPeriodDays, maxPeriodDays, medianStepDays };
}
