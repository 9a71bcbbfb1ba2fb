import { strict as assert } from 'node:assert';
import type { Expr, Range, Statement } from '../../language/ast.js';
import { Code } from '../../language/diagnostics.js';
import { EvalError, type BuiltinBody, type EvalContext, type ResolvedBody } from '../../compute/context.js';
import { Budget } from '../../compute/limits.js';
import { exact, lookupUnit, measured, mul, sigmaOf, type Quantity } from '../../compute/quantity.js';
import { createRng } from '../../compute/random.js';
import { evalSynodic } from '../../compute/statements/synodic.js';
import { intervalStats, synodicPeriod } from '../../compute/synodic.js';

const R: Range = { start: { line: 0, character: 0 }, end: { line: 0, character: 1 } };
const num = (value: number, unit: string, sigma?: number): Expr => ({ type: 'number', value, unit, ...(sigma !== undefined ? { sigma } : {}), range: R });
const name = (n: string): Expr => ({ type: 'name', name: n, range: R });

/**
 * NASA Goddard planetary fact sheet (nssdc.gsfc.nasa.gov/planetary/factsheet), "Orbital period
 * (days)" and "Synodic period (days)" rows, from memory.
 */
const FACT_SHEET: ReadonlyArray<{ planet: string; siderealDays: number; synodicDays: number }> = [
  { planet: 'mercury', siderealDays: 87.969, synodicDays: 115.88 },
  { planet: 'venus', siderealDays: 224.701, synodicDays: 583.92 },
  { planet: 'mars', siderealDays: 686.980, synodicDays: 779.94 },
  { planet: 'jupiter', siderealDays: 4332.589, synodicDays: 398.88 },
  { planet: 'saturn', siderealDays: 10759.22, synodicDays: 378.09 },
  { planet: 'uranus', siderealDays: 30685.4, synodicDays: 369.66 },
  { planet: 'neptune', siderealDays: 60189, synodicDays: 367.49 },
  { planet: 'pluto', siderealDays: 90560, synodicDays: 366.73 },
];
const EARTH_SIDEREAL_DAYS = 365.256;

/** Bodies with periods only (the fixture's own table) and numbers with units; each literal an independent input. */
function context(bodies: Record<string, ResolvedBody> = {}): EvalContext {
  let id = 0;
  return {
    calendar: 'mixed', seed: 1, budget: new Budget(),
    instant: () => { throw new Error('not used'); },
    value: (e: Expr): Quantity => {
      if (e.type !== 'number') throw new EvalError(Code.UnknownName, `unknown name`, e.range);
      const u = lookupUnit(e.unit ?? 'd')!;
      return measured(e.value * u.factor, (e.sigma ?? 0) * u.factor, u.dim, `lit${++id}`);
    },
    body: (x) => {
      const b = 'name' in x && typeof x.name === 'string' ? bodies[x.name] : undefined;
      if (!b) throw new EvalError(Code.UnknownBody, 'unknown body', x.range);
      return b;
    },
    series: () => { throw new Error('not used'); },
    readText: () => Promise.reject(new Error('not used')),
  };
}
const builtin = (id: BuiltinBody, days: number): ResolvedBody => ({ kind: 'builtin', id, name: id, period: exact(days, 'time') });

describe('synodic period', () => {
  it('reproduces the fact sheet synodic periods from its sidereal periods within 0.01 d', () => {
    const toleranceDays = 0.01;
    let worst = 0;
    for (const row of FACT_SHEET) {
      const s = synodicPeriod(exact(row.siderealDays, 'time'), exact(EARTH_SIDEREAL_DAYS, 'time')).value;
      const err = Math.abs(s - row.synodicDays);
      worst = Math.max(worst, err);
      assert.ok(err <= toleranceDays, `${row.planet}: ${s.toFixed(3)} d, sheet ${row.synodicDays} d`);
    }
    console.log(`      worst error against the fact sheet: ${worst.toFixed(4)} d`);
  });

  it('is symmetric and accepts mean motions as frequencies', () => {
    const a = exact(224.701, 'time');
    const b = exact(365.256, 'time');
    assert.equal(synodicPeriod(a, b).value, synodicPeriod(b, a).value);
    const fa = exact(1 / 224.701, 'frequency');
    assert.ok(Math.abs(synodicPeriod(fa, b).value - synodicPeriod(a, b).value) < 1e-9);
  });

  it('refuses equal periods (an infinite synodic period)', () => {
    assert.throws(() => synodicPeriod(exact(100, 'time'), exact(100, 'time')), RangeError);
  });

  it('agrees with a seeded Monte-Carlo propagation of distributions (JCGM 101:2008) to within its numerical tolerance', () => {
    // Inputs N(μ, σ²), independent; the model is S = 1/|1/Pa − 1/Pb| (the function under test
    // evaluated on exact inputs, already checked against the fact sheet above).
    const pa = measured(224.701, 0.5, 'time', 'pa');
    const pb = measured(365.256, 0.3, 'time', 'pb');
    const s = synodicPeriod(pa, pb);
    const rng = createRng(101);
    const draws = 200_000;
    let sum = 0, sum2 = 0;
    for (let i = 0; i < draws; i++) {
      const v = synodicPeriod(exact(224.701 + 0.5 * rng.normal(), 'time'), exact(365.256 + 0.3 * rng.normal(), 'time')).value;
      sum += v; sum2 += v * v;
    }
    const mean = sum / draws;
    const sdMc = Math.sqrt((sum2 - draws * mean * mean) / (draws - 1));
    // JCGM 101 §7.9.2: with u to two significant digits written c × 10^l, the numerical tolerance is δ = ½·10^l.
    const u = sigmaOf(s);
    const toleranceDays = 0.5 * 10 ** (Math.floor(Math.log10(u)) - 1);
    console.log(`      σ first order ${u.toFixed(4)} d, Monte Carlo ${sdMc.toFixed(4)} d, tolerance ${toleranceDays} d`);
    assert.ok(Math.abs(u - sdMc) <= toleranceDays, `σ: ${u} vs ${sdMc}`);
    assert.ok(Math.abs(s.value - mean) <= 2 * toleranceDays, `mean: ${s.value} vs ${mean}`);
  });

  it('treats the same input used twice as fully correlated, as a Monte Carlo with shared draws does', () => {
    // Pb = 2·Pa exactly: S = 2·Pa, so σ_S = 2σ_a. Independent treatment would give √20·σ_a.
    const pa = measured(100, 0.2, 'time', 'shared');
    const s = synodicPeriod(pa, mul(exact(2, 'none'), pa));
    assert.ok(Math.abs(s.value - 200) < 1e-9);
    assert.ok(Math.abs(sigmaOf(s) - 0.4) < 1e-12, `σ = ${sigmaOf(s)}`);
    const rng = createRng(7);
    let sum = 0, sum2 = 0;
    const draws = 50_000;
    for (let i = 0; i < draws; i++) {
      const x = 100 + 0.2 * rng.normal();
      const v = synodicPeriod(exact(x, 'time'), exact(2 * x, 'time')).value;
      sum += v; sum2 += v * v;
    }
    const m = sum / draws;
    const sd = Math.sqrt((sum2 - draws * m * m) / (draws - 1));
    assert.ok(Math.abs(sd - 0.4) < 0.01, `Monte Carlo σ ${sd}`);
  });
});

describe('interval statistics', () => {
  it('gives mean, sample standard deviation, min and max of successive gaps', () => {
    // Gaps 2, 4, 4, 4, 5, 5, 7, 9: mean 5, sample s.d. √(32/7) (a textbook data set; common practice).
    const times = [0, 2, 6, 10, 14, 19, 24, 31, 40];
    const st = intervalStats(times)!;
    assert.equal(st.intervals, 8);
    assert.equal(st.meanDays, 5);
    assert.ok(Math.abs(st.spreadDays - Math.sqrt(32 / 7)) < 1e-12);
    assert.deepEqual([st.minDays, st.maxDays], [2, 9]);
  });

  it('needs two events and ascending times', () => {
    assert.equal(intervalStats([1]), undefined);
    assert.throws(() => intervalStats([3, 2]), RangeError);
  });
});

describe('the synodic statement', () => {
  type SynStmt = Extract<Statement, { kind: 'synodic' }>;
  const stmt = (a: Expr, b: Expr): SynStmt => ({ kind: 'synodic', a, b, range: R });

  it('reads body names as their periods and gives the value, formula, inputs and the actual 1900–2100 intervals', () => {
    const ctx = context({ venus: builtin('venus', 224.701), earth: builtin('earth', 365.256) });
    const r = evalSynodic(stmt(name('venus'), name('earth')), ctx);
    assert.ok(r.value && Math.abs(r.value.number - 583.92) < 0.01 && r.value.unit === 'd');
    assert.match(r.summary, /^S = 583\.92\d* d \(1\.598\d* yr\) · actual 1900–2100: mean 583\.9/);
    assert.ok(r.details.some((d) => /1\/S = \|1\/Pa − 1\/Pb\|/.test(d)));
    assert.match(r.provenance.frame ?? '', /heliocentric/);
  });

  it('gives a mean interval between actual conjunctions equal to the fact-sheet synodic period within 0.5 d (Venus–Earth, Earth–Mars, 1900–2100)', () => {
    // The mean is (last − first)/intervals: the end events' offsets from the mean schedule
    // (up to ~20 d for Mars, eccentricity 0.09) over ~90 intervals allow ~0.4 d.
    const toleranceDays = 0.5;
    const ctx = context({ venus: builtin('venus', 224.701), earth: builtin('earth', 365.256), mars: builtin('mars', 686.98) });
    let worst = 0;
    for (const [a, b, sheet] of [['venus', 'earth', 583.92], ['earth', 'mars', 779.94]] as const) {
      const r = evalSynodic(stmt(name(a), name(b)), ctx);
      const mean = Number(r.tables[1]!.rows.find((row) => row[0] === 'mean interval')![1]!.replace(' d', ''));
      worst = Math.max(worst, Math.abs(mean - sheet));
      assert.ok(Math.abs(mean - sheet) <= toleranceDays, `${a}–${b}: mean ${mean} d, sheet ${sheet} d`);
    }
    console.log(`      worst |mean interval − fact-sheet synodic period|: ${worst.toFixed(3)} d`);
  });

  it('spans the commonly quoted 764 to 810 days between Earth–Mars conjunctions (oppositions) within 2 d (from memory; common practice, no single source)', () => {
    const toleranceDays = 2;
    const ctx = context({ earth: builtin('earth', 365.256), mars: builtin('mars', 686.98) });
    const r = evalSynodic(stmt(name('earth'), name('mars')), ctx);
    const get = (label: string): number => Number(r.tables[1]!.rows.find((row) => row[0] === label)![1]!.replace(' d', ''));
    assert.ok(Math.abs(get('shortest') - 764) <= toleranceDays, `shortest ${get('shortest')}`);
    assert.ok(Math.abs(get('longest') - 810) <= toleranceDays, `longest ${get('longest')}`);
  });

  it('takes periods with uncertainties and propagates them', () => {
    // Kepler-223 b and c (Mills et al. 2016, Nature 533, 509; from memory), invented uncertainties.
    const r = evalSynodic(stmt(num(7.3845, 'd', 0.0002), num(9.8456, 'd', 0.0003)), context());
    const pa = measured(7.3845, 0.0002, 'time', 'x');
    const pb = measured(9.8456, 0.0003, 'time', 'y');
    const s = synodicPeriod(pa, pb);
    assert.ok(r.value);
    assert.ok(Math.abs(r.value.number - s.value) < 1e-9);
    assert.ok(Math.abs(r.value.uncertainty - sigmaOf(s)) < 1e-9);
  });

  it('takes a mean motion in deg/d as a period', () => {
    const r = evalSynodic(stmt(num(360 / 224.701, 'deg/d'), num(365.256, 'd')), context());
    assert.ok(r.value && Math.abs(r.value.number - 583.92) < 0.01);
  });

  it('reports equal periods as out of range', () => {
    assert.throws(() => evalSynodic(stmt(num(10, 'd'), num(10, 'd')), context()), (e: unknown) => e instanceof EvalError && e.code === Code.OutOfRange && /same period/.test(e.message));
  });

  it('asks for an ephemeris when a span is given for a body without one', () => {
    const ctx = context({ kb: { kind: 'user', name: 'kb', period: exact(7.3845, 'time') }, earth: builtin('earth', 365.256) });
    const day = { form: 'jd' as const, jd: 2451545, scale: 'TT' as const, text: 'JD 2451545', range: R };
    const s: SynStmt = { ...stmt(name('kb'), name('earth')), span: { from: day, to: { ...day, jd: 2451645 } } };
    assert.throws(() => evalSynodic(s, ctx), (e: unknown) => e instanceof EvalError && e.code === Code.NoEphemeris && /kb/.test(e.message));
  });
});
