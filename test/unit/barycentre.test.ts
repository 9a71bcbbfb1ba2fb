import { strict as assert } from 'node:assert';
import {
  ALL_PLANETS, analyseBarycentre, ephemerisPlanets, GIANT_PLANETS, sunOffsetFunction, type HeliocentricPlanets, type SunOffset,
} from '../../compute/barycentre.js';
import { findMinimum } from '../../compute/brent.js';
import { Budget, DEFAULT_LIMITS } from '../../compute/limits.js';
import { createNoteEvaluator, type NoteEvaluation } from '../../compute/note.js';
import { NOMINAL_SOLAR_RADIUS_KM } from '../../compute/quantity.js';
import { vsop87Vector, type VsopPlanet } from './fullVsop87.js';

const YEAR = 365.25;
const J2000_JD = 2451545;
const ttOfYear = (y: number): number => (y - 2000) * YEAR;

/**
 * Planetary masses as Sun/planet mass ratios (planet plus satellites; Earth plus Moon), from the
 * IAU 2009 System of Astronomical Constants (Luzum et al. 2011, Celest. Mech. Dyn. Astron. 110,
 * 293, Table 1) — from memory. Independent of the ephemeris library's GM values.
 */
const SUN_OVER_PLANET: Readonly<Record<VsopPlanet, number>> = {
  mercury: 6_023_597.400, venus: 408_523.719, earth: 328_900.5614, mars: 3_098_703.59,
  jupiter: 1_047.348_644, saturn: 3_497.9018, uranus: 22_902.98, neptune: 19_412.26,
};

/** The independent computation: full VSOP87 (astronomia) positions and IAU masses. */
function fullTheory(names: readonly VsopPlanet[]): HeliocentricPlanets {
  return {
    planets: names.map((name) => ({ name, massRatio: 1 / SUN_OVER_PLANET[name] })),
    frame: 'VSOP87B: J2000 mean ecliptic and equinox',
    positionsAu(tt, out) {
      names.forEach((n, i) => {
        const [x, y, z] = vsop87Vector(n, tt + J2000_JD);
        out[3 * i] = x; out[3 * i + 1] = y; out[3 * i + 2] = z;
      });
    },
  };
}

const gap = (a: SunOffset, b: SunOffset): number => Math.hypot(a.xKm - b.xKm, a.yKm - b.yKm, a.zKm - b.zKm);

/** Worst vector difference (km) between two offsets at `count + 1` even instants over [y0, y1]. */
function worstGapKm(f: (tt: number) => SunOffset, g: (tt: number) => SunOffset, y0: number, y1: number, count: number): number {
  let worst = 0;
  for (let k = 0; k <= count; k++) {
    const tt = ttOfYear(y0 + (y1 - y0) * k / count);
    worst = Math.max(worst, gap(f(tt), g(tt)));
  }
  return worst;
}

describe('the Sun’s offset from the barycentre', function () {
  this.timeout(120000);
  const ours4 = sunOffsetFunction(ephemerisPlanets(GIANT_PLANETS, new Budget()));
  const ours8 = sunOffsetFunction(ephemerisPlanets(ALL_PLANETS, new Budget()));
  const full4 = sunOffsetFunction(fullTheory(['jupiter', 'saturn', 'uranus', 'neptune']));
  const full8 = sunOffsetFunction(fullTheory(['mercury', 'venus', 'earth', 'mars', 'jupiter', 'saturn', 'uranus', 'neptune']));

  describe('against the full VSOP87 theory with IAU 2009 masses (independent computation)', () => {
    it('agrees within 120 km over 1900–2100 for the four giant planets', () => {
      const toleranceKm = 120;
      const worst = worstGapKm(ours4, full4, 1900, 2100, 60);
      console.log(`      worst difference 1900–2100: ${worst.toFixed(1)} km`);
      assert.ok(worst < toleranceKm, `worst ${worst.toFixed(1)} km`);
    });

    it('agrees within 300 km over 1000–3000 for the four giant planets', () => {
      const toleranceKm = 300;
      const worst = worstGapKm(ours4, full4, 1000, 3000, 60);
      console.log(`      worst difference 1000–3000: ${worst.toFixed(1)} km`);
      assert.ok(worst < toleranceKm, `worst ${worst.toFixed(1)} km`);
    });

    it('agrees within 120 km over 1900–2100 when all eight planets are summed on both sides', () => {
      const toleranceKm = 120;
      const worst = worstGapKm(ours8, full8, 1900, 2100, 40);
      console.log(`      worst difference, eight planets: ${worst.toFixed(1)} km`);
      assert.ok(worst < toleranceKm, `worst ${worst.toFixed(1)} km`);
    });

    it('differs by a few hundred km from the eight-planet barycentre when only the giants are counted', () => {
      // Mercury, Venus, Earth–Moon and Mars together move the Sun by up to ≈ 450 + 260 + 75 + 10 km.
      const worst = worstGapKm(ours4, full8, 1900, 2100, 60);
      console.log(`      giants-only against eight planets: up to ${worst.toFixed(0)} km`);
      assert.ok(worst > 300 && worst < 1200, `worst ${worst.toFixed(0)} km`);
    });
  });

  describe('analysis over 1900–2100', () => {
    const a = analyseBarycentre(ephemerisPlanets(GIANT_PLANETS, new Budget()), { fromTt: ttOfYear(1900), toTt: ttOfYear(2100), stepDays: 20 });

    it('finds the largest offset where the full theory has its maximum, within half a day and 60 km', () => {
      // Refine the full theory's own maximum near ours (its own Brent search, a ±200-day bracket).
      const m = findMinimum((t) => -full4(t).distanceKm, a.max.tt - 200, a.max.tt + 200, 1e-3);
      const dtDays = Math.abs(m.x - a.max.tt);
      const dKm = Math.abs(-m.fx - a.max.distanceKm);
      console.log(`      max ${(a.max.distanceKm / NOMINAL_SOLAR_RADIUS_KM).toFixed(3)} R☉ at ${(2000 + a.max.tt / YEAR).toFixed(2)}; full theory ${dtDays.toFixed(2)} d and ${dKm.toFixed(0)} km away`);
      assert.ok(dtDays < 0.5 && dKm < 60);
      // The largest excursion exceeds two solar radii (consistent with the independent computation above).
      assert.ok(a.max.distanceKm > 2 * NOMINAL_SOLAR_RADIUS_KM && a.max.distanceKm < 2.3 * NOMINAL_SOLAR_RADIUS_KM);
    });

    it('finds the smallest offset where the full theory has its minimum, within half a day and 60 km', () => {
      const m = findMinimum((t) => full4(t).distanceKm, a.min.tt - 200, a.min.tt + 200, 1e-3);
      const dtDays = Math.abs(m.x - a.min.tt);
      const dKm = Math.abs(m.fx - a.min.distanceKm);
      console.log(`      min ${a.min.distanceKm.toFixed(0)} km at ${(2000 + a.min.tt / YEAR).toFixed(2)}; full theory ${dtDays.toFixed(2)} d and ${dKm.toFixed(0)} km away`);
      assert.ok(dtDays < 0.5 && dKm < 60);
    });

    it('refines every turning point to a value at least as extreme as its neighbouring samples', () => {
      assert.ok(a.turningPoints.length > 10);
      for (const tp of a.turningPoints) {
        const i = a.tt.findIndex((t) => t > tp.tt);
        const near = [a.distanceKm[i - 1]!, a.distanceKm[i]!];
        if (tp.kind === 'max') assert.ok(tp.distanceKm >= Math.max(...near) - 1e-6);
        else assert.ok(tp.distanceKm <= Math.min(...near) + 1e-6);
      }
      // Maxima and minima alternate.
      for (let k = 1; k < a.turningPoints.length; k++) assert.notEqual(a.turningPoints[k]!.kind, a.turningPoints[k - 1]!.kind);
    });

    it('has its dominant period at the Jupiter–Saturn synodic period of the fact-sheet periods', () => {
      // NASA GSFC Planetary Fact Sheet sidereal periods: Jupiter 4332.589 d, Saturn 10759.22 d; 1/S = |1/Pj − 1/Ps|.
      const synodicDays = 1 / (1 / 4332.589 - 1 / 10759.22);
      const top = a.peaks[0]!;
      const offsetPerDay = Math.abs(1 / synodicDays - top.frequencyPerDay);
      console.log(`      top peak ${(top.periodDays / YEAR).toFixed(2)} yr, synodic ${(synodicDays / YEAR).toFixed(2)} yr`);
      assert.ok(offsetPerDay < top.halfWidthPerDay, `peak ${(top.periodDays / YEAR).toFixed(2)} yr`);
    });

    it('charges the budget one unit per planet position', () => {
      const budget = new Budget();
      const r = analyseBarycentre(ephemerisPlanets(GIANT_PLANETS, budget), { fromTt: 0, toTt: 3650, stepDays: 30 });
      assert.equal(budget.evaluations, r.evaluations);
    });
  });

  describe('the statement', () => {
    const fence = (body: string): string => `# note\n\n\`\`\`orbit\n${body}\n\`\`\`\n`;
    const first = (e: NoteEvaluation) => e.blocks[0]!.statements[0]!;

    it('reports the offset in km and solar radii with extremes, periods, plots and the planets it includes', async () => {
      const e = await createNoteEvaluator().evaluate(fence('barycentre from 1900 to 2100'));
      const s = first(e);
      assert.deepEqual(s.diagnostics, []);
      const r = s.result!;
      assert.match(r.summary, /R☉–[\d.]+ R☉ from the barycentre; max on 1983-03-\d\d, min on 1990-04-\d\d; dominant periods 19\.8\d yr/);
      assert.ok(r.details.some((d) => /Jupiter, Saturn, Uranus, Neptune/.test(d)));
      assert.ok(r.details.some((d) => /Adding Mercury, Venus, the Earth–Moon pair and Mars would move the Sun by up to [\d,]+ km/.test(d)));
      assert.deepEqual(r.plots!.map((p) => p.kind), ['path', 'line', 'periodogram']);
      const extremes = r.tables[0]!;
      assert.match(extremes.rows[0]![2]!, /^1,4\d\d,\d\d\d km$/);
      assert.match(extremes.rows[0]![3]!, /^2\.09\d R☉$/);
      assert.ok(r.cautions.some((c) => /not a forecast/.test(c)));
    });

    it('refuses a step that is not a time, or longer than half the span', async () => {
      const e = await createNoteEvaluator().evaluate(fence('barycentre from 1900 to 2100 step 5 deg\nbarycentre from 1900 to 1901 step 1 yr'));
      assert.deepEqual(e.diagnostics.map((d) => d.code), ['OB301', 'OB302']);
    });

    it('stops at the evaluation limit with a message that names it', async () => {
      const e = await createNoteEvaluator({ limits: { ...DEFAULT_LIMITS, maxEvaluations: 1000 } }).evaluate(fence('barycentre from 1900 to 2100'));
      assert.equal(e.diagnostics[0]!.code, 'OB401');
      assert.match(e.diagnostics[0]!.message, /max-evaluations|maxEvaluations/);
    });
  });
});
