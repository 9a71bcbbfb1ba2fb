/**
 * The Sun's offset from the barycentre of the Sun and a set of planets.
 *
 * With heliocentric planet positions rᵢ and masses mᵢ in units of the Sun's mass, the barycentre
 * lies at Σ mᵢ rᵢ / (1 + Σ mᵢ) from the Sun, so the Sun sits at
 *   r☉ = −Σ mᵢ rᵢ / (1 + Σ mᵢ)
 * from the barycentre (the definition of the centre of mass; e.g. Murray & Dermott, Solar System
 * Dynamics, 1999, §2.2). The distance |r☉| is sampled over a span, its turning points are refined
 * by Brent's minimiser, and its dominant periods are read off a floating-mean Lomb–Scargle
 * periodogram of the sampled distance (compute/periodogram.ts).
 *
 * Pure: positions come in through {@link HeliocentricPlanets} (the source charges the budget);
 * {@link ephemerisPlanets} builds one on compute/ephemeris.ts.
 */
import { findMinimum } from './brent.js';
import { barycentreTerm, type BarycentrePlanet } from './ephemeris.js';
import { Budget } from './limits.js';
import { periodogram as lombScargle, type FrequencyGrid, type Peak } from './periodogram.js';
import { AU_KM } from './quantity.js';

/** Planets whose heliocentric positions are known, with their masses. */
export interface HeliocentricPlanets {
  /** The planets included, each with its mass (planet plus satellites) over the Sun's mass. */
  readonly planets: ReadonlyArray<{ readonly name: string; readonly massRatio: number }>;
  /** The frame of the positions, in words (e.g. `J2000 mean ecliptic and equinox`). */
  readonly frame: string;
  /**
   * Heliocentric positions at a TT instant (days since J2000.0), in AU, written into `out` as
   * x, y, z per planet in the order of `planets` (x–y is the ecliptic plane of the frame).
   * Charges its budget, if it has one; may throw the budget's and the ephemeris's errors.
   */
  positionsAu(ttDays: number, out: Float64Array): void;
}

/** The four giant planets: the members of the library's barycentre `ssb`. */
export const GIANT_PLANETS: readonly BarycentrePlanet[] = ['jupiter', 'saturn', 'uranus', 'neptune'];
/** All eight planets. */
export const ALL_PLANETS: readonly BarycentrePlanet[] = ['mercury', 'venus', 'earth', 'mars', 'jupiter', 'saturn', 'uranus', 'neptune'];

/** Obliquity of the ecliptic at J2000.0, 84381.406″ (IAU 2006; Capitaine, Wallace & Chapront 2003, A&A 412, 567). */
const OBLIQUITY_J2000_RAD = (84381.406 / 3600) * (Math.PI / 180);

/**
 * Planets from the ephemeris adapter (compute/ephemeris.ts), rotated from the J2000 mean equator
 * to the J2000 mean ecliptic (a rotation by the obliquity about x). One budget tick per planet.
 */
export function ephemerisPlanets(names: readonly BarycentrePlanet[], budget: Budget): HeliocentricPlanets {
  const probe = new Budget();
  const planets = names.map((name) => ({ name, massRatio: barycentreTerm(name, 0, probe).massRatio }));
  const c = Math.cos(OBLIQUITY_J2000_RAD);
  const sn = Math.sin(OBLIQUITY_J2000_RAD);
  return {
    planets,
    frame: 'heliocentric geometric positions, J2000 mean ecliptic and equinox',
    positionsAu(tt: number, out: Float64Array): void {
      for (let i = 0; i < names.length; i++) {
        const v = barycentreTerm(names[i]!, tt, budget);
        out[3 * i] = v.xAu;
        out[3 * i + 1] = c * v.yAu + sn * v.zAu;
        out[3 * i + 2] = -sn * v.yAu + c * v.zAu;
      }
    },
  };
}

/** The Sun's position relative to the barycentre, km. */
export interface SunOffset { readonly xKm: number; readonly yKm: number; readonly zKm: number; readonly distanceKm: number }

/** A function that gives the Sun's offset at a TT instant, in the frame of the source. */
export function sunOffsetFunction(source: HeliocentricPlanets): (ttDays: number) => SunOffset {
  const k = source.planets.length;
  const out = new Float64Array(3 * k);
  let massSum = 0;
  for (const p of source.planets) {
    if (!(p.massRatio >= 0 && Number.isFinite(p.massRatio))) throw new RangeError(`mass of ${p.name} must be a non-negative number`);
    massSum += p.massRatio;
  }
  const scale = -AU_KM / (1 + massSum);
  return (tt: number): SunOffset => {
    source.positionsAu(tt, out);
    let x = 0, y = 0, z = 0;
    for (let i = 0; i < k; i++) {
      const m = source.planets[i]!.massRatio;
      x += m * out[3 * i]!;
      y += m * out[3 * i + 1]!;
      z += m * out[3 * i + 2]!;
    }
    x *= scale; y *= scale; z *= scale;
    return { xKm: x, yKm: y, zKm: z, distanceKm: Math.hypot(x, y, z) };
  };
}

/** A refined local maximum or minimum of the distance. */
export interface TurningPoint {
  readonly kind: 'max' | 'min';
  readonly tt: number;
  readonly distanceKm: number;
}

export interface BarycentreOptions {
  /** Span, TT days since J2000.0. */
  readonly fromTt: number;
  readonly toTt: number;
  /** Sampling step, days (> 0). */
  readonly stepDays: number;
  /** Charged by the periodogram (positions are charged by the source). */
  readonly budget?: Budget;
  /** Tolerance on the instants of turning points, days; default 1e-3. */
  readonly extremumToleranceDays?: number;
  /** Period range searched for dominant periods, days; defaults: 4 steps (at least 2 yr) to the span. */
  readonly minPeriodDays?: number;
  readonly maxPeriodDays?: number;
  /** How many periodogram peaks to return; default 5. */
  readonly peaks?: number;
}

export interface BarycentreAnalysis {
  /** Sample instants (TT days since J2000.0) and the offset at each, km. */
  readonly tt: readonly number[];
  readonly xKm: readonly number[];
  readonly yKm: readonly number[];
  readonly zKm: readonly number[];
  readonly distanceKm: readonly number[];
  /** The largest and smallest distance over the span (refined; may sit at an end of the span). */
  readonly max: TurningPoint;
  readonly min: TurningPoint;
  /** Every interior local maximum and minimum, in time order, refined. */
  readonly turningPoints: readonly TurningPoint[];
  /** Dominant periods of the distance, highest power first; empty when the span is too short. */
  readonly peaks: readonly Peak[];
  /** The periodogram behind `peaks` (absent when the span is too short). */
  readonly periodogram?: { readonly grid: FrequencyGrid; readonly power: Float64Array; readonly minPeriodDays: number; readonly maxPeriodDays: number };
  /** Planet-position evaluations used. */
  readonly evaluations: number;
}

const YEAR_DAYS = 365.25;

/**
 * Sample, refine and analyse the Sun's offset from the barycentre over a span.
 * @throws RangeError for a bad span or step; whatever the budget throws (LimitError, CancelledError).
 */
export function analyseBarycentre(source: HeliocentricPlanets, options: BarycentreOptions): BarycentreAnalysis {
  const { fromTt, toTt, stepDays, budget } = options;
  if (!(Number.isFinite(fromTt) && Number.isFinite(toTt) && toTt > fromTt)) throw new RangeError('the end of the span must come after its start');
  if (!(stepDays > 0 && Number.isFinite(stepDays))) throw new RangeError('the step must be a positive time');
  const count = Math.ceil((toTt - fromTt) / stepDays) + 1;
  if (count < 3) throw new RangeError('the span holds fewer than three steps: use a smaller step');
  let evaluations = 0;
  const raw = sunOffsetFunction(source);
  const at = (tt: number): SunOffset => { evaluations += source.planets.length; return raw(tt); };
  const dist = (tt: number): number => at(tt).distanceKm;

  const tt: number[] = [];
  const xKm: number[] = [];
  const yKm: number[] = [];
  const zKm: number[] = [];
  const distanceKm: number[] = [];
  for (let i = 0; i < count; i++) {
    const t = Math.min(fromTt + i * stepDays, toTt);
    const o = at(t);
    tt.push(t); xKm.push(o.xKm); yKm.push(o.yKm); zKm.push(o.zKm); distanceKm.push(o.distanceKm);
  }

  const tol = options.extremumToleranceDays ?? 1e-3;
  const turningPoints: TurningPoint[] = [];
  for (let i = 1; i < count - 1; i++) {
    const d0 = distanceKm[i - 1]!, d1 = distanceKm[i]!, d2 = distanceKm[i + 1]!;
    if (d1 >= d0 && d1 > d2) {
      const m = findMinimum((t) => -dist(t), tt[i - 1]!, tt[i + 1]!, tol, { x: tt[i]!, fx: -d1 });
      turningPoints.push({ kind: 'max', tt: m.x, distanceKm: -m.fx });
    } else if (d1 <= d0 && d1 < d2) {
      const m = findMinimum(dist, tt[i - 1]!, tt[i + 1]!, tol, { x: tt[i]!, fx: d1 });
      turningPoints.push({ kind: 'min', tt: m.x, distanceKm: m.fx });
    }
  }
  const ends: TurningPoint[] = [
    { kind: 'max', tt: tt[0]!, distanceKm: distanceKm[0]! },
    { kind: 'max', tt: tt[count - 1]!, distanceKm: distanceKm[count - 1]! },
  ];
  const pick = (kind: 'max' | 'min'): TurningPoint => {
    const better = (a: TurningPoint, b: TurningPoint): boolean => (kind === 'max' ? a.distanceKm > b.distanceKm : a.distanceKm < b.distanceKm);
    let best: TurningPoint = { ...ends[0]!, kind };
    for (const c of [...turningPoints.filter((p) => p.kind === kind), { ...ends[1]!, kind }]) if (better(c, best)) best = c;
    return best;
  };

  // Dominant periods: a periodogram of the sampled distance (deterministic, so no false-alarm figure).
  const span = toTt - fromTt;
  const minP = options.minPeriodDays ?? Math.max(4 * stepDays, 2 * YEAR_DAYS);
  const maxP = options.maxPeriodDays ?? span;
  let peaks: Peak[] = [];
  let periodogram: BarycentreAnalysis['periodogram'];
  if (maxP > minP && span >= 2 * minP) {
    // The library routine checks the grid against the budget before any work.
    const pg = lombScargle({ tDays: tt, values: distanceKm }, { minPeriodDays: minP, maxPeriodDays: maxP, peaks: options.peaks ?? 5, ...(budget ? { budget } : {}) });
    peaks = [...pg.peaks];
    periodogram = { grid: pg.grid, power: pg.power, minPeriodDays: minP, maxPeriodDays: maxP };
  }
  return {
    tt, xKm, yKm, zKm, distanceKm,
    max: pick('max'), min: pick('min'), turningPoints, peaks,
    ...(periodogram ? { periodogram } : {}),
    evaluations,
  };
}
