/**
 * Facts about the built-in bodies that do not need an ephemeris: mean sidereal periods.
 *
 * Source: NASA Goddard Space Flight Center, Planetary Fact Sheet (D. R. Williams),
 * row "Orbital Period (days)", the sidereal orbit period; the Moon from the NASA GSFC
 * Moon Fact Sheet, "Sidereal orbit period (days)". The sheets give no uncertainties:
 * the values are used as printed and treated as exact (their rounding, at most half a
 * unit in the last printed digit, is far below any use a note makes of them).
 * The ephemeris library's own mean periods agree with the planetary rows (checked by
 * test/unit/bodies.test.ts).
 */
import type { BuiltinBody } from './context.js';
import { exact, type Quantity } from './quantity.js';

/** Mean sidereal periods in days, as printed in the fact sheets named above. */
export const SIDEREAL_PERIOD_DAYS: Readonly<Partial<Record<BuiltinBody, number>>> = {
  mercury: 87.969,
  venus: 224.701,
  earth: 365.256,
  mars: 686.980,
  jupiter: 4332.589,
  saturn: 10759.22,
  uranus: 30685.4,
  neptune: 60189,
  pluto: 90560,
  moon: 27.3217,
};

/** Name of the table, for provenance and hovers. */
export const PERIOD_SOURCE = 'NASA GSFC Planetary Fact Sheet and Moon Fact Sheet, sidereal orbit period (values as printed, treated as exact)';

/**
 * Mean sidereal period of a built-in body as an exact quantity (days), or `undefined`
 * for the Sun and the solar-system barycentre, which do not orbit.
 */
export function builtinPeriod(id: BuiltinBody): Quantity | undefined {
  const days = SIDEREAL_PERIOD_DAYS[id];
  return days === undefined ? undefined : exact(days, 'time');
}
