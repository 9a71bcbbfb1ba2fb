/**
 * The one adapter over the ephemeris library (astronomy-engine). Nothing else in the
 * project (besides compute/time.ts) imports it: its PascalCase API, its `Body` enum and
 * its thrown strings stop here.
 *
 * Frame. Every position this module returns is in the **true ecliptic and equinox of
 * date**: the almanac convention for conjunctions and oppositions (published event times
 * are differences of apparent longitudes of date), and the frame of the library's own
 * longitude helpers. A fixed J2000 ecliptic would move slow-pair events by hours near the
 * present and by up to two days over 10,000 years, so every result states the frame.
 * Heliocentric positions are geometric (no light time); geocentric positions are apparent
 * (light time and annual aberration), as almanacs tabulate them.
 *
 * Counting. Every evaluation of one body at one instant calls `budget.tick()` once,
 * whether or not rates are asked for; searches and the fixed-step scans they are compared
 * with count the same way.
 *
 * A fuller planetary theory can be plugged in later as another {@link EphemerisSource}.
 */
import {
  AstroTime, Body, GeoMoonState, GeoVector, HelioState, HelioVector, MassProduct, PlanetOrbitalPeriod,
  Rotation_EQJ_ECT, Search,
  type RotationMatrix,
} from 'astronomy-engine';
import type { BuiltinBody } from './context.js';
import type { Budget } from './limits.js';
import { ENGINE_LABEL } from './provenance.js';

/** A body with a position: every built-in body except the barycentre. */
export type PositionBody = Exclude<BuiltinBody, 'ssb'>;

/** Where positions are seen from. */
export type Viewpoint = 'sun' | 'earth';

/** A failure of the ephemeris library or of a value it returned, with context. */
export class EphemerisError extends Error {
  /**
   * @param body the body being computed, when there was one
   * @param tt the instant (TT, days since J2000) being computed
   */
  constructor(message: string, readonly body: BuiltinBody | undefined, readonly tt: number) {
    super(message);
    this.name = 'EphemerisError';
  }
}

/** An instant or body the source cannot compute (outside its tables), with a sentence saying what would work. */
export class EphemerisRangeError extends EphemerisError {
  constructor(message: string, body: BuiltinBody | undefined, tt: number) {
    super(message, body, tt);
    this.name = 'EphemerisRangeError';
  }
}

/** Position (and rates) of one body at one instant, ecliptic of date. */
export interface EclipticState {
  readonly body: PositionBody;
  readonly seenFrom: Viewpoint;
  /** TT, days since J2000. */
  readonly tt: number;
  /** Ecliptic longitude of date, radians in [0, 2π). */
  readonly lonRad: number;
  /** Ecliptic latitude of date, radians in [−π/2, π/2]. */
  readonly latRad: number;
  readonly distanceAu: number;
  /** Cartesian position in the ecliptic of date, au (x toward the equinox of date). */
  readonly xAu: number;
  readonly yAu: number;
  readonly zAu: number;
  /** dλ/dt in radians per day (includes the precession of the equinox); NaN when rates were not asked for. */
  readonly lonRateRadPerDay: number;
  /** dβ/dt in radians per day; NaN when rates were not asked for. */
  readonly latRateRadPerDay: number;
  /** dr/dt in au per day; NaN when rates were not asked for. */
  readonly distanceRateAuPerDay: number;
}

/** A Cartesian vector in au. */
export interface VectorAu { readonly xAu: number; readonly yAu: number; readonly zAu: number }

/** The estimated position error when a span leaves where the theory is good. */
export interface AccuracyWarning {
  /** One or two sentences for a diagnostic (code OB501). */
  readonly message: string;
  /** Rough worst heliocentric position error over the span, arcseconds. */
  readonly estimatedErrorArcsec: number;
}

/** Result of a bracketed root search: a root, or an explicit statement that there is none in the window. */
export type RootResult =
  | { readonly kind: 'root'; readonly tt: number }
  | { readonly kind: 'none-in-window'; readonly startTt: number; readonly endTt: number };

/** What a planetary theory must offer to be used by the searches. */
export interface EphemerisSource {
  /** For provenance, e.g. `astronomy-engine 2.1.19`. */
  readonly label: string;
  /** Frame of the positions seen from each viewpoint, for provenance. */
  frame(seenFrom: Viewpoint): string;
  /** One sentence on where the theory is good, for provenance. */
  readonly validity: string;
  /**
   * Positions of several bodies at one TT instant, seen from `seenFrom`.
   * One `budget.tick()` per body. Throws {@link EphemerisError} / {@link EphemerisRangeError}.
   */
  states(bodies: readonly PositionBody[], seenFrom: Viewpoint, tt: number, withRates: boolean, budget: Budget): EclipticState[];
  /** The Sun's position relative to the solar-system barycentre, J2000 mean equator, au. One tick. */
  sunFromBarycentre(tt: number, budget: Budget): VectorAu;
  /**
   * Bounds [min, max] on dλ/dt (radians per day, ecliptic of date) of a body seen from a
   * viewpoint over the span the source supports, with a margin. Searches rely on them.
   */
  lonRateBounds(body: PositionBody, seenFrom: Viewpoint): readonly [number, number];
  /**
   * Bound on |d²λ/dt²| (radians per day², ecliptic of date) of a body seen from Earth, with a
   * margin. The adaptive search uses it to take longer steps where no zero can be reached.
   */
  lonAccelBound(body: PositionBody, seenFrom: Viewpoint): number;
  /** TT range (days since J2000) in which the source computes a body at all, at reasonable cost. */
  coverage(body: PositionBody): { readonly startTt: number; readonly endTt: number };
  accuracyWarning(startUt: number, endUt: number, bodies: readonly BuiltinBody[]): AccuracyWarning | undefined;
}

const DEG = Math.PI / 180;
const TWO_PI = 2 * Math.PI;
const DAYS_PER_YEAR = 365.25;

/**
 * General precession in longitude, 5028.796195″ per Julian century (IAU 2006;
 * Capitaine, Wallace & Chapront 2003, A&A 412, 567, eq. 39), in radians per day: the
 * rotation rate of the equinox of date, added to inertial longitude rates.
 */
const PRECESSION_RAD_PER_DAY = (5028.796195 / 3600) * DEG / 36525;

const LIBRARY_BODY: Readonly<Record<PositionBody, Body>> = {
  sun: Body.Sun, moon: Body.Moon, mercury: Body.Mercury, venus: Body.Venus, earth: Body.Earth,
  mars: Body.Mars, jupiter: Body.Jupiter, saturn: Body.Saturn, uranus: Body.Uranus,
  neptune: Body.Neptune, pluto: Body.Pluto,
};

/** ±100,000 years around J2000: far beyond any meaningful accuracy, but still computable. */
const MAX_ABS_TT_DAYS = 100_000 * DAYS_PER_YEAR;

/**
 * Pluto comes from a numerical integration the library tabulates for TT −730000 … +730000
 * days (years ≈ 0001 … 3999). Outside it each call re-integrates from the table's end:
 * 17–130 ms per call and an accuracy nobody has established.
 */
const PLUTO_TABLE_TT: readonly [number, number] = [-730_000, 730_000];

/**
 * Geocentric and heliocentric longitude-rate bounds, degrees per day, ecliptic of date.
 * Measured with this library: extremes of dλ/dt from state vectors sampled every
 * 0.1–2 d over 20–250-year windows at every 1000th year from −3000 to +7000, widened by
 * about 5 % of the range (common practice, no published source).
 */
const GEO_RATE_DEG: Readonly<Record<PositionBody, readonly [number, number] | undefined>> = {
  sun: [0.93, 1.04], moon: [11.5, 15.7], mercury: [-1.5, 2.35], venus: [-0.7, 1.33], earth: undefined,
  mars: [-0.45, 0.85], jupiter: [-0.155, 0.265], saturn: [-0.095, 0.145], uranus: [-0.05, 0.07],
  neptune: [-0.032, 0.042], pluto: [-0.032, 0.045],
};
const HELIO_RATE_DEG: Readonly<Record<PositionBody, readonly [number, number] | undefined>> = {
  sun: undefined, moon: undefined, mercury: [2.6, 6.6], venus: [1.55, 1.66], earth: [0.93, 1.04],
  mars: [0.42, 0.66], jupiter: [0.072, 0.096], saturn: [0.028, 0.0405], uranus: [0.0103, 0.0137],
  neptune: [0.0057, 0.0065], pluto: [0.0024, 0.0075],
};

/**
 * Bounds on |d²λ/dt²| seen from Earth, degrees per day². Measured like the rate bounds
 * (central differences of state-vector rates, 0.05–0.25 d apart, over 3–15-year windows
 * at nine epochs from −3000 to +7000) and widened by 30 % (common practice, no published source).
 */
const GEO_ACCEL_DEG: Readonly<Record<PositionBody, number | undefined>> = {
  sun: 0.001, moon: 0.69, mercury: 0.26, venus: 0.056, earth: undefined, mars: 0.02,
  jupiter: 0.0046, saturn: 0.0025, uranus: 0.00125, neptune: 0.00077, pluto: 0.0008,
};
/**
 * Heliocentric: from Kepler's second law, θ′ = n(1 + e cos f)²/(1 − e²)^{3/2} (Murray &
 * Dermott, Solar System Dynamics, 1999, eqs. 2.31–2.32), |θ″| ≤ 2en²(1 + e)³/(1 − e²)³;
 * with the fact-sheet eccentricities, doubled for perturbations and rounded up.
 */
const HELIO_ACCEL_DEG: Readonly<Record<PositionBody, number | undefined>> = {
  sun: undefined, moon: undefined, mercury: 0.5, venus: 0.0013, earth: 0.0012, mars: 0.0025,
  jupiter: 0.00003, saturn: 0.000006, uranus: 0.0000006, neptune: 0.00000003, pluto: 0.0000007,
};

/** Run a library call, turning its thrown strings (and anything else) into {@link EphemerisError}. */
function guarded<T>(what: string, body: BuiltinBody | undefined, tt: number, fn: () => T): T {
  try {
    return fn();
  } catch (e) {
    if (e instanceof EphemerisError) throw e;
    const detail = typeof e === 'string' ? e : e instanceof Error ? e.message : String(e);
    throw new EphemerisError(`the ephemeris library failed computing ${what} at TT JD ${(tt + 2451545).toFixed(5)}: ${detail}`, body, tt);
  }
}

function checkInstant(tt: number, body: BuiltinBody | undefined): void {
  if (!Number.isFinite(tt)) throw new EphemerisError('instant is not a finite number', body, tt);
  if (Math.abs(tt) > MAX_ABS_TT_DAYS) {
    throw new EphemerisRangeError(`the instant lies more than 100,000 years from J2000; choose dates within ±100,000 years`, body, tt);
  }
  if (body === 'pluto' && (tt < PLUTO_TABLE_TT[0] || tt > PLUTO_TABLE_TT[1])) {
    throw new EphemerisRangeError('Pluto is tabulated only for the years 0001–3999 (a numerical integration); choose dates within them', body, tt);
  }
}

function checkFinite(values: readonly number[], what: string, body: BuiltinBody | undefined, tt: number): void {
  for (const v of values) {
    if (!Number.isFinite(v)) throw new EphemerisError(`the ephemeris library returned a non-finite ${what}`, body, tt);
  }
}

interface Vec3 { x: number; y: number; z: number }

function rotate(m: RotationMatrix, v: Vec3): Vec3 {
  // astronomy-engine stores rotations so that v' = v · rot (row vector convention).
  const r = m.rot;
  return {
    x: r[0]![0]! * v.x + r[1]![0]! * v.y + r[2]![0]! * v.z,
    y: r[0]![1]! * v.x + r[1]![1]! * v.y + r[2]![1]! * v.z,
    z: r[0]![2]! * v.x + r[1]![2]! * v.y + r[2]![2]! * v.z,
  };
}

function wrap2Pi(a: number): number {
  const r = a % TWO_PI;
  return r < 0 ? r + TWO_PI : r;
}

/** Spherical coordinates and their rates from a position and (optionally) a velocity. */
function toState(body: PositionBody, seenFrom: Viewpoint, tt: number, p: Vec3, v: Vec3 | undefined, vForPos: Vec3 | undefined): EclipticState {
  const rho2 = p.x * p.x + p.y * p.y;
  const rho = Math.sqrt(rho2);
  const r = Math.sqrt(rho2 + p.z * p.z);
  if (!(r > 0)) throw new EphemerisError(`zero distance for ${body} seen from ${seenFrom === 'sun' ? 'the Sun' : 'Earth'}`, body, tt);
  let lonRate = NaN;
  let latRate = NaN;
  let rRate = NaN;
  if (v && vForPos) {
    // Rates from the geometric state (vForPos is its position): light time changes them negligibly.
    const q = vForPos;
    const qRho2 = q.x * q.x + q.y * q.y;
    const qR2 = qRho2 + q.z * q.z;
    lonRate = (q.x * v.y - q.y * v.x) / qRho2 + PRECESSION_RAD_PER_DAY;
    latRate = (v.z * qRho2 - q.z * (q.x * v.x + q.y * v.y)) / (qR2 * Math.sqrt(qRho2));
    rRate = (q.x * v.x + q.y * v.y + q.z * v.z) / Math.sqrt(qR2);
  }
  const state: EclipticState = {
    body, seenFrom, tt,
    lonRad: wrap2Pi(Math.atan2(p.y, p.x)),
    latRad: Math.atan2(p.z, rho),
    distanceAu: r,
    xAu: p.x, yAu: p.y, zAu: p.z,
    lonRateRadPerDay: lonRate, latRateRadPerDay: latRate, distanceRateAuPerDay: rRate,
  };
  checkFinite([state.lonRad, state.latRad, state.distanceAu], 'position', body, tt);
  if (v) checkFinite([lonRate, latRate, rRate], 'rate', body, tt);
  return state;
}

function yearOf(ut: number): number {
  return 2000 + ut / DAYS_PER_YEAR;
}

/**
 * Rough worst heliocentric position error (arcseconds) of the library's truncated VSOP87
 * at a year: log-linear through the worst 3-D errors measured against the full VSOP87
 * (project note EPHEMERIS-NOTES.md): 103″ inside 1000–3000, 350″ at 0 and 4000,
 * 5000″ at −3000 and +7000, extrapolated with the last slope beyond.
 */
export function estimatedPositionErrorArcsec(year: number): number {
  const beyond = year < 1000 ? 1000 - year : year > 3000 ? year - 3000 : 0;
  const pts: ReadonlyArray<readonly [number, number]> = [[0, 103], [1000, 350], [4000, 5000]];
  for (let i = 1; i < pts.length; i++) {
    const [d0, e0] = pts[i - 1]!;
    const [d1, e1] = pts[i]!;
    if (beyond <= d1 || i === pts.length - 1) {
      const f = (beyond - d0) / (d1 - d0);
      return Math.exp(Math.log(e0) + f * (Math.log(e1) - Math.log(e0)));
    }
  }
  return pts[pts.length - 1]![1];
}

function formatYearRough(y: number): string {
  return String(Math.round(y));
}

class AstronomyEngineSource implements EphemerisSource {
  readonly label = ENGINE_LABEL;
  readonly validity = 'truncated VSOP87 planetary theory: about 1′ (worst ≈ 100″) heliocentric over 1000–3000, degrading outside; Pluto tabulated for 0001–3999';

  frame(seenFrom: Viewpoint): string {
    return seenFrom === 'sun'
      ? 'heliocentric, geometric (no light time), true ecliptic and equinox of date'
      : 'geocentric, apparent (light time and annual aberration), true ecliptic and equinox of date';
  }

  states(bodies: readonly PositionBody[], seenFrom: Viewpoint, tt: number, withRates: boolean, budget: Budget): EclipticState[] {
    for (const b of bodies) {
      if (seenFrom === 'sun' && b === 'sun') throw new EphemerisError('the Sun has no position seen from the Sun', b, tt);
      if (seenFrom === 'earth' && b === 'earth') throw new EphemerisError('Earth has no position seen from Earth', b, tt);
      checkInstant(tt, b);
    }
    checkInstant(tt, undefined);
    const time = guarded('the time', undefined, tt, () => AstroTime.FromTerrestrialTime(tt));
    const rot = guarded('the ecliptic of date', undefined, tt, () => Rotation_EQJ_ECT(time));
    let earthState: { p: Vec3; v: Vec3 } | undefined;
    const earth = (): { p: Vec3; v: Vec3 } => {
      if (!earthState) {
        const s = guarded('Earth', 'earth', tt, () => HelioState(Body.Earth, time));
        earthState = { p: { x: s.x, y: s.y, z: s.z }, v: { x: s.vx, y: s.vy, z: s.vz } };
      }
      return earthState;
    };
    const out: EclipticState[] = [];
    for (const b of bodies) {
      budget.tick();
      const lib = LIBRARY_BODY[b];
      if (seenFrom === 'sun') {
        if (!withRates) {
          // Position only: the cheaper call.
          const h = guarded(b, b, tt, () => HelioVector(lib, time));
          out.push(toState(b, seenFrom, tt, rotate(rot, { x: h.x, y: h.y, z: h.z }), undefined, undefined));
          continue;
        }
        const s = guarded(b, b, tt, () => HelioState(lib, time));
        const p = rotate(rot, { x: s.x, y: s.y, z: s.z });
        out.push(toState(b, seenFrom, tt, p, rotate(rot, { x: s.vx, y: s.vy, z: s.vz }), p));
      } else {
        const g = guarded(b, b, tt, () => GeoVector(lib, time, true));
        const p = rotate(rot, { x: g.x, y: g.y, z: g.z });
        let v: Vec3 | undefined;
        let q: Vec3 | undefined;
        if (withRates) {
          let gp: Vec3;
          let gv: Vec3;
          if (b === 'moon') {
            const m = guarded(b, b, tt, () => GeoMoonState(time));
            gp = { x: m.x, y: m.y, z: m.z };
            gv = { x: m.vx, y: m.vy, z: m.vz };
          } else if (b === 'sun') {
            const e = earth();
            gp = { x: -e.p.x, y: -e.p.y, z: -e.p.z };
            gv = { x: -e.v.x, y: -e.v.y, z: -e.v.z };
          } else {
            const s = guarded(b, b, tt, () => HelioState(lib, time));
            const e = earth();
            gp = { x: s.x - e.p.x, y: s.y - e.p.y, z: s.z - e.p.z };
            gv = { x: s.vx - e.v.x, y: s.vy - e.v.y, z: s.vz - e.v.z };
          }
          q = rotate(rot, gp);
          v = rotate(rot, gv);
        }
        out.push(toState(b, seenFrom, tt, p, v, q));
      }
    }
    return out;
  }

  sunFromBarycentre(tt: number, budget: Budget): VectorAu {
    checkInstant(tt, 'ssb');
    budget.tick();
    const time = guarded('the time', 'ssb', tt, () => AstroTime.FromTerrestrialTime(tt));
    const v = guarded('the solar-system barycentre', 'ssb', tt, () => HelioVector(Body.SSB, time));
    checkFinite([v.x, v.y, v.z], 'barycentre vector', 'ssb', tt);
    return { xAu: -v.x, yAu: -v.y, zAu: -v.z };
  }

  lonRateBounds(body: PositionBody, seenFrom: Viewpoint): readonly [number, number] {
    const b = (seenFrom === 'sun' ? HELIO_RATE_DEG : GEO_RATE_DEG)[body];
    if (!b) throw new EphemerisError(`no longitude rate bound for ${body} seen from ${seenFrom === 'sun' ? 'the Sun' : 'Earth'}`, body, 0);
    return [b[0] * DEG, b[1] * DEG];
  }

  lonAccelBound(body: PositionBody, seenFrom: Viewpoint): number {
    const b = (seenFrom === 'sun' ? HELIO_ACCEL_DEG : GEO_ACCEL_DEG)[body];
    if (b === undefined) throw new EphemerisError(`no longitude acceleration bound for ${body} seen from ${seenFrom === 'sun' ? 'the Sun' : 'Earth'}`, body, 0);
    return b * DEG;
  }

  coverage(body: PositionBody): { readonly startTt: number; readonly endTt: number } {
    if (body === 'pluto') return { startTt: PLUTO_TABLE_TT[0], endTt: PLUTO_TABLE_TT[1] };
    return { startTt: -MAX_ABS_TT_DAYS, endTt: MAX_ABS_TT_DAYS };
  }

  accuracyWarning(startUt: number, endUt: number, bodies: readonly BuiltinBody[]): AccuracyWarning | undefined {
    const y0 = yearOf(Math.min(startUt, endUt));
    const y1 = yearOf(Math.max(startUt, endUt));
    const parts: string[] = [];
    let worst = 0;
    const planets = bodies.filter((b) => b !== 'sun' && b !== 'earth');
    if (planets.length > 0 && (y0 < 1000 || y1 > 3000)) {
      const farYear = (1000 - y0) > (y1 - 3000) ? y0 : y1;
      worst = estimatedPositionErrorArcsec(farYear);
      parts.push(`the span ${formatYearRough(y0)}–${formatYearRough(y1)} leaves 1000–3000, where the library's truncated planetary theory is good to about 100″; near ${formatYearRough(farYear)} its heliocentric position error may reach about ${worst.toFixed(0)}″ (${(worst / 3600).toFixed(2)}°)`);
    }
    if (bodies.includes('pluto') && (y0 < 1 || y1 > 3999)) {
      parts.push('Pluto is tabulated only for the years 0001–3999; outside them its positions are not available');
    }
    if (parts.length === 0) return undefined;
    return { message: `${parts.join('; ')}.`, estimatedErrorArcsec: worst };
  }
}

/** The default source: astronomy-engine. */
export const astronomyEngine: EphemerisSource = new AstronomyEngineSource();

/**
 * Position of one body at one instant (ecliptic of date), seen from the Sun or Earth.
 * @param tt TT, days since J2000
 * @param withRates also compute dλ/dt, dβ/dt, dr/dt from state vectors (NaN otherwise)
 * @throws EphemerisError on a library failure or a non-finite value; EphemerisRangeError outside coverage
 */
export function eclipticState(body: PositionBody, seenFrom: Viewpoint, tt: number, budget: Budget, withRates = false, source: EphemerisSource = astronomyEngine): EclipticState {
  return source.states([body], seenFrom, tt, withRates, budget)[0]!;
}

/** Angle between two position vectors, radians in [0, π] (robust near 0 and π: atan2 of |a×b| and a·b). */
export function angleBetweenRad(a: VectorAu, b: VectorAu): number {
  const cx = a.yAu * b.zAu - a.zAu * b.yAu;
  const cy = a.zAu * b.xAu - a.xAu * b.zAu;
  const cz = a.xAu * b.yAu - a.yAu * b.xAu;
  return Math.atan2(Math.sqrt(cx * cx + cy * cy + cz * cz), a.xAu * b.xAu + a.yAu * b.yAu + a.zAu * b.zAu);
}

/**
 * Elongation of a body from the Sun seen from Earth, radians in [0, π]. Two ticks.
 * @throws EphemerisError as {@link eclipticState}
 */
export function elongationRad(body: Exclude<PositionBody, 'sun' | 'earth'>, tt: number, budget: Budget, source: EphemerisSource = astronomyEngine): number {
  const [b, s] = source.states([body, 'sun'], 'earth', tt, false, budget);
  return angleBetweenRad(b!, s!);
}

/**
 * The Sun's offset from the solar-system barycentre (J2000 mean equator, au). The
 * library's barycentre includes only the four giant planets (its gravity simulator uses
 * all eight: about 600 km difference in the offset).
 */
export function sunFromBarycentre(tt: number, budget: Budget, source: EphemerisSource = astronomyEngine): VectorAu {
  return source.sunFromBarycentre(tt, budget);
}

/**
 * Warning with the estimated position error when dates leave ~1000–3000, where the
 * library's truncated planetary theory is good, and when Pluto is asked for outside
 * 0001–3999. `undefined` when the span is fine.
 * @param startUt, endUt UT days since J2000 (either order)
 */
export function accuracyWarning(startUt: number, endUt: number, bodies: readonly BuiltinBody[], source: EphemerisSource = astronomyEngine): AccuracyWarning | undefined {
  return source.accuracyWarning(startUt, endUt, bodies);
}

/**
 * The library's mean sidereal period of a planet, days (for cross-checking the published
 * table in compute/bodies.ts). `undefined` for the Sun, Moon and barycentre.
 */
export function libraryOrbitalPeriodDays(body: BuiltinBody): number | undefined {
  if (body === 'sun' || body === 'moon' || body === 'ssb') return undefined;
  return guarded('the orbital period', body, 0, () => PlanetOrbitalPeriod(LIBRARY_BODY[body]));
}

/**
 * A zero of `f` (a function of TT days) between `startTt` and `endTt` with the library's
 * root finder, guarded against its sharp edges: the ends must bracket a sign change
 * (checked here, since the finder may return a descending root through its interpolation
 * shortcut), the tolerance must be positive (the finder reads options with `||`, so 0
 * would silently become 1 s) and the returned root must lie in the window and between
 * values of opposite sign (else bisection takes over). Each call of `f` should tick the budget itself.
 * @returns the root, or `none-in-window` when the ends do not change sign
 * @throws RangeError for a non-positive tolerance or an empty window; EphemerisError when the library fails
 */
export function findZero(f: (tt: number) => number, startTt: number, endTt: number, toleranceSeconds = 1): RootResult {
  if (!(toleranceSeconds > 0)) throw new RangeError('tolerance must be a positive number of seconds');
  if (!(endTt > startTt)) throw new RangeError('the window must end after it starts');
  const f1 = f(startTt);
  const f2 = f(endTt);
  checkFinite([f1, f2], 'function value', undefined, startTt);
  if (f1 === 0) return { kind: 'root', tt: startTt };
  if (f2 === 0) return { kind: 'root', tt: endTt };
  if (Math.sign(f1) === Math.sign(f2)) return { kind: 'none-in-window', startTt, endTt };
  // The finder looks for ascending roots: flip a descending bracket.
  const s = f1 < 0 ? 1 : -1;
  const t1 = guarded('the window start', undefined, startTt, () => AstroTime.FromTerrestrialTime(startTt));
  const t2 = guarded('the window end', undefined, endTt, () => AstroTime.FromTerrestrialTime(endTt));
  const found = guarded('a root', undefined, startTt, () => Search((t) => s * f(t.tt), t1, t2, { dt_tolerance_seconds: toleranceSeconds, init_f1: s * f1, init_f2: s * f2 }));
  const tolDays = toleranceSeconds / 86400;
  if (found !== null) {
    const tt = found.tt;
    const inWindow = tt >= startTt - tolDays && tt <= endTt + tolDays;
    // Accept only an ascending crossing (of s·f); otherwise fall back to bisection, which cannot be fooled.
    if (inWindow && s * f(Math.max(startTt, tt - tolDays)) <= 0 && s * f(Math.min(endTt, tt + tolDays)) >= 0) return { kind: 'root', tt };
  }
  let lo = startTt;
  let hi = endTt;
  while (hi - lo > tolDays) {
    const mid = 0.5 * (lo + hi);
    if (s * f(mid) < 0) lo = mid; else hi = mid;
  }
  const tt = 0.5 * (lo + hi);
  return { kind: 'root', tt };
}

/** The planets a barycentre can be summed over ('earth' stands for the Earth–Moon barycentre). */
export type BarycentrePlanet = 'mercury' | 'venus' | 'earth' | 'mars' | 'jupiter' | 'saturn' | 'uranus' | 'neptune';

/**
 * One planet's term of the solar-system barycentre: its heliocentric position (geometric,
 * J2000 mean equator and equinox, au) and its mass over the Sun's (the library's GM values;
 * the giants' include their satellites). For 'earth', the Earth–Moon barycentre and the
 * Earth's plus the Moon's mass. One tick.
 *
 * Why: the library's own barycentre vector adds each giant's two-body shift mᵢ/(1 + mᵢ)·rᵢ,
 * which differs from the centre of mass Σ mᵢ rᵢ / (1 + Σ mᵢ) by up to about 1,200 km; the
 * `barycentre` statement sums the terms itself.
 * @throws EphemerisError on a library failure; EphemerisRangeError beyond ±100,000 years
 */
export function barycentreTerm(body: BarycentrePlanet, tt: number, budget: Budget): VectorAu & { readonly massRatio: number } {
  checkInstant(tt, body);
  budget.tick();
  const lib = body === 'earth' ? Body.EMB : LIBRARY_BODY[body];
  const time = guarded('the time', body, tt, () => AstroTime.FromTerrestrialTime(tt));
  const v = guarded(body, body, tt, () => HelioVector(lib, time));
  const massRatio = guarded('a mass', body, tt, () => MassProduct(lib) / MassProduct(Body.Sun));
  checkFinite([v.x, v.y, v.z, massRatio], 'position', body, tt);
  return { xAu: v.x, yAu: v.y, zAu: v.z, massRatio };
}
