import { strict as assert } from 'node:assert';
import type { Expr, Range, Statement } from '../../language/ast.js';
import { Code } from '../../language/diagnostics.js';
import { EvalError, type EvalContext } from '../../compute/context.js';
import { Budget, LimitError } from '../../compute/limits.js';
import { exact, lookupUnit, measured, sigmaOf, type Quantity } from '../../compute/quantity.js';
import { createRng } from '../../compute/random.js';
import { analyseRatio, continuedFraction, fareyChance, nearestFraction } from '../../compute/ratio.js';
import { evalRatio } from '../../compute/statements/ratio.js';

const R: Range = { start: { line: 0, character: 0 }, end: { line: 0, character: 1 } };
const num = (value: number, unit: string, sigma?: number): Expr => ({ type: 'number', value, unit, ...(sigma !== undefined ? { sigma } : {}), range: R });

/** Numbers with units only; every literal is its own independent input. */
function numbersOnly(): EvalContext {
  let id = 0;
  return {
    calendar: 'mixed', seed: 1, budget: new Budget(),
    instant: () => { throw new Error('not used'); },
    value: (e: Expr): Quantity => {
      if (e.type !== 'number') throw new EvalError(Code.UnknownName, 'unknown name', e.range);
      const u = e.unit === undefined ? { factor: 1, dim: 'none' as const } : lookupUnit(e.unit)!;
      return measured(e.value * u.factor, (e.sigma ?? 0) * u.factor, u.dim, `lit${++id}`);
    },
    body: (x) => { throw new EvalError(Code.UnknownBody, 'no bodies here', x.range); },
    series: () => { throw new Error('not used'); },
    readText: () => Promise.reject(new Error('not used')),
  };
}

const pq = (fs: ReadonlyArray<{ p: number; q: number }>): string[] => fs.map((f) => `${f.p}/${f.q}`);

describe('continued-fraction convergents of textbook constants', () => {
  it('gives 3, 22/7, 333/106, 355/113, 103993/33102 for π (OEIS A002485 / A002486, from memory)', () => {
    assert.deepEqual(pq(continuedFraction(Math.PI, 33102).convergents), ['3/1', '22/7', '333/106', '355/113', '103993/33102']);
    assert.deepEqual(continuedFraction(Math.PI, 33102).terms, [3, 7, 15, 1, 292]);
  });

  it('stops π at 355/113 when the denominator bound is 33101', () => {
    assert.deepEqual(pq(continuedFraction(Math.PI, 33101).convergents), ['3/1', '22/7', '333/106', '355/113']);
  });

  it('gives the Pell convergents 1, 3/2, 7/5, 17/12, 41/29, 99/70, 239/169 for √2 (Hardy & Wright ch. 10, [1; 2, 2, …]; OEIS A001333 / A000129, from memory)', () => {
    const cf = continuedFraction(Math.SQRT2, 169);
    assert.deepEqual(pq(cf.convergents), ['1/1', '3/2', '7/5', '17/12', '41/29', '99/70', '239/169']);
    assert.deepEqual(cf.terms, [1, 2, 2, 2, 2, 2, 2]);
  });

  it('gives 2, 3, 8/3, 11/4, 19/7, 87/32, 106/39, 193/71 for e ([2; 1, 2, 1, 1, 4, 1, 1, …]; OEIS A007676 / A007677, from memory)', () => {
    const cf = continuedFraction(Math.E, 71);
    assert.deepEqual(pq(cf.convergents), ['2/1', '3/1', '8/3', '11/4', '19/7', '87/32', '106/39', '193/71']);
    assert.deepEqual(cf.terms, [2, 1, 2, 1, 1, 4, 1, 1]);
  });

  it('gives ratios of consecutive Fibonacci numbers for the golden ratio, all partial quotients 1 (Khinchin, Continued Fractions, §1; from memory)', () => {
    const phi = (1 + Math.sqrt(5)) / 2;
    const cf = continuedFraction(phi, 10_000);
    const fib = [1, 1];
    while (fib[fib.length - 1]! <= 10_000) fib.push(fib[fib.length - 1]! + fib[fib.length - 2]!);
    // Fₙ₊₁/Fₙ for every Fₙ ≤ 10 000: 1/1, 2/1, 3/2, 5/3, …
    const expected = fib.slice(0, -1).filter((q) => q <= 10_000).map((q, i) => `${fib[i + 1]!}/${q}`);
    assert.deepEqual(pq(cf.convergents), expected);
    assert.ok(cf.terms.every((a) => a === 1));
  });

  it('ends the expansion of a rational number exactly (3/2 = [1; 2])', () => {
    assert.deepEqual(continuedFraction(1.5, 1000), { terms: [1, 2], convergents: [{ p: 1, q: 1 }, { p: 3, q: 2 }] });
  });
});

describe('nearest fraction with a bounded denominator', () => {
  it('finds 355/113 as the best approximation of π with q ≤ 1000 and 22/7 with q ≤ 50', () => {
    const a = nearestFraction(Math.PI, 1000);
    assert.deepEqual([a.p, a.q], [355, 113]);
    const b = nearestFraction(Math.PI, 50);
    assert.deepEqual([b.p, b.q], [22, 7]);
  });

  it('prefers the smaller denominator among equal fractions', () => {
    const a = nearestFraction(1.5, 10);
    assert.deepEqual([a.p, a.q, a.distance], [3, 2, 0]);
  });
});

describe('chance of a random ratio lying as close to a small fraction', () => {
  it('matches the hand count for N = 3 (Farey fractions 0, 1/3, 1/2, 2/3, 1; every gap wider than 2δ)', () => {
    // δ = 0.01: four gaps each covered by 2δ: 4 × 0.02.
    assert.ok(Math.abs(fareyChance(0.01, 3) - 0.08) < 1e-15);
  });

  it('reaches 1 when δ is half the widest Farey gap', () => {
    assert.equal(fareyChance(0.5, 1), 1);
    assert.equal(fareyChance(1 / 4, 2), 1);
  });

  it('agrees with a seeded simulation of the same null model within 4 binomial standard errors, with and without overlapping intervals', () => {
    const rng = createRng(20_260_101);
    const trials = 200_000;
    let worstZ = 0;
    // The last three have 2δ wider than the narrowest Farey gaps (1/90, 1/30, 1/110), so intervals overlap.
    for (const [n, delta] of [[10, 0.004], [7, 0.011], [10, 0.03], [6, 0.05], [11, 0.007]] as const) {
      let hits = 0;
      for (let t = 0; t < trials; t++) if (nearestFraction(1 + rng.uniform(), n).distance <= delta) hits++;
      const p = fareyChance(delta, n);
      const se = Math.sqrt((p * (1 - p)) / trials);
      const z = Math.abs(hits / trials - p) / se;
      worstZ = Math.max(worstZ, z);
      assert.ok(z < 4, `N=${n}, δ=${delta}: analytic ${p}, simulated ${hits / trials}, z = ${z.toFixed(2)}`);
    }
    console.log(`      worst |z| between analytic and simulated chance: ${worstZ.toFixed(2)}`);
  });

  it('refuses a denominator bound above the limit, naming it', () => {
    assert.throws(() => fareyChance(0.01, 5000), (e: unknown) => e instanceof LimitError && e.limit === 'up-to');
  });
});

describe('ratio analysis', () => {
  it('finds Neptune–Pluto near 3:2 from NASA fact-sheet sidereal periods (60189 d, 90560 d; from memory) and carries the uncertainty to the offset', () => {
    const ratio = { ...exact(90560 / 60189, 'none'), contrib: new Map([['pluto', 0.001]]) };
    const an = analyseRatio(ratio, 10);
    assert.deepEqual([an.nearest.p, an.nearest.q], [3, 2]);
    assert.ok(Math.abs(an.offset.value - (90560 / 60189 / 1.5 - 1)) < 1e-15);
    assert.ok(Math.abs(sigmaOf(an.offset) - 0.001 / 1.5) < 1e-15);
    assert.match(an.nullModel, /uniform in \[1, 2\)/);
  });
});

describe('the ratio statement', () => {
  type RatioStmt = Extract<Statement, { kind: 'ratio' }>;
  const stmt = (a: Expr, b: Expr, upTo?: number): RatioStmt => ({ kind: 'ratio', a, b, range: R, ...(upTo !== undefined ? { upTo } : {}) });

  it('quotes the longer over the shorter period and reports the nearest p:q, offset, chance and caution', () => {
    // Kepler-223 c and b (Mills et al. 2016, Nature 533, 509; from memory): 9.8456 d / 7.3845 d ≈ 4:3.
    const r = evalRatio(stmt(num(7.3845, 'd', 0.0001), num(9.8456, 'd', 0.0001)), numbersOnly());
    assert.match(r.summary, /^P\(9\.8456 d ± 0\.0001\) \/ P\(7\.3845 d ± 0\.0001\) = 1\.33/);
    assert.match(r.summary, /nearest 4:3/);
    assert.ok(r.value && Math.abs(r.value.number - 9.8456 / 7.3845) < 1e-12);
    assert.ok(r.value.uncertainty > 0);
    assert.ok(r.cautions.some((c) => /not evidence of a physical resonance/.test(c)));
    assert.ok(r.details.some((d) => /Null model: ratio uniform in \[1, 2\)/.test(d)));
    const conv = r.tables[1]!;
    assert.deepEqual(conv.rows.map((row) => row[0]), ['1:1', '4:3']);
  });

  it('rejects an up-to outside 1 … 1000 with the range of allowed values', () => {
    assert.throws(() => evalRatio(stmt(num(1, 'd'), num(2, 'd'), 0), numbersOnly()), (e: unknown) => e instanceof EvalError && e.code === Code.OutOfRange && /1 to 1000/.test(e.message));
  });

  it('asks for a unit when an operand is a plain number', () => {
    assert.throws(() => evalRatio(stmt({ type: 'number', value: 3, range: R }, num(2, 'd')), numbersOnly()), (e: unknown) => e instanceof EvalError && e.code === Code.MissingUnit);
  });
});
