import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import { findAlignments, scanAlignments, smallestArc, spreadRateBound, type AlignmentBody } from '../../compute/alignment.js';
import { findConjunctions } from '../../compute/conjunctions.js';
import { astronomyEngine, type PositionBody } from '../../compute/ephemeris.js';
import { Budget, DEFAULT_LIMITS, LimitError } from '../../compute/limits.js';
import { createNoteEvaluator, type NoteEvaluation } from '../../compute/note.js';
import { ephemerisAlignmentBodies } from '../../compute/statements/alignment.js';
import { instantFromCalendar } from '../../compute/time.js';
import { createRequire } from 'node:module';
import type { VsopPlanet } from './fullVsop87.js';

const DEG = Math.PI / 180;
const TWO_PI = 2 * Math.PI;

/**
 * A synthetic body on a circular orbit (uniform longitude), or on an eccentric one to first order in
 * e (λ = M + 2e·sin M, the equation of centre's leading term: Murray & Dermott, Solar System
 * Dynamics, 1999, eq. 2.88), whose rate lies within n·(1 ± 2e).
 */
function body(label: string, periodDays: number, phaseRad: number, e = 0, opposite = false): AlignmentBody {
  const n = TWO_PI / periodDays;
  return {
    label, opposite, maxRateRadPerDay: n * (1 + 2 * e), minRateRadPerDay: n * (1 - 2 * e),
    longitudeRad: (t) => { const m = n * t + phaseRad; return m + 2 * e * Math.sin(m); },
  };
}

/** Signed angle wrapped into (−π, π]. */
function wrap(x: number): number {
  const y = ((x + Math.PI) % TWO_PI + TWO_PI) % TWO_PI - Math.PI;
  return y === -Math.PI ? Math.PI : y;
}

describe('alignment search', () => {
  describe('smallest arc', () => {
    it('is 2π minus the largest gap, across the 0/360° seam', () => {
      const a = smallestArc([350 * DEG, 10 * DEG, 5 * DEG]);
      assert.ok(Math.abs(a.spreadRad - 20 * DEG) < 1e-12);
      assert.ok(Math.abs(a.centreRad - 0) < 1e-12 || Math.abs(a.centreRad - TWO_PI) < 1e-12);
    });
    it('of points spread evenly round the circle is 240° for three', () => {
      assert.ok(Math.abs(smallestArc([0, 120 * DEG, 240 * DEG]).spreadRad - 240 * DEG) < 1e-12);
    });
  });

  describe('two bodies on circular orbits (exact oracle: |Δλ| ≤ θ around each conjunction)', () => {
    // Conjunctions at t_k = (2πk − Δ0)/(n1 − n2); each window is t_k ± θ/|n1 − n2|.
    const p1 = 224.701, p2 = 686.98; // periods in days (invented pair; any two distinct values do)
    const a = body('a', p1, 0.4);
    const b = body('b', p2, 2.9);
    const dn = TWO_PI / p1 - TWO_PI / p2;
    const d0 = 0.4 - 2.9;
    const theta = 5 * DEG;
    const span = { fromTt: 0, toTt: 20 * 365.25 };
    const r = findAlignments([a, b], { angleRad: theta, ...span });

    it('finds every window with edges within 1 s and the tightest instant within 1 s of the conjunction', () => {
      const toleranceDays = 1 / 86400;
      const expected: number[] = [];
      for (let k = -2; k < 40; k++) {
        const tk = (TWO_PI * k - d0) / dn;
        if (tk - theta / dn > span.fromTt && tk + theta / dn < span.toTt) expected.push(tk);
      }
      assert.equal(r.windows.length, expected.length);
      let worst = 0;
      r.windows.forEach((w, i) => {
        const tk = expected[i]!;
        worst = Math.max(worst, Math.abs(w.startTt - (tk - theta / dn)), Math.abs(w.endTt - (tk + theta / dn)), Math.abs(w.tightestTt - tk));
        assert.ok(w.spreadRad < 1e-6, `spread at tightest ${w.spreadRad} rad`);
      });
      assert.ok(worst < toleranceDays, `worst error ${(worst * 86400).toFixed(3)} s`);
    });

    it('uses fewer evaluations than a 1-day scan that finds the same windows', () => {
      // Narrow windows of fast bodies are the hard case: most work goes into edges and minima.
      const scan = scanAlignments([a, b], { angleRad: theta, ...span }, 1);
      assert.equal(scan.windows.length, r.windows.length);
      assert.ok(r.evaluations * 4 < scan.evaluations, `${r.evaluations} vs ${scan.evaluations}`);
    });
  });

  it('puts a body listed after `against` on the far side: windows around oppositions', () => {
    const p1 = 365.25, p2 = 4332.59;
    const earthLike = body('e', p1, 0);
    const farSide = body('j', p2, 1, 0, true);
    const dn = TWO_PI / p1 - TWO_PI / p2;
    const r = findAlignments([earthLike, farSide], { angleRad: 2 * DEG, fromTt: 0, toTt: 3000 });
    assert.ok(r.windows.length >= 2);
    for (const w of r.windows) {
      const sep = wrap(earthLike.longitudeRad(w.tightestTt) - farSide.longitudeRad(w.tightestTt));
      assert.ok(Math.abs(Math.abs(sep) - Math.PI) < 1e-6, `separation ${sep / DEG}°`);
      assert.ok(Math.abs((w.endTt - w.startTt) - 2 * (2 * DEG) / dn) < 1e-4);
    }
  });

  describe('several eccentric bodies, against a fine brute-force scan', () => {
    // Four invented bodies with eccentric orbits; the oracle is a plain 0.01-day scan.
    const bodies = [body('p', 88, 0.1, 0.2), body('q', 225, 2.0, 0.05), body('r', 365, 4.1, 0.02), body('s', 687, 5.0, 0.09)];
    const opts = { angleRad: 90 * DEG, fromTt: 0, toTt: 3000 };
    const r = findAlignments(bodies, opts);
    const scan = scanAlignments(bodies, opts, 0.01);

    it('finds the same windows, edges within the scan step', () => {
      assert.ok(scan.windows.length > 3, `${scan.windows.length} windows in the scan`);
      assert.equal(r.windows.length, scan.windows.length);
      let worst = 0;
      r.windows.forEach((w, i) => {
        const s = scan.windows[i]!;
        worst = Math.max(worst, Math.abs(w.startTt - s.startTt), Math.abs(w.endTt - s.endTt));
      });
      assert.ok(worst < 0.01, `worst edge difference ${worst} d`);
    });

    it('finds tightest spreads no larger than the scan’s lowest sample', () => {
      r.windows.forEach((w, i) => {
        assert.ok(w.spreadRad <= scan.windows[i]!.spreadRad + 1e-9, `window ${i}: ${w.spreadRad / DEG}° vs scan ${scan.windows[i]!.spreadRad / DEG}°`);
      });
    });

    it('charges the budget one unit per body per instant', () => {
      const budget = new Budget();
      const rb = findAlignments(bodies, { ...opts, budget });
      assert.equal(budget.evaluations, rb.evaluations);
      assert.equal(rb.evaluations, rb.instants * bodies.length);
    });

    it('stops with a limit error naming max-evaluations when the budget runs out', () => {
      const budget = new Budget({ ...DEFAULT_LIMITS, maxEvaluations: 200 });
      assert.throws(() => findAlignments(bodies, { ...opts, budget }), (e: unknown) => e instanceof LimitError && e.limit === 'max-evaluations');
    });
  });

  it('reports a window open at either end of the span', () => {
    const a = body('a', 100, 0);
    const b = body('b', 300, 0);
    // They start together (spread 0) and part at 2π(1/100 − 1/300) rad/d.
    const r = findAlignments([a, b], { angleRad: 10 * DEG, fromTt: 0, toTt: 150 });
    const first = r.windows[0]!;
    assert.equal(first.openAtStart, true);
    assert.equal(first.startTt, 0);
    assert.equal(first.tightestTt, 0);
    const last = r.windows[r.windows.length - 1]!;
    assert.equal(last.openAtEnd, true);
    assert.equal(last.endTt, 150);
  });

  it('rejects an angle of 180° or more, and fewer than two bodies', () => {
    const a = body('a', 100, 0);
    assert.throws(() => findAlignments([a, body('b', 200, 0)], { angleRad: Math.PI, fromTt: 0, toTt: 10 }), RangeError);
    assert.throws(() => findAlignments([a], { angleRad: 0.1, fromTt: 0, toTt: 10 }), RangeError);
  });

  it('bounds the spread rate by the fastest relative motion, or by the two fastest bodies when they may reverse', () => {
    const three = [body('a', 100, 0), body('b', 200, 0), body('c', 50, 0)];
    assert.ok(Math.abs(spreadRateBound(three) - (TWO_PI / 50 - TWO_PI / 200)) < 1e-15);
    const reversible = three.map((b) => ({ ...b, minRateRadPerDay: -b.maxRateRadPerDay }));
    assert.ok(Math.abs(spreadRateBound(reversible) - (TWO_PI / 50 + TWO_PI / 100)) < 1e-15);
  });

  it('never misses a window at least δ deep that a 0.05-day scan sees (property, random systems)', () => {
    const arb = fc.record({
      periods: fc.array(fc.double({ min: 20, max: 2000, noNaN: true }), { minLength: 2, maxLength: 4 }),
      phases: fc.array(fc.double({ min: 0, max: TWO_PI, noNaN: true }), { minLength: 4, maxLength: 4 }),
      ecc: fc.array(fc.double({ min: 0, max: 0.2, noNaN: true }), { minLength: 4, maxLength: 4 }),
      against: fc.array(fc.boolean(), { minLength: 4, maxLength: 4 }),
      angleDeg: fc.double({ min: 1, max: 90, noNaN: true }),
    });
    fc.assert(fc.property(arb, (c) => {
      const bodies = c.periods.map((p, i) => body(`b${i}`, p, c.phases[i]!, c.ecc[i]!, i > 0 && c.against[i]!));
      const angleRad = c.angleDeg * DEG;
      const opts = { angleRad, fromTt: 0, toTt: 400 };
      const found = findAlignments(bodies, opts).windows;
      const scan = scanAlignments(bodies, opts, 0.05).windows;
      const delta = angleRad / 1000;
      for (const w of scan) {
        if (w.spreadRad > angleRad - delta) continue; // too shallow to be guaranteed
        const hit = found.some((f) => f.startTt <= w.tightestTt + 1e-9 && f.endTt >= w.tightestTt - 1e-9);
        if (!hit) return false;
        const hitWindow = found.find((f) => f.startTt <= w.tightestTt + 1e-9 && f.endTt >= w.tightestTt - 1e-9)!;
        if (hitWindow.spreadRad > w.spreadRad + 1e-9) return false;
      }
      return true;
    }), { numRuns: 150, seed: 20261201 });
  });
});

/** Longitudes from the ephemeris adapter, as the statement handler builds them. */
function adapterBodies(names: readonly PositionBody[], seenFrom: 'sun' | 'earth'): AlignmentBody[] {
  return ephemerisAlignmentBodies(names.map((body) => ({ body, opposite: false })), seenFrom, new Budget());
}

const ttOf = (y: number, m = 1, d = 1): number => instantFromCalendar({ year: y, month: m, day: d, hour: 0, minute: 0, second: 0 }, 'mixed').tt;

describe('alignment on real planets', function () {
  this.timeout(120000);

  describe('consistency with the conjunction search (two bodies, angle → 0)', () => {
    const toleranceSeconds = 10;

    it('puts the tightest instants of heliocentric Jupiter–Saturn windows at the conjunction times, 1000–3000', () => {
      const from = instantFromCalendar({ year: 1000, month: 1, day: 1, hour: 0, minute: 0, second: 0 }, 'mixed');
      const to = instantFromCalendar({ year: 3000, month: 1, day: 1, hour: 0, minute: 0, second: 0 }, 'mixed');
      const conj = findConjunctions({ a: 'jupiter', b: 'saturn', start: from, end: to, seenFrom: 'sun', budget: new Budget() }).events;
      const r = findAlignments(adapterBodies(['jupiter', 'saturn'], 'sun'), { angleRad: 0.01 * DEG, fromTt: from.tt, toTt: to.tt });
      assert.equal(r.windows.length, conj.length);
      let worst = 0;
      r.windows.forEach((w, i) => { worst = Math.max(worst, Math.abs(w.tightestTt - conj[i]!.instant.tt) * 86400); });
      console.log(`      ${conj.length} conjunctions; worst difference ${worst.toFixed(2)} s`);
      assert.ok(worst < toleranceSeconds, `worst ${worst.toFixed(2)} s`);
    });

    it('puts the tightest instants of geocentric Venus–Mars windows at the conjunction times, 1950–2050 (retrograde loops included)', () => {
      const from = instantFromCalendar({ year: 1950, month: 1, day: 1, hour: 0, minute: 0, second: 0 }, 'mixed');
      const to = instantFromCalendar({ year: 2050, month: 1, day: 1, hour: 0, minute: 0, second: 0 }, 'mixed');
      const conj = findConjunctions({ a: 'venus', b: 'mars', start: from, end: to, seenFrom: 'earth', budget: new Budget() }).events;
      const r = findAlignments(adapterBodies(['venus', 'mars'], 'earth'), { angleRad: 0.01 * DEG, fromTt: from.tt, toTt: to.tt });
      assert.equal(r.windows.length, conj.length);
      let worst = 0;
      r.windows.forEach((w, i) => { worst = Math.max(worst, Math.abs(w.tightestTt - conj[i]!.instant.tt) * 86400); });
      console.log(`      ${conj.length} conjunctions; worst difference ${worst.toFixed(2)} s`);
      assert.ok(worst < toleranceSeconds, `worst ${worst.toFixed(2)} s`);
    });

    it('puts the tightest instant of the geocentric Jupiter–Saturn window of 2020 at the conjunction in longitude', () => {
      const from = instantFromCalendar({ year: 2020, month: 10, day: 1, hour: 0, minute: 0, second: 0 }, 'mixed');
      const to = instantFromCalendar({ year: 2021, month: 3, day: 1, hour: 0, minute: 0, second: 0 }, 'mixed');
      const conj = findConjunctions({ a: 'jupiter', b: 'saturn', start: from, end: to, seenFrom: 'earth', budget: new Budget() }).events;
      const r = findAlignments(adapterBodies(['jupiter', 'saturn'], 'earth'), { angleRad: 0.05 * DEG, fromTt: from.tt, toTt: to.tt });
      assert.equal(conj.length, 1);
      assert.equal(r.windows.length, 1);
      const dt = Math.abs(r.windows[0]!.tightestTt - conj[0]!.instant.tt) * 86400;
      console.log(`      difference ${dt.toFixed(2)} s`);
      assert.ok(dt < toleranceSeconds);
    });
  });

  it('finds the windows of the four giant planets within 30° over 1000–3000 that full-VSOP87 longitudes give, edges within a day', () => {
    // Independent longitudes: VSOP87 series B from astronomia, precessed to the mean ecliptic of date
    // by its own precession routine (its `position`); the adapter uses the true ecliptic of date:
    // nutation shifts every longitude alike and leaves the spread unchanged.
    const load = createRequire(__filename);
    const { Planet } = load('astronomia/planetposition') as { Planet: new (d: unknown) => { position(jde: number): { lon: number } } };
    const names: VsopPlanet[] = ['jupiter', 'saturn', 'uranus', 'neptune'];
    const planets = names.map((n) => { const m = load(`astronomia/data/vsop87B${n}`) as { default?: unknown }; return new Planet(m.default ?? m); });
    const full: AlignmentBody[] = names.map((n, i) => {
      const [lo, hi] = astronomyEngine.lonRateBounds(n, 'sun');
      return { label: n, opposite: false, minRateRadPerDay: lo, maxRateRadPerDay: hi, longitudeRad: (tt) => planets[i]!.position(tt + 2451545).lon };
    });
    const opts = { angleRad: 30 * DEG, fromTt: ttOf(1000), toTt: ttOf(3000) };
    const ours = findAlignments(adapterBodies(names, 'sun'), opts).windows;
    const ref = findAlignments(full, opts).windows;
    assert.equal(ours.length, ref.length);
    assert.ok(ours.length >= 3);
    const toleranceDays = 1;
    const toleranceSpreadDeg = 0.03;
    let worst = 0;
    let worstSpreadDeg = 0;
    ours.forEach((w, i) => {
      worst = Math.max(worst, Math.abs(w.startTt - ref[i]!.startTt), Math.abs(w.endTt - ref[i]!.endTt));
      worstSpreadDeg = Math.max(worstSpreadDeg, Math.abs(w.spreadRad - ref[i]!.spreadRad) / DEG);
    });
    console.log(`      ${ours.length} windows; worst edge difference ${worst.toFixed(3)} d, worst tightest-spread difference ${(worstSpreadDeg * 3600).toFixed(1)}″`);
    assert.ok(worst < toleranceDays);
    assert.ok(worstSpreadDeg < toleranceSpreadDeg);
  });

  describe('the statement', () => {
    const fence = (body: string): string => `# note\n\n\`\`\`orbit\n${body}\n\`\`\`\n`;
    const all = (e: NoteEvaluation) => e.blocks.flatMap((b) => b.statements);

    it('reports windows with a table, events, a windows plot and the recurrence caution', async () => {
      const e = await createNoteEvaluator().evaluate(fence('alignment jupiter saturn uranus neptune within 30 deg from 1000 to 3000'));
      const s = all(e)[0]!;
      assert.deepEqual(s.diagnostics, []);
      const r = s.result!;
      assert.match(r.summary, /^\d+ windows, longest [\d.]+ d \(from \d{4}-\d\d-\d\d\); tightest [\d.]+° on \d{4}-\d\d-\d\d$/);
      assert.equal(r.tables[0]!.rows.length, r.events!.length);
      const plot = r.plots![0]!;
      assert.equal(plot.kind, 'windows');
      assert.equal(plot.spans!.length, r.events!.length);
      assert.ok(r.cautions.some((c) => /not a forecast of anything on Earth/.test(c)));
      assert.match(r.provenance.frame!, /heliocentric/);
    });

    it('without a window, gives the lowest spread found, which is the tightest spread of the window a wider angle finds', async () => {
      const e = await createNoteEvaluator().evaluate(fence([
        'alignment jupiter saturn uranus neptune within 45 deg from 1850 to 2025',
        'alignment jupiter saturn uranus neptune within 50 deg from 1850 to 2025',
      ].join('\n')));
      const [none, one] = all(e).map((s) => s.result!);
      const m = /^no window: the spread stays above 45\.0° \(lowest found ([\d.]+)° on (\d{4}-\d\d-\d\d)\)$/.exec(none!.summary);
      assert.ok(m, none!.summary);
      assert.equal(one!.events!.length, 1);
      assert.ok(Math.abs(Number(m[1]) - (one!.events![0]!.fields['spread_deg'] as number)) < 0.01);
      assert.equal(m[2], one!.events![0]!.utc.slice(0, 10));
    });

    it('cautions about the Sun when a geocentric window has a body close to it', async () => {
      const e = await createNoteEvaluator().evaluate(fence('alignment mercury venus within 3 deg from 2020 to 2022 seen-from earth'));
      const r = all(e)[0]!.result!;
      const elong = r.events!.map((ev) => ev.fields['least_elongation_deg'] as number);
      assert.ok(elong.length > 0);
      const near = elong.filter((x) => x < 15).length;
      assert.equal(r.cautions.some((c) => /solar filter/.test(c)), near > 0);
      assert.ok(near > 0, 'Mercury and Venus meet near the Sun at least once in 2020–2021');
    });

    it('puts a body after `against` on the far side: Earth against Jupiter seen from the Sun is Jupiter behind the Sun', async () => {
      const e = await createNoteEvaluator().evaluate(fence('alignment earth against jupiter within 1 deg from 2020 to 2022'));
      const r = all(e)[0]!.result!;
      // Solar conjunction of Jupiter, 2021-01-29 (geocentric, within a day of the heliocentric event; from memory).
      assert.match(r.events![0]!.utc, /^2021-01-29/);
    });

    it('refuses bodies it cannot align, a repeated body and a bad angle, with codes', async () => {
      const text = [
        'body veyra period 12 d',
        'alignment sun jupiter within 5 deg from 2000 to 2010',
        'alignment veyra jupiter within 5 deg from 2000 to 2010',
        'alignment jupiter jupiter within 5 deg from 2000 to 2010',
        'alignment jupiter saturn within 200 deg from 2000 to 2010',
        'alignment jupiter saturn within 5 d from 2000 to 2010',
        'alignment earth mars within 5 deg from 2000 to 2010 seen-from earth',
        'alignment ssb mars within 5 deg from 2000 to 2010',
      ].join('\n');
      const e = await createNoteEvaluator().evaluate(fence(text));
      assert.deepEqual(all(e).slice(1).map((s) => s.diagnostics.map((d) => d.code).join(',')), ['OB302', 'OB204', 'OB302', 'OB302', 'OB301', 'OB302', 'OB204']);
    });
  });
});
