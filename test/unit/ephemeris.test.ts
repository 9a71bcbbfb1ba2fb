import assert from 'node:assert/strict';
import {
  accuracyWarning, angleBetweenRad, eclipticState, elongationRad, EphemerisError, EphemerisRangeError,
  estimatedPositionErrorArcsec, findZero, astronomyEngine, sunFromBarycentre,
} from '../../compute/ephemeris.js';
import { Budget } from '../../compute/limits.js';
import { AU_KM, NOMINAL_SOLAR_RADIUS_KM } from '../../compute/quantity.js';

const DEG = Math.PI / 180;
const J2000 = 2451545;

describe('ephemeris adapter', () => {
  // Meeus, Astronomical Algorithms (2nd ed., 1998), example 32.a: Venus on 1992 Dec 20 0h TD
  // with the full VSOP87, heliocentric, dynamical mean ecliptic and equinox of date:
  // L = 26.11428°, B = −2.62070°, R = 0.724603 au. Our frame uses the true equinox, which is
  // the mean one shifted by the nutation in longitude; example 33.a gives Δψ = +16.749″ for
  // that instant. The library truncates VSOP87, so a few arcseconds are expected.
  it('gives Venus heliocentric coordinates of Meeus example 32.a to a few arcseconds', () => {
    const toleranceArcsec = 5;
    const tt = 2448976.5 - J2000;
    const s = eclipticState('venus', 'sun', tt, new Budget());
    const dLon = (s.lonRad / DEG - 16.749 / 3600 - 26.11428) * 3600;
    const dLat = (s.latRad / DEG - -2.62070) * 3600;
    console.log(`      Venus 1992-12-20: ΔL = ${dLon.toFixed(2)}″, ΔB = ${dLat.toFixed(2)}″, ΔR = ${((s.distanceAu - 0.724603) * AU_KM).toFixed(0)} km`);
    assert.ok(Math.abs(dLon) < toleranceArcsec, `longitude off by ${dLon}″`);
    assert.ok(Math.abs(dLat) < toleranceArcsec, `latitude off by ${dLat}″`);
    assert.ok(Math.abs(s.distanceAu - 0.724603) < 2e-6);
  });

  // Meeus (1998) example 33.a: apparent geocentric Venus, 1992 Dec 20 0h TD, true ecliptic
  // and equinox of date: λ = 313.08102°, β = −2.08474°, Δ = 0.910947 au.
  it('gives the apparent geocentric Venus of Meeus example 33.a to a few arcseconds', () => {
    const toleranceArcsec = 5;
    const tt = 2448976.5 - J2000;
    const s = eclipticState('venus', 'earth', tt, new Budget());
    const dLon = (s.lonRad / DEG - 313.08102) * 3600;
    const dLat = (s.latRad / DEG - -2.08474) * 3600;
    console.log(`      Venus apparent 1992-12-20: Δλ = ${dLon.toFixed(2)}″, Δβ = ${dLat.toFixed(2)}″`);
    assert.ok(Math.abs(dLon) < toleranceArcsec, `longitude off by ${dLon}″`);
    assert.ok(Math.abs(dLat) < toleranceArcsec, `latitude off by ${dLat}″`);
    assert.ok(Math.abs(s.distanceAu - 0.910947) < 1e-4);
  });

  it('gives longitude rates that match a numerical difference of positions', () => {
    const budget = new Budget();
    const cases = [['jupiter', 'sun'], ['mars', 'earth'], ['moon', 'earth'], ['sun', 'earth'], ['mercury', 'earth']] as const;
    let worst = 0;
    for (const [body, from] of cases) {
      const tt = 8123.25;
      const h = body === 'moon' ? 0.01 : 0.05;
      const s = eclipticState(body, from, tt, budget, true);
      const lo = eclipticState(body, from, tt - h, budget);
      const hi = eclipticState(body, from, tt + h, budget);
      let d = hi.lonRad - lo.lonRad;
      if (d > Math.PI) d -= 2 * Math.PI;
      if (d < -Math.PI) d += 2 * Math.PI;
      const numeric = d / (2 * h);
      const rel = Math.abs(s.lonRateRadPerDay - numeric) / Math.abs(numeric);
      worst = Math.max(worst, rel);
      // Rates come from geometric states; positions are apparent: light time changes rates by well under 1 %.
      assert.ok(rel < 0.01, `${body} from ${from}: ${s.lonRateRadPerDay} vs ${numeric}`);
    }
    console.log(`      worst relative rate difference ${(worst * 100).toFixed(3)} %`);
  });

  it('ticks the budget once per body per instant', () => {
    const budget = new Budget();
    astronomyEngine.states(['mars', 'sun', 'moon'], 'earth', 0, true, budget);
    eclipticState('saturn', 'sun', 0, budget);
    assert.equal(budget.evaluations, 4);
  });

  it('turns impossible requests into typed errors that name the body and the instant', () => {
    const budget = new Budget();
    assert.throws(() => eclipticState('earth', 'earth', 0, budget), (e: unknown) => e instanceof EphemerisError && e.body === 'earth');
    assert.throws(() => eclipticState('sun', 'sun', 0, budget), EphemerisError);
    assert.throws(() => eclipticState('mars', 'sun', Number.NaN, budget), EphemerisError);
    assert.throws(() => eclipticState('pluto', 'sun', 2_000 * 365.25, budget), (e: unknown) => e instanceof EphemerisRangeError && /0001–3999/.test(e.message));
    assert.throws(() => eclipticState('mars', 'sun', 200_000 * 365.25, budget), EphemerisRangeError);
  });

  it('keeps the Sun within about two solar radii of the barycentre', () => {
    // Common knowledge of the solar-system barycentre: the Sun's centre stays within about
    // 2.2 solar radii of it (no single published table used here).
    const budget = new Budget();
    let maxRsun = 0;
    for (let tt = -20 * 365.25; tt <= 20 * 365.25; tt += 30) {
      const v = sunFromBarycentre(tt, budget);
      maxRsun = Math.max(maxRsun, Math.hypot(v.xAu, v.yAu, v.zAu) * AU_KM / NOMINAL_SOLAR_RADIUS_KM);
    }
    console.log(`      largest offset 1980–2020: ${maxRsun.toFixed(2)} solar radii`);
    assert.ok(maxRsun > 1.5 && maxRsun < 2.3);
  });

  it('measures elongation as the angle between the body and the Sun', () => {
    const budget = new Budget();
    // Venus at greatest eastern elongation 2020-03-24 (about 46.1°, from memory).
    const tt = 2458932.5 - J2000;
    const e = elongationRad('venus', tt, budget) / DEG;
    assert.ok(Math.abs(e - 46.1) < 0.2, `elongation ${e}`);
    assert.equal(angleBetweenRad({ xAu: 1, yAu: 0, zAu: 0 }, { xAu: 0, yAu: 2, zAu: 0 }), Math.PI / 2);
  });
});

describe('accuracy warning', () => {
  it('is silent inside 1000–3000', () => {
    assert.equal(accuracyWarning(-100 * 365.25, 100 * 365.25, ['jupiter', 'saturn']), undefined);
  });

  it('estimates the error from the measured envelope outside 1000–3000', () => {
    // Envelope points from the project's measurement against full VSOP87 (EPHEMERIS-NOTES.md).
    assert.ok(Math.abs(estimatedPositionErrorArcsec(0) - 350) < 1);
    assert.ok(Math.abs(estimatedPositionErrorArcsec(7000) - 5000) < 1);
    assert.ok(estimatedPositionErrorArcsec(2000) <= 103);
    const w = accuracyWarning((-3000 - 2000) * 365.25, 0, ['jupiter', 'saturn']);
    assert.ok(w);
    assert.ok(Math.abs(w.estimatedErrorArcsec - 5000) < 1);
    assert.match(w.message, /leaves 1000–3000/);
  });

  it('names Pluto\'s narrower range', () => {
    const w = accuracyWarning(2000 * 365.25, 2100 * 365.25, ['neptune', 'pluto']);
    assert.ok(w);
    assert.match(w.message, /Pluto is tabulated only for the years 0001–3999/);
  });
});

describe('guarded root finder', () => {
  it('finds a descending root by flipping the bracket', () => {
    const r = findZero((t) => Math.cos(t), 0, 3, 0.01);
    assert.equal(r.kind, 'root');
    if (r.kind === 'root') assert.ok(Math.abs(r.tt - Math.PI / 2) < 1e-6);
  });

  it('says explicitly when there is no sign change in the window', () => {
    const r = findZero((t) => 2 + Math.sin(t), 0, 10);
    assert.deepEqual(r, { kind: 'none-in-window', startTt: 0, endTt: 10 });
  });

  it('refuses a zero tolerance instead of letting it become one second', () => {
    assert.throws(() => findZero((t) => t, -1, 1, 0), RangeError);
  });

  it('uses the known end values even when one of them is zero', () => {
    const r = findZero((t) => t - 1, 1, 2);
    assert.deepEqual(r, { kind: 'root', tt: 1 });
  });
});
