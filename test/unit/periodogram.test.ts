import { strict as assert } from 'node:assert';
import type { Expr, Ident, Range, Statement } from '../../language/ast.js';
import { Code } from '../../language/diagnostics.js';
import { EvalError, type EvalContext, type Series } from '../../compute/context.js';
import { Budget, CancelledError, DEFAULT_LIMITS, LimitError } from '../../compute/limits.js';
import {
  baluevFap, chanceAtLeast, findPeaks, frequencyGrid, lnGamma, matchPeriods, normalise, periodogram,
  powerAt, powerOnGrid, prepare, type SampledSeries,
} from '../../compute/periodogram.js';
import { lookupUnit, measured, type Quantity } from '../../compute/quantity.js';
import { createRng, type Rng } from '../../compute/random.js';
import { evalPeriodogram, MAX_PLOT_POINTS, NOT_A_FORECAST, plotPoints } from '../../compute/statements/periodogram.js';

const R: Range = { start: { line: 0, character: 0 }, end: { line: 0, character: 1 } };

/** Invented sampling: uneven times over `spanDays` with seasonal gaps (a 120-day gap each 365 d). */
function gappedTimes(rng: Rng, n: number, spanDays: number): number[] {
  const t: number[] = [];
  while (t.length < n) {
    const x = rng.uniformIn(0, spanDays);
    if (x % 365 < 245) t.push(x);
  }
  return t.sort((a, b) => a - b);
}

/**
 * Generic weighted least squares by normal equations and Gaussian elimination with partial pivoting
 * (common practice): returns χ² of the best fit of Σ_j a_j·basis_j(t) to y with weights w.
 */
function leastSquaresChi2(t: readonly number[], y: readonly number[], w: readonly number[], basis: ReadonlyArray<(t: number) => number>): number {
  const m = basis.length;
  const a: number[][] = Array.from({ length: m }, () => new Array<number>(m + 1).fill(0));
  for (let i = 0; i < t.length; i++) {
    const row = basis.map((b) => b(t[i]!));
    for (let j = 0; j < m; j++) {
      for (let k = 0; k < m; k++) a[j]![k]! += w[i]! * row[j]! * row[k]!;
      a[j]![m]! += w[i]! * row[j]! * y[i]!;
    }
  }
  for (let col = 0; col < m; col++) {
    let piv = col;
    for (let r = col + 1; r < m; r++) if (Math.abs(a[r]![col]!) > Math.abs(a[piv]![col]!)) piv = r;
    [a[col], a[piv]] = [a[piv]!, a[col]!];
    for (let r = 0; r < m; r++) {
      if (r === col) continue;
      const f = a[r]![col]! / a[col]![col]!;
      for (let k = col; k <= m; k++) a[r]![k]! -= f * a[col]![k]!;
    }
  }
  const coef = a.map((row, j) => row[m]! / row[j]!);
  let chi2 = 0;
  for (let i = 0; i < t.length; i++) {
    const model = basis.reduce((s, b, j) => s + coef[j]! * b(t[i]!), 0);
    chi2 += w[i]! * (y[i]! - model) ** 2;
  }
  return chi2;
}

function numberExpr(value: number, unit: string, sigma?: number): Expr {
  return { type: 'number', value, unit, range: R, ...(sigma !== undefined ? { sigma } : {}) };
}

/** A minimal evaluation context: numbers with units, one map of series, nothing else. */
function fakeContext(series: Record<string, Series>, budget = new Budget()): EvalContext {
  return {
    calendar: 'mixed', seed: 1, budget,
    instant: () => { throw new Error('not used'); },
    value: (e: Expr): Quantity => {
      if (e.type !== 'number') throw new EvalError(Code.UnknownName, 'unknown name', e.range);
      const u = lookupUnit(e.unit ?? '');
      if (!u) throw new EvalError(Code.MissingUnit, 'unit needed', e.range);
      return measured(e.value * u.factor, (e.sigma ?? 0) * u.factor, u.dim, `n${e.value}`);
    },
    body: (id) => { throw new EvalError(Code.UnknownBody, 'no bodies here', id.range); },
    series: (id: Ident) => {
      const s = series[id.name];
      if (!s) throw new EvalError(Code.UnknownName, `unknown series \`${id.name}\``, id.range);
      return s;
    },
    readText: () => Promise.reject(new Error('not used')),
  };
}

type PgStmt = Extract<Statement, { kind: 'periodogram' }>;
const pgStmt = (target: string, extra: Partial<PgStmt> = {}): PgStmt => ({ kind: 'periodogram', target: { name: target, range: R }, range: R, ...extra });

describe('floating-mean Lomb–Scargle power', () => {
  const rng = createRng(20260);
  const t = gappedTimes(rng, 80, 900);
  const y = t.map((x) => 2.5 + 0.9 * Math.sin(2 * Math.PI * x / 41.3 + 0.7) + rng.normal() * 0.8);
  const sig = t.map(() => 0.5 + rng.uniform());

  it('equals 1 − χ²(sinusoid + offset)/χ²(mean) of a direct least-squares fit (ZK09 eqs. 4–5), equal and unequal weights', () => {
    // Oracle: an independent generic linear least-squares solve, not the closed-form sums.
    const toleranceAbs = 1e-9;
    let worst = 0;
    for (const sigmas of [undefined, sig]) {
      const s: SampledSeries = sigmas ? { tDays: t, values: y, sigmas } : { tDays: t, values: y };
      const prep = prepare(s);
      const w = t.map((_, i) => (sigmas ? 1 / sigmas[i]! ** 2 : 1));
      const chi2Mean = leastSquaresChi2(t, y, w, [() => 1]);
      const grid = frequencyGrid(prep.spanDays, 3, 600);
      const pw = powerOnGrid(prep, grid);
      for (let k = 0; k < grid.count; k += 97) {
        const f = grid.f0PerDay + k * grid.dfPerDay;
        const chi2 = leastSquaresChi2(t, y, w, [() => 1, (x) => Math.cos(2 * Math.PI * f * x), (x) => Math.sin(2 * Math.PI * f * x)]);
        const expected = 1 - chi2 / chi2Mean;
        worst = Math.max(worst, Math.abs(pw[k]! - expected), Math.abs(powerAt(prep, f) - expected));
      }
    }
    console.log(`      worst |p − p_lsq| = ${worst.toExponential(2)}`);
    assert.ok(worst < toleranceAbs, `worst ${worst}`);
  });

  it('reduces to the classical periodogram (Scargle 1982, ApJ 263, 835, eq. 10) where Σcos = Σsin = 0, and is never below it elsewhere', () => {
    // Scargle's P_X(ω) with τ from tan 2ωτ = Σ sin 2ωt / Σ cos 2ωt, written out here; GLS normalised as
    // p = 2·P_X / Σ(y − ȳ)² when the offset adds nothing (ZK09 §2: the mean and the sinusoid are then orthogonal).
    const scargle = (ts: readonly number[], ys: readonly number[], f: number): number => {
      const mean = ys.reduce((a, b) => a + b, 0) / ys.length;
      const x = ys.map((v) => v - mean);
      const om = 2 * Math.PI * f;
      let s2 = 0, c2 = 0;
      for (const ti of ts) { s2 += Math.sin(2 * om * ti); c2 += Math.cos(2 * om * ti); }
      const tau = Math.atan2(s2, c2) / (2 * om);
      let xc = 0, xs = 0, cc = 0, ss = 0, xx = 0;
      ts.forEach((ti, i) => {
        const c = Math.cos(om * (ti - tau)); const s = Math.sin(om * (ti - tau));
        xc += x[i]! * c; xs += x[i]! * s; cc += c * c; ss += s * s; xx += x[i]! ** 2;
      });
      return (xc * xc / cc + xs * xs / ss) / xx; // = 2·P_X / Σx²
    };
    const n = 64;
    const even = Array.from({ length: n }, (_, i) => i);
    const ye = even.map((x) => Math.cos(2 * Math.PI * x * 5 / n + 0.3) + rng.normal());
    const prepE = prepare({ tDays: even, values: ye });
    let worst = 0;
    for (let k = 1; k < n / 2; k++) worst = Math.max(worst, Math.abs(powerAt(prepE, k / n) - scargle(even, ye, k / n)));
    console.log(`      worst difference at Fourier frequencies = ${worst.toExponential(2)}`);
    assert.ok(worst < 1e-12);
    // Uneven sampling: the floating mean can only explain more variance than the fixed one.
    const prepU = prepare({ tDays: t, values: y });
    for (let f = 1 / 600; f < 0.3; f += 0.0031) assert.ok(powerAt(prepU, f) >= scargle(t, y, f) - 1e-12, `f = ${f}`);
  });

  it('advances phases by recurrence to the same power as direct sin/cos over more than one re-seed interval', () => {
    const prep = prepare({ tDays: t.map((x) => x + 2451545), values: y });
    const grid = { f0PerDay: 0.001, dfPerDay: 1.3e-4, count: 3001 };
    const pw = powerOnGrid(prep, grid);
    let worst = 0;
    for (let k = 0; k < grid.count; k++) worst = Math.max(worst, Math.abs(pw[k]! - powerAt(prep, grid.f0PerDay + k * grid.dfPerDay)));
    assert.ok(worst < 1e-10, `worst ${worst}`);
  });

  it('converts the standard power to the model, log and psd normalisations by their definitions', () => {
    const prep = prepare({ tDays: t, values: y });
    const p = 0.3;
    assert.equal(normalise(p, 'standard', prep.chi2Ref), 0.3);
    assert.ok(Math.abs(normalise(p, 'model', prep.chi2Ref) - 0.3 / 0.7) < 1e-15);
    assert.ok(Math.abs(normalise(p, 'log', prep.chi2Ref) + Math.log(0.7)) < 1e-15);
    const sumSq = y.reduce((a, v) => a + (v - prep.meanValue) ** 2, 0);
    assert.ok(Math.abs(normalise(p, 'psd', prep.chi2Ref) - 0.15 * sumSq) < 1e-9);
  });
});

describe('frequency grid and peaks', () => {
  it('samples each peak width 1/T at least ten times (VanderPlas 2018, ApJS 236, 16, §7.1)', () => {
    const g = frequencyGrid(1000, 2, 500);
    assert.ok(g.dfPerDay <= 1 / (10 * 1000));
    assert.ok(Math.abs(g.f0PerDay - 1 / 500) < 1e-15);
    assert.ok(Math.abs(g.f0PerDay + (g.count - 1) * g.dfPerDay - 0.5) < 1e-12);
  });

  it('recovers two periods of an invented gapped, noisy series within their peak widths', () => {
    const rng = createRng(7);
    const t = gappedTimes(rng, 220, 2400);
    const periods = [37.3, 113.0];
    const y = t.map((x) => 1.1 * Math.sin(2 * Math.PI * x / periods[0]!) + 0.8 * Math.cos(2 * Math.PI * x / periods[1]! + 1) + rng.normal());
    const pg = periodogram({ tDays: t, values: y }, { minPeriodDays: 5, maxPeriodDays: 1000, peaks: 4 });
    for (const p of periods) {
      const hit = pg.peaks.slice(0, 2).find((pk) => Math.abs(pk.frequencyPerDay - 1 / p) <= pk.halfWidthPerDay);
      assert.ok(hit, `period ${p} d not among the two top peaks: ${pg.peaks.map((k) => k.periodDays.toFixed(2)).join(', ')}`);
      console.log(`      ${p} d → ${hit.periodDays.toFixed(2)} d (HWHM ${(hit.halfWidthPerDay * p * p).toFixed(2)} d), FAP ${hit.fap.toExponential(1)}`);
      assert.ok(hit.fap < 1e-6);
    }
    // Distinct: no two listed peaks closer than two peak widths (side lobes excluded).
    for (let i = 0; i < pg.peaks.length; i++) for (let j = i + 1; j < pg.peaks.length; j++) {
      assert.ok(Math.abs(pg.peaks[i]!.frequencyPerDay - pg.peaks[j]!.frequencyPerDay) >= 2 / pg.prepared.spanDays);
    }
  });

  it('finds no significant peak in white noise', () => {
    const rng = createRng(99);
    const t = gappedTimes(rng, 150, 1500);
    const pg = periodogram({ tDays: t, values: t.map(() => rng.normal()) }, { minPeriodDays: 4, maxPeriodDays: 700, peaks: 1 });
    assert.ok(pg.peaks[0]!.fap > 0.01, `FAP ${pg.peaks[0]!.fap}`);
  });
});

describe('false-alarm probability (Baluev 2008, MNRAS 385, 1279)', () => {
  it('computes ln Γ to 1e-12 against Γ(n) = (n − 1)! and Γ(½) = √π (Abramowitz & Stegun 6.1.6, 6.1.8)', () => {
    let fact = 1;
    let worst = 0;
    for (let n = 1; n <= 25; n++) {
      if (n > 1) fact *= n - 1;
      worst = Math.max(worst, Math.abs(lnGamma(n) - Math.log(fact)) / Math.max(1, Math.log(fact)));
    }
    worst = Math.max(worst, Math.abs(lnGamma(0.5) - 0.5 * Math.log(Math.PI)), Math.abs(lnGamma(1.5) - Math.log(Math.sqrt(Math.PI) / 2)));
    assert.ok(worst < 1e-12, `worst ${worst}`);
  });

  it('matches the fraction of seeded white-noise series whose highest peak exceeds the level, at FAP 0.01–0.1', function () {
    this.timeout(120_000);
    // Monte Carlo: 3000 series of 60 Gaussian samples at fixed invented uneven times (seed 4242).
    const rng = createRng(4242);
    const n = 60;
    const trials = 3000;
    const t = Array.from({ length: n }, () => rng.uniformIn(0, 100)).sort((a, b) => a - b);
    const prep0 = prepare({ tDays: t, values: t.map(() => rng.normal()) });
    const grid = frequencyGrid(prep0.spanDays, 2, 100);
    const bandwidth = grid.dfPerDay * (grid.count - 1);
    const maxima: number[] = [];
    for (let k = 0; k < trials; k++) {
      const pw = powerOnGrid(prepare({ tDays: t, values: t.map(() => rng.normal()) }), grid);
      let m = 0;
      for (const v of pw) if (v > m) m = v;
      maxima.push(m);
    }
    maxima.sort((a, b) => b - a);
    for (const level of [0.01, 0.03, 0.1]) {
      const z = maxima[Math.round(level * trials)]!;
      const fap = baluevFap(z, n, prep0.timeVarianceDays2, bandwidth);
      // Tolerance: 3 binomial standard errors of the Monte-Carlo fraction plus 20 % (the approximation's own bias).
      const tol = 3 * Math.sqrt(level * (1 - level) / trials) + 0.2 * level;
      console.log(`      MC fraction ${level} at power ${z.toFixed(4)}: Baluev FAP ${fap.toFixed(4)} (tolerance ±${tol.toFixed(4)})`);
      assert.ok(Math.abs(fap - level) <= tol, `level ${level}: FAP ${fap}`);
    }
  });

  it('falls as the power rises and stays within 0…1', () => {
    let prev = 1;
    for (let p = 0; p <= 1; p += 0.01) {
      const f = baluevFap(p, 100, 800, 0.5);
      assert.ok(f >= 0 && f <= 1 && f <= prev + 1e-15);
      prev = f;
    }
  });
});

describe('marking computed periods against peaks', () => {
  const rng = createRng(3);
  const t = gappedTimes(rng, 200, 3000);
  const y = t.map((x) => Math.sin(2 * Math.PI * x / 90) + 0.5 * rng.normal());
  const pg = periodogram({ tDays: t, values: y }, { minPeriodDays: 10, maxPeriodDays: 1500, peaks: 3 });

  it('matches a mark on a peak and not one far from every peak, with the chance as covered band fraction', () => {
    const [on, off] = matchPeriods(pg.peaks, pg.grid, [
      { label: 'on', periodDays: 90.1, sigmaDays: 0 }, { label: 'off', periodDays: 23.456, sigmaDays: 0 },
    ]);
    assert.equal(on!.matched, true);
    assert.equal(on!.peakIndex, 0);
    const band = pg.grid.dfPerDay * (pg.grid.count - 1);
    // The listed peaks are at least 1/T apart and each tolerance is < 1/T, so intervals may touch but the
    // union is at most the sum of widths.
    const sum = pg.peaks.reduce((s, p) => s + 2 * p.halfWidthPerDay, 0);
    assert.ok(on!.chance > 0 && on!.chance <= sum / band + 1e-12);
    const nearestOff = Math.min(...pg.peaks.map((p) => Math.abs(1 / 23.456 - p.frequencyPerDay)));
    assert.equal(off!.matched, nearestOff <= pg.peaks[off!.peakIndex]!.halfWidthPerDay);
  });

  it('matches nothing to a peak that noise could have made (FAP above 0.05)', () => {
    const weak = pg.peaks.map((p, i) => (i === 0 ? { ...p, fap: 0.5 } : p));
    const [m] = matchPeriods(weak, pg.grid, [{ label: 'on', periodDays: pg.peaks[0]!.periodDays, sigmaDays: 0 }]);
    assert.notEqual(m!.peakIndex, 0);
    assert.equal(m!.matched, pg.peaks.slice(1).some((p) => p.fap <= 0.05 && Math.abs(p.frequencyPerDay - pg.peaks[0]!.frequencyPerDay) <= p.halfWidthPerDay));
    const [none] = matchPeriods(weak.map((p) => ({ ...p, fap: 0.9 })), pg.grid, [{ label: 'on', periodDays: 90, sigmaDays: 0 }]);
    assert.deepEqual([none!.peakIndex, none!.matched, none!.chance], [-1, false, 0]);
  });

  it('widens the tolerance with the mark’s uncertainty', () => {
    const [a, b] = matchPeriods(pg.peaks, pg.grid, [
      { label: 'a', periodDays: 97, sigmaDays: 0 }, { label: 'b', periodDays: 97, sigmaDays: 5 },
    ]);
    assert.ok(b!.tolerancePerDay > a!.tolerancePerDay);
    assert.ok(b!.chance >= a!.chance);
  });

  it('gives the binomial tail for equal chances (Poisson-binomial reduces to the binomial)', () => {
    // P(X ≥ 2), X ~ Binomial(4, 0.1) = 1 − 0.9⁴ − 4·0.1·0.9³ = 0.0523
    assert.ok(Math.abs(chanceAtLeast(2, [0.1, 0.1, 0.1, 0.1]) - 0.0523) < 1e-12);
    assert.equal(chanceAtLeast(0, [0.3]), 1);
  });

  it('keeps findPeaks at the grid maxima when refinement would not improve them', () => {
    const peaks = findPeaks(pg.prepared, pg.grid, pg.power, 3);
    for (const p of peaks) assert.ok(p.power >= pg.power[p.gridIndex]! - 1e-15);
  });
});

describe('the periodogram statement', () => {
  const rng = createRng(11);
  // Invented: a yearly-sampled index with an 11.2-year cycle over 200 years.
  const years = Array.from({ length: 200 }, (_, i) => 1800 + i + 0.3 * rng.uniform());
  const series: Series = {
    name: 'index', tDays: years.map((yr) => yr * 365.25),
    values: years.map((yr) => 50 + 30 * Math.sin(2 * Math.PI * yr / 11.2) + 10 * rng.normal()),
    source: 'index.csv (digest 0)',
  };

  it('summarises the top peak in years with power and FAP, lists peaks, and cautions that a cycle is not a forecast', () => {
    const r = evalPeriodogram(pgStmt('index', { periods: { from: numberExpr(3, 'yr'), to: numberExpr(60, 'yr') }, peaks: 4 }), fakeContext({ index: series }));
    assert.match(r.summary, /^top peak 11\.\d+ yr \(power 0\.\d\d, FAP [^)]+\)/);
    assert.equal(r.tables[0]!.rows.length, 4);
    assert.ok(r.cautions.includes(NOT_A_FORECAST));
    const plot = r.plots![0]!;
    assert.equal(plot.kind, 'periodogram');
    assert.equal(plot.xLog, true);
    assert.equal(plot.series[0]!.x.length, plot.series[0]!.y.length);
  });

  it('marks computed periods with match and chance, and puts them on the plot', () => {
    const r = evalPeriodogram(pgStmt('index', { periods: { from: numberExpr(3, 'yr'), to: numberExpr(60, 'yr') }, mark: [numberExpr(11.1, 'yr', 0.1), numberExpr(0.0333, '/yr')] }), fakeContext({ index: series }));
    const marks = r.tables[1]!;
    assert.deepEqual(marks.rows.map((row) => row[5]), ['yes', 'no']);
    assert.match(r.summary, /1 of 2 marked periods match a significant peak \(chance /);
    assert.deepEqual(r.plots![0]!.markers!.map((m) => m.label), ['11.1 yr ± 0.1', '0.0333 /yr']);
  });

  it('rejects a mark that is not a time or frequency, naming what would be right', () => {
    assert.throws(() => evalPeriodogram(pgStmt('index', { mark: [numberExpr(30, 'deg')] }), fakeContext({ index: series })),
      (e: unknown) => e instanceof EvalError && e.code === Code.DimensionMismatch && /period \(a time/.test(e.message));
  });

  it('reports an unknown series through the context and a too-short one at the name', () => {
    assert.throws(() => evalPeriodogram(pgStmt('nope'), fakeContext({})), (e: unknown) => e instanceof EvalError && e.code === Code.UnknownName);
    const short: Series = { name: 's', tDays: [1, 2, 3, 4], values: [1, 2, 1, 2], source: 'x' };
    assert.throws(() => evalPeriodogram(pgStmt('s'), fakeContext({ s: short })), (e: unknown) => e instanceof EvalError && e.code === Code.OutOfRange && /at least 5/.test(e.message));
  });

  it('stops with a limit error before computing a grid larger than the budget allows', () => {
    const small = new Budget({ ...DEFAULT_LIMITS, maxEvaluations: 500 });
    assert.throws(() => evalPeriodogram(pgStmt('index', { periods: { from: numberExpr(2.1, 'yr'), to: numberExpr(100, 'yr') } }), fakeContext({ index: series }, small)),
      (e: unknown) => e instanceof LimitError && e.limit === 'max-evaluations');
    assert.equal(small.evaluations, 0);
  });

  it('can be cancelled while computing', () => {
    let calls = 0;
    const budget = new Budget(DEFAULT_LIMITS, { isCancelled: () => ++calls > 1 });
    assert.throws(() => evalPeriodogram(pgStmt('index', { periods: { from: numberExpr(2.1, 'yr'), to: numberExpr(100, 'yr') } }), fakeContext({ index: series }, budget)),
      (e: unknown) => e instanceof CancelledError);
  });

  it('thins a long curve for the plot but keeps the highest power', () => {
    const power = new Float64Array(123_457).map((_, k) => (k === 77_777 ? 0.9 : 0.1 + 0.05 * Math.sin(k)));
    const { x, y } = plotPoints(power, 0.001, 1e-6, 365.25);
    assert.ok(y.length <= MAX_PLOT_POINTS && y.length === x.length);
    assert.equal(Math.max(...y), 0.9);
    assert.ok(Math.abs(x[y.indexOf(0.9)]! - 1 / (0.001 + 77_777e-6) / 365.25) < 1e-12);
  });

  it('warns when the period range runs below twice the sampling step or beyond the span', () => {
    const r = evalPeriodogram(pgStmt('index', { periods: { from: numberExpr(1.2, 'yr'), to: numberExpr(300, 'yr') } }), fakeContext({ index: series }));
    assert.equal(r.warnings?.length, 2);
  });
});
