import { strict as assert } from 'node:assert';
import {
  add, div, exact, formatQuantity, measured, mul, neg, reciprocal, sigmaOf, toJson, type Quantity,
} from '../../compute/quantity.js';
import { createRng } from '../../compute/random.js';

const km = { name: 'km', dim: 'length' as const, factor: 1 };

describe('first-order uncertainty propagation', () => {
  it('adds independent uncertainties in quadrature for a sum (GUM, JCGM 100:2008, eq. 10)', () => {
    const a = measured(10, 0.3, 'time', 'a');
    const b = measured(4, 0.4, 'time', 'b');
    assert.ok(Math.abs(sigmaOf(add(a, b)) - 0.5) < 1e-15);
    assert.ok(Math.abs(sigmaOf(add(a, b, -1)) - 0.5) < 1e-15);
  });

  it('adds relative uncertainties in quadrature for a product and a quotient (GUM eq. 12)', () => {
    const a = measured(20, 0.2, 'none', 'a'); // 1 %
    const b = measured(5, 0.1, 'time', 'b'); // 2 %
    const rel = Math.sqrt(0.01 ** 2 + 0.02 ** 2);
    const p = mul(a, b);
    const q = div(a, b);
    assert.ok(Math.abs(sigmaOf(p) / p.value - rel) < 1e-15);
    assert.ok(Math.abs(sigmaOf(q) / q.value - rel) < 1e-15);
  });

  it('treats the same input used twice as fully correlated (GUM eq. 16 with r = 1)', () => {
    const a = measured(7, 0.5, 'time', 'a');
    const zero = add(a, a, -1);
    assert.equal(zero.value, 0);
    assert.equal(sigmaOf(zero), 0);
    assert.ok(Math.abs(sigmaOf(add(a, a)) - 1.0) < 1e-15);
    // x·x: σ = 2|x|σ_x, not √2·|x|σ_x.
    const x = measured(7, 0.5, 'none', 'x');
    const sq = mul(x, x);
    assert.ok(Math.abs(sigmaOf(sq) - 2 * 7 * 0.5) < 1e-12);
    assert.equal(sigmaOf(add(a, neg(a))), 0);
  });

  it('gives σ_f = σ_P / P² for a frequency from a period', () => {
    const f = reciprocal(measured(4, 0.02, 'time', 'p'));
    assert.equal(f.dim, 'frequency');
    assert.ok(Math.abs(sigmaOf(f) - 0.02 / 16) < 1e-18);
  });

  it('matches a seeded Monte-Carlo propagation of distributions (JCGM 101:2008) for (a − b)/c + b·c, where b enters twice, within the numerical tolerance of two significant digits', () => {
    const a = measured(50, 0.4, 'none', 'a');
    const b = measured(20, 0.3, 'none', 'b');
    const c = measured(8, 0.05, 'none', 'c');
    const y: Quantity = add(div(add(a, b, -1), c), mul(b, c), 1);
    const rng = createRng(2008);
    const draws = 200_000;
    let s1 = 0, s2 = 0;
    for (let i = 0; i < draws; i++) {
      const av = 50 + 0.4 * rng.normal();
      const bv = 20 + 0.3 * rng.normal();
      const cv = 8 + 0.05 * rng.normal();
      const v = (av - bv) / cv + bv * cv;
      s1 += v; s2 += v * v;
    }
    const mean = s1 / draws;
    const sd = Math.sqrt((s2 - draws * mean * mean) / (draws - 1));
    const u = sigmaOf(y);
    // JCGM 101 §7.9.2: u to two significant digits as c × 10^l gives δ = ½·10^l.
    const tolerance = 0.5 * 10 ** (Math.floor(Math.log10(u)) - 1);
    console.log(`      first order σ ${u.toFixed(4)}, Monte Carlo ${sd.toFixed(4)}, tolerance ${tolerance}`);
    assert.ok(Math.abs(u - sd) <= tolerance, `${u} vs ${sd}`);
  });
});

describe('formatting with uncertainty', () => {
  it('shows the GUM 7.2.2 worked value 100.021 47 with u = 0.000 35 as two significant digits of uncertainty (from memory)', () => {
    assert.equal(formatQuantity(measured(100.02147, 0.00035, 'length', 'm'), km), '100.02147 ± 0.00035 km');
  });

  it('rounds the value to the last digit of a two-digit uncertainty', () => {
    assert.equal(formatQuantity(measured(583.92361, 0.0123, 'time', 's'), { name: 'd', dim: 'time', factor: 1 }), '583.924 ± 0.012 d');
  });

  it('prints seven significant digits for exact values', () => {
    assert.equal(formatQuantity(exact(583.923612, 'time'), { name: 'd', dim: 'time', factor: 1 }), '583.9236 d');
  });

  it('gives number, unit and uncertainty in the display unit for JSON', () => {
    const q = measured(2 * 365.25, 0.5 * 365.25, 'time', 'x');
    assert.deepEqual(toJson(q), { number: 2, unit: 'yr', uncertainty: 0.5 });
  });
});
