import assert from 'node:assert/strict';
import { builtinPeriod, SIDEREAL_PERIOD_DAYS } from '../../compute/bodies.js';
import { BUILTIN_BODIES } from '../../compute/context.js';
import { libraryOrbitalPeriodDays } from '../../compute/ephemeris.js';
import { sigmaOf } from '../../compute/quantity.js';

describe('built-in body periods', () => {
  it('agree with the ephemeris library\'s own mean periods for every planet', () => {
    // Two transcriptions of the same published table must agree digit for digit.
    let compared = 0;
    for (const id of BUILTIN_BODIES) {
      const lib = libraryOrbitalPeriodDays(id);
      if (lib === undefined) continue;
      assert.equal(builtinPeriod(id)?.value, lib, id);
      compared += 1;
    }
    assert.equal(compared, 9);
  });

  it('give the synodic periods printed in the same fact sheet', () => {
    // NASA GSFC Planetary Fact Sheet, row "Synodic Period (days)" (from memory):
    // the synodic period with Earth follows from the sidereal rows, 1/S = |1/P⊕ − 1/P|.
    const published: Record<string, number> = {
      mercury: 115.88, venus: 583.92, mars: 779.94, jupiter: 398.88, saturn: 378.09,
      uranus: 369.66, neptune: 367.49, pluto: 366.73,
    };
    const toleranceDays = 0.01;
    const earth = SIDEREAL_PERIOD_DAYS.earth!;
    let worst = 0;
    for (const [id, s] of Object.entries(published)) {
      const p = SIDEREAL_PERIOD_DAYS[id as keyof typeof SIDEREAL_PERIOD_DAYS]!;
      const synodic = 1 / Math.abs(1 / earth - 1 / p);
      worst = Math.max(worst, Math.abs(synodic - s));
      assert.ok(Math.abs(synodic - s) < toleranceDays, `${id}: ${synodic} vs ${s}`);
    }
    console.log(`      worst synodic difference ${worst.toFixed(4)} d`);
  });

  it('are exact quantities in days, and absent for the Sun and the barycentre', () => {
    const moon = builtinPeriod('moon');
    assert.ok(moon);
    assert.equal(moon.dim, 'time');
    assert.equal(sigmaOf(moon), 0);
    // NASA GSFC Moon Fact Sheet, sidereal orbit period 27.3217 d (from memory).
    assert.equal(moon.value, 27.3217);
    assert.equal(builtinPeriod('sun'), undefined);
    assert.equal(builtinPeriod('ssb'), undefined);
  });
});
