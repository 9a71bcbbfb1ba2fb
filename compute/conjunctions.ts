/**
 * Conjunctions (equal ecliptic longitude of two bodies) and oppositions (a planet 180°
 * from the Sun) in a span, seen from the Sun or from Earth, in the ecliptic of date
 * (see compute/ephemeris.ts for why).
 *
 * Both searches look for zeros of an angle difference f(t) = λa − λb (− π for an
 * opposition), wrapped to (−π, π], and choose between two methods from bounds on the
 * bodies' longitude rates:
 *
 * - **Monotone** (the rate bounds of f exclude zero: heliocentric planet pairs, the Moon
 *   with anything, the Sun with a superior planet, oppositions). Each event is predicted
 *   from the mean motions, bracketed by the rate bounds (the root after an instant where
 *   f is D short of the target lies between D/rMax and D/rMin later), and refined by
 *   safeguarded Newton steps on the longitude rates taken from state vectors. The
 *   iteration stops without a further evaluation once the quadratic convergence of
 *   Newton's method (error ≈ f″/(2f′)·step²) puts the error under the tolerance.
 * - **Adaptive** (f can turn: geocentric pairs with retrograde loops, Mercury or Venus
 *   with the Sun, Neptune–Pluto). From an instant with |f| = d the next zero is at least
 *   d / R away, R being the bound on |f′|, so the search steps that far (at least
 *   `minStepDays`); every sign change is refined as above; where a step ends on a
 *   same-sign pair of values close enough to zero for a dip through zero and back, and
 *   the rates show the dip, the extremum is located and tested, so near-tangent double
 *   crossings are not missed.
 *
 * Geocentric events also get the minimum angular separation near the conjunction and its
 * time (Newton iteration on a locally linear relative motion, falling back to Brent's
 * minimiser), and the elongation from the Sun.
 */
import { findMinimum } from './brent.js';
import { SIDEREAL_PERIOD_DAYS } from './bodies.js';
import {
  angleBetweenRad, astronomyEngine,
  type EclipticState, type EphemerisSource, type PositionBody, type Viewpoint,
} from './ephemeris.js';
import { LimitError, type Budget } from './limits.js';
import { instantFromTt, type Instant } from './time.js';

const TWO_PI = 2 * Math.PI;
const DEG = Math.PI / 180;

/** Wrap an angle to (−π, π]. */
export function wrapPi(a: number): number {
  let r = a % TWO_PI;
  if (r <= -Math.PI) r += TWO_PI;
  else if (r > Math.PI) r -= TWO_PI;
  return r;
}

/** What {@link findConjunctions} searches: two bodies, a span (TT instants), a viewpoint. */
export interface ConjunctionQuery {
  readonly a: PositionBody;
  readonly b: PositionBody;
  readonly start: Instant;
  readonly end: Instant;
  readonly seenFrom: Viewpoint;
  /** Keep only events whose (minimum, for geocentric) separation is at most this, radians. */
  readonly withinRad?: number;
  readonly budget: Budget;
  /** Defaults to astronomy-engine. */
  readonly source?: EphemerisSource;
  /** Time tolerance of every refined instant, seconds (default 1). */
  readonly toleranceSeconds?: number;
  /** Force a method (benchmarks and tests); by default chosen from the rate bounds. */
  readonly method?: 'monotone' | 'adaptive';
}

/** One conjunction in ecliptic longitude of date; angles in radians, distances in au. */
export interface ConjunctionEvent {
  /** Instant of equal ecliptic longitude. */
  readonly instant: Instant;
  /** Common ecliptic longitude of date, radians in [0, 2π). */
  readonly lonRad: number;
  readonly latARad: number;
  readonly latBRad: number;
  readonly distanceAAu: number;
  readonly distanceBAu: number;
  /** Angular separation at the longitude conjunction, radians. */
  readonly separationRad: number;
  /** Geocentric only: smallest separation near the conjunction and when. */
  readonly minSeparation?: { readonly instant: Instant; readonly separationRad: number };
  /** Geocentric only: angle of body `a` (or `b` when `a` is the Sun) from the Sun at the conjunction, radians. */
  readonly elongationRad?: number;
  /** Mercury or Venus with the Sun, seen from Earth: on the near or far side of the Sun. */
  readonly kind?: 'inferior' | 'superior';
}

/** Events in ascending time, with the evaluations used, the frame and the method in words. */
export interface ConjunctionSearchResult {
  readonly events: readonly ConjunctionEvent[];
  /** Ephemeris evaluations used (one per body per instant). */
  readonly evaluations: number;
  readonly frame: string;
  readonly method: string;
  readonly methodKind: 'monotone' | 'adaptive';
}

/** What {@link findOppositions} searches: a superior planet and a span. */
export interface OppositionQuery {
  readonly a: PositionBody;
  readonly start: Instant;
  readonly end: Instant;
  readonly budget: Budget;
  readonly source?: EphemerisSource;
  readonly toleranceSeconds?: number;
}

/** One geocentric opposition (apparent longitudes of date 180° apart). */
export interface OppositionEvent {
  readonly instant: Instant;
  /** Geocentric ecliptic longitude of date of the planet, radians. */
  readonly lonRad: number;
  readonly latRad: number;
  /** Geocentric distance, au. */
  readonly distanceAu: number;
  /** Angle from the Sun, radians (180° less the latitude effect). */
  readonly elongationRad: number;
}

/** Oppositions in ascending time, with the evaluations used, the frame and the method. */
export interface OppositionSearchResult {
  readonly events: readonly OppositionEvent[];
  readonly evaluations: number;
  readonly frame: string;
  readonly method: string;
}

/** The bodies the searches can position. */
export const SUPERIOR_PLANETS: readonly PositionBody[] = ['mars', 'jupiter', 'saturn', 'uranus', 'neptune', 'pluto'];

/** One evaluation of the difference function: value (wrapped), rate, and the states behind it. */
interface Probe {
  readonly tt: number;
  readonly f: number;
  readonly rate: number;
  readonly states: readonly EclipticState[];
}

type ProbeFn = (tt: number) => Probe;

/** Mean rate of geocentric or heliocentric longitude, radians per day, from the sidereal periods. */
function meanLonRate(body: PositionBody, seenFrom: Viewpoint): number {
  const period = (id: PositionBody): number => {
    const p = SIDEREAL_PERIOD_DAYS[id];
    if (p === undefined) throw new RangeError(`no mean period for ${id}`);
    return p;
  };
  if (seenFrom === 'earth' && (body === 'sun' || body === 'mercury' || body === 'venus')) return TWO_PI / period('earth');
  return TWO_PI / period(body);
}

function checkEvents(n: number, budget: Budget): void {
  if (n > budget.limits.maxEvents) {
    throw new LimitError(`search stopped after ${budget.limits.maxEvents} events`, 'max-events',
      'shorten the span, or raise the setting orbitNotes.limits.maxEvents / the CLI flag --max-events');
  }
}

/**
 * Safeguarded Newton refinement of a zero of f inside [lo, hi] (f wrapped, small there).
 * `first` is an evaluated point inside the bracket. Returns the root and the last probe.
 */
function refine(probe: ProbeFn, first: Probe, loIn: number, hiIn: number, signLo: number, tolDays: number): { tt: number; last: Probe } {
  let lo = loIn;
  let hi = hiIn;
  let p = first;
  let prev: Probe | undefined;
  for (let iter = 0; iter < 100; iter++) {
    // Keep the bracket: the sign at lo is signLo.
    if (Math.sign(p.f) === signLo) lo = Math.max(lo, p.tt); else if (p.f !== 0) hi = Math.min(hi, p.tt);
    if (p.f === 0) return { tt: p.tt, last: p };
    let step = -p.f / p.rate;
    let next = p.tt + step;
    const newtonOk = Number.isFinite(step) && next > lo && next < hi;
    if (!newtonOk) { next = 0.5 * (lo + hi); step = next - p.tt; }
    if (newtonOk) {
      if (Math.abs(step) <= tolDays) return { tt: next, last: p };
      if (prev) {
        // Quadratic convergence: the error left after this step is about |f″/(2f′)|·step².
        const curvature = Math.abs((p.rate - prev.rate) / (p.tt - prev.tt));
        if (Number.isFinite(curvature) && (curvature / (2 * Math.abs(p.rate))) * step * step <= 0.25 * tolDays) return { tt: next, last: p };
      }
    }
    if (hi - lo <= tolDays) return { tt: 0.5 * (lo + hi), last: p };
    prev = p;
    p = probe(next);
  }
  return { tt: p.tt, last: p };
}

interface RootFound { readonly tt: number; readonly last: Probe }

/**
 * Monotone method. `g = s·f` increases at a rate within [rMin, rMax] (> 0) and at the mean
 * rate `nMean` in the long run. Calls `onRoot` for every zero of f in (startTt, endTt].
 * @returns false when a rate bound proved wrong (the caller falls back to the adaptive method)
 */
function monotoneRoots(probe: ProbeFn, startTt: number, endTt: number, s: 1 | -1, rMin: number, rMax: number, nMean: number, tolDays: number, onRoot: (r: RootFound) => void): boolean {
  let anchor = probe(startTt);
  // Remaining increase of g until the next zero of f.
  const g0 = s * anchor.f;
  let remaining = g0 < 0 ? -g0 : TWO_PI - g0;
  if (g0 === 0) remaining = 0;
  // Longest step from an anchor for which the unwrapped value is still unambiguous.
  const maxUnwrapStep = rMax > rMin ? (1.5 * Math.PI) / (rMax - rMin) : Infinity;
  for (;;) {
    let lo = anchor.tt + remaining / rMax;
    let hi = anchor.tt + remaining / rMin;
    if (lo > endTt) return true;
    let guess = Math.min(Math.max(anchor.tt + remaining / nMean, lo), hi);
    let root: RootFound | undefined;
    if (remaining === 0) root = { tt: anchor.tt, last: anchor };
    while (!root) {
      const target = Math.min(guess, anchor.tt + maxUnwrapStep);
      const p = probe(target);
      // Unwrap: the remaining increase lies in [remaining − rMax·dt, remaining − rMin·dt].
      const dt = p.tt - anchor.tt;
      const mid = remaining - 0.5 * (rMax + rMin) * dt;
      const wrappedRem = -s * p.f;
      const rem = wrappedRem + TWO_PI * Math.round((mid - wrappedRem) / TWO_PI);
      if (rem > 0) { lo = Math.max(lo, p.tt + rem / rMax); hi = Math.min(hi, p.tt + rem / rMin); } else { lo = Math.max(lo, p.tt + rem / rMin); hi = Math.min(hi, p.tt + rem / rMax); }
      if (hi < lo - tolDays) return false;
      anchor = p;
      remaining = rem;
      if (target < guess) {
        if (lo > endTt) return true;
        guess = Math.min(Math.max(anchor.tt + remaining / nMean, lo), hi);
        continue;
      }
      if (Math.abs(rem) < Math.PI / 2) {
        // Close: f itself is unambiguous; refine the zero of f in [lo, hi].
        const r = refine(probe, p, lo, hi, -s, tolDays);
        // A rate bound that proved wrong shows as a bracket collapsing away from the zero.
        if (Math.abs(r.last.f + r.last.rate * (r.tt - r.last.tt)) > 1e-6) return false;
        root = r;
      } else {
        guess = Math.min(Math.max(anchor.tt + remaining / nMean, lo), hi);
      }
    }
    if (root.tt > endTt) return true;
    if (root.tt > startTt) onRoot(root);
    // Next event: g must increase by a full turn from the root, measured from the last probe.
    remaining = TWO_PI - s * root.last.rate * (root.last.tt - root.tt);
    anchor = root.last;
  }
}

/**
 * Adaptive method for an f that can turn. Calls `onRoot` for every zero in (startTt, endTt].
 *
 * Step from an instant where f is d from zero and approaching at speed v (negative when
 * receding): with |f′| ≤ R and |f″| ≤ A no zero can come before
 * max(d/R, (−v + √(v² + 2Ad))/A), so that step is always safe. When approaching, the
 * step may reach 5 % past the linearly predicted crossing (capped at R/(2A), which keeps
 * at most one turn of f inside a step): a crossing then shows as a sign change, a near miss
 * as a dip that is probed.
 * @param rBound bound on |f′|, radians per day
 * @param aBound bound on |f″|, radians per day²
 */
function adaptiveRoots(probe: ProbeFn, startTt: number, endTt: number, rBound: number, aBound: number, minStepDays: number, tolDays: number, onRoot: (r: RootFound) => void): void {
  let p = probe(startTt);
  const found = (r: RootFound): void => { if (r.tt > startTt && r.tt <= endTt) onRoot(r); };
  const bracketRoot = (a: Probe, b: Probe): void => {
    const first = Math.abs(a.f) < Math.abs(b.f) ? a : b;
    found(refine(probe, first, a.tt, b.tt, Math.sign(a.f), tolDays));
  };
  // Same-sign pair close to zero: probe the extremum between them for a hidden pair of crossings.
  const probeDip = (a: Probe, b: Probe, depth: number): void => {
    if (Math.abs(a.f) + Math.abs(b.f) > rBound * (b.tt - a.tt)) return;  // cannot reach zero
    const towardAtA = a.f * a.rate < 0;
    const awayAtB = b.f * b.rate > 0;
    if (!towardAtA || !awayAtB || b.tt - a.tt <= tolDays || depth > 40) return;
    const L = b.tt - a.tt;
    // The lowest |f| the curvature allows between the two ends (tangent-line bound).
    const m0 = a.tt + L * (a.rate / (a.rate - b.rate));
    const lowest = Math.abs(a.f) - Math.abs(a.rate) * (m0 - a.tt) - 0.5 * aBound * (m0 - a.tt) ** 2;
    if (lowest > 0 && Math.abs(b.f) - Math.abs(b.rate) * (b.tt - m0) - 0.5 * aBound * (b.tt - m0) ** 2 > 0) return;
    const m = Math.min(Math.max(m0, a.tt + 0.1 * L), b.tt - 0.1 * L);
    const pm = probe(m);
    if (pm.f === 0 || Math.sign(pm.f) !== Math.sign(a.f)) {
      bracketRoot(a, pm);
      bracketRoot(pm, b);
      return;
    }
    probeDip(a, pm, depth + 1);
    probeDip(pm, b, depth + 1);
  };
  const cap = rBound / (2 * aBound);
  while (p.tt < endTt) {
    const d = Math.abs(p.f);
    const v = -Math.sign(p.f) * p.rate;
    const safe = Math.max(d / rBound, (-v + Math.sqrt(v * v + 2 * aBound * d)) / aBound);
    const reach = v > 0 ? Math.min(1.05 * d / v, cap) : 0;
    const h = Math.max(minStepDays, safe, reach);
    const q = probe(Math.min(p.tt + h, endTt));
    const wrapped = Math.abs(q.f - p.f) > Math.PI;
    if (!wrapped && (q.f === 0 || Math.sign(q.f) !== Math.sign(p.f))) {
      bracketRoot(p, q);
    } else if (!wrapped) {
      probeDip(p, q, 0);
    }
    p = q;
  }
}

function timeTolDays(q: { toleranceSeconds?: number }): number {
  const s = q.toleranceSeconds ?? 1;
  if (!(s > 0)) throw new RangeError('the time tolerance must be a positive number of seconds');
  return s / 86400;
}

function checkWindow(start: Instant, end: Instant, budget: Budget, bodies: readonly PositionBody[], source: EphemerisSource): void {
  budget.checkSpan(end.tt - start.tt);
  for (const b of bodies) {
    const c = source.coverage(b);
    if (start.tt < c.startTt || end.tt > c.endTt) {
      // Let the adapter raise its own, worded range error.
      source.states([b], b === 'earth' ? 'sun' : 'earth', start.tt < c.startTt ? start.tt : end.tt, false, budget);
    }
  }
}

/** Separation (radians) of the two bodies of a probe's states. */
function separation(states: readonly EclipticState[]): number {
  return angleBetweenRad(states[0]!, states[1]!);
}

/**
 * Time of least separation near a geocentric conjunction: Newton iteration on the
 * locally linear relative motion in the tangent plane (τ = −u·u′ / u′·u′), each step from
 * fresh states; Brent's minimiser over the window when that does not settle.
 */
function minimumSeparation(states: (tt: number, rates: boolean) => EclipticState[], atConj: Probe, loTt: number, hiTt: number, tolDays: number): { tt: number; separationRad: number } {
  let st = atConj.states;
  let t = atConj.tt;
  for (let i = 0; i < 6; i++) {
    const [a, b] = [st[0]!, st[1]!];
    const cosB = Math.cos(0.5 * (a.latRad + b.latRad));
    const ux = wrapPi(a.lonRad - b.lonRad) * cosB;
    const uy = a.latRad - b.latRad;
    const vx = (a.lonRateRadPerDay - b.lonRateRadPerDay) * cosB;
    const vy = a.latRateRadPerDay - b.latRateRadPerDay;
    const vv = vx * vx + vy * vy;
    if (!(vv > 0)) break;
    const tau = -(ux * vx + uy * vy) / vv;
    const next = t + tau;
    if (next < loTt || next > hiTt) break;
    if (Math.abs(tau) <= Math.max(tolDays, 30 / 86400)) {
      const s = states(next, false);
      return { tt: next, separationRad: separation(s) };
    }
    t = next;
    st = states(t, true);
  }
  const m = findMinimum((x) => separation(states(x, false)), loTt, hiTt, Math.max(tolDays, 30 / 86400), { x: atConj.tt, fx: separation(atConj.states) });
  return { tt: m.x, separationRad: m.fx };
}

/**
 * Every conjunction in ecliptic longitude of two bodies between `start` and `end`.
 *
 * Seen from the Sun: planets (Earth included), not the Sun or the Moon. Seen from Earth:
 * the Sun, the Moon and the planets except Earth. Events are ascending in time; each
 * instant is within the tolerance (default 1 s) of the ephemeris's own root.
 *
 * @throws RangeError for bodies that cannot be paired this way (the handler words it);
 *   LimitError for the span, evaluation or event limits; CancelledError; EphemerisError /
 *   EphemerisRangeError from the ephemeris (e.g. Pluto outside 0001–3999)
 */
export function findConjunctions(q: ConjunctionQuery): ConjunctionSearchResult {
  const source = q.source ?? astronomyEngine;
  const { a, b, seenFrom, budget } = q;
  if (a === b) throw new RangeError('a conjunction needs two different bodies');
  if (seenFrom === 'sun' && (a === 'sun' || b === 'sun' || a === 'moon' || b === 'moon')) {
    throw new RangeError('seen from the Sun, only planets (Earth included) have conjunctions; the Moon moves with Earth');
  }
  if (seenFrom === 'earth' && (a === 'earth' || b === 'earth')) throw new RangeError('seen from Earth, Earth has no position');
  const tolDays = timeTolDays(q);
  checkWindow(q.start, q.end, budget, [a, b], source);
  const evalsBefore = budget.evaluations;

  const states = (tt: number, rates: boolean): EclipticState[] => source.states([a, b], seenFrom, tt, rates, budget);
  const probe: ProbeFn = (tt) => {
    const st = states(tt, true);
    const [sa, sb] = [st[0]!, st[1]!];
    return { tt, f: wrapPi(sa.lonRad - sb.lonRad), rate: sa.lonRateRadPerDay - sb.lonRateRadPerDay, states: st };
  };

  const [aMin, aMax] = source.lonRateBounds(a, seenFrom);
  const [bMin, bMax] = source.lonRateBounds(b, seenFrom);
  const fMin = aMin - bMax;
  const fMax = aMax - bMin;
  const monotone = q.method ? q.method === 'monotone' : fMin > 0 || fMax < 0;
  const rBound = Math.max(Math.abs(aMin), Math.abs(aMax)) + Math.max(Math.abs(bMin), Math.abs(bMax));
  const aBound = source.lonAccelBound(a, seenFrom) + source.lonAccelBound(b, seenFrom);
  const minStepDays = Math.min(0.5, (2 * DEG) / rBound);

  const roots: RootFound[] = [];
  const onRoot = (r: RootFound): void => { roots.push(r); checkEvents(roots.length, budget); };
  let methodKind: 'monotone' | 'adaptive' = 'adaptive';
  if (monotone && (fMin > 0 || fMax < 0)) {
    const s: 1 | -1 = fMin > 0 ? 1 : -1;
    const nMean = Math.abs(meanLonRate(a, seenFrom) - meanLonRate(b, seenFrom));
    const [rMin, rMax] = s > 0 ? [fMin, fMax] : [-fMax, -fMin];
    methodKind = 'monotone';
    if (!monotoneRoots(probe, q.start.tt, q.end.tt, s, rMin, rMax, nMean, tolDays, onRoot)) {
      roots.length = 0;
      methodKind = 'adaptive';
    }
  }
  if (methodKind === 'adaptive') adaptiveRoots(probe, q.start.tt, q.end.tt, rBound, aBound, minStepDays, tolDays, onRoot);
  roots.sort((x, y) => x.tt - y.tt);

  const events: ConjunctionEvent[] = [];
  for (let i = 0; i < roots.length; i++) {
    const r = roots[i]!;
    const dt = r.tt - r.last.tt;
    const [sa, sb] = [r.last.states[0]!, r.last.states[1]!];
    const lonRad = ((sa.lonRad + sa.lonRateRadPerDay * dt) % TWO_PI + TWO_PI) % TWO_PI;
    const sepRad = Math.hypot(wrapPi(sa.lonRad - sb.lonRad + r.last.rate * dt) * Math.cos(sa.latRad), (sa.latRad + sa.latRateRadPerDay * dt) - (sb.latRad + sb.latRateRadPerDay * dt));
    const base = {
      instant: instantFromTt(r.tt), lonRad,
      latARad: sa.latRad + sa.latRateRadPerDay * dt, latBRad: sb.latRad + sb.latRateRadPerDay * dt,
      distanceAAu: sa.distanceAu, distanceBAu: sb.distanceAu,
      separationRad: sepRad,
    };
    if (seenFrom === 'sun') {
      if (q.withinRad === undefined || sepRad <= q.withinRad) events.push(base);
      continue;
    }
    // Geocentric: least separation between the neighbouring conjunctions, elongation, side of the Sun.
    const prevTt = i > 0 ? roots[i - 1]!.tt : -Infinity;
    const nextTt = i + 1 < roots.length ? roots[i + 1]!.tt : Infinity;
    const halfWindow = Math.min(60, Math.max(0.5, (3 * Math.max(sepRad, 1e-4)) / Math.max(Math.abs(r.last.rate), 1e-9)));
    const lo = Math.max(r.tt - halfWindow, 0.5 * (prevTt + r.tt), q.start.tt - 60);
    const hi = Math.min(r.tt + halfWindow, 0.5 * (r.tt + nextTt), q.end.tt + 60);
    const atConj: Probe = r.last;
    const min = minimumSeparation(states, atConj, lo, hi, tolDays);
    if (q.withinRad !== undefined && min.separationRad > q.withinRad) continue;
    let elongationRad: number;
    let kind: 'inferior' | 'superior' | undefined;
    if (a === 'sun' || b === 'sun') {
      elongationRad = sepRad;
      const other = a === 'sun' ? b : a;
      if (other === 'mercury' || other === 'venus') {
        const dOther = a === 'sun' ? base.distanceBAu : base.distanceAAu;
        const dSun = a === 'sun' ? base.distanceAAu : base.distanceBAu;
        kind = dOther < dSun ? 'inferior' : 'superior';
      }
    } else {
      const [sun, body] = source.states(['sun', a], 'earth', r.tt, false, budget);
      elongationRad = angleBetweenRad(body!, sun!);
    }
    events.push({
      ...base,
      minSeparation: { instant: instantFromTt(min.tt), separationRad: min.separationRad },
      elongationRad,
      ...(kind ? { kind } : {}),
    });
  }
  const method = methodKind === 'monotone'
    ? 'each event predicted from the mean motions, bracketed by bounds on the longitude rates, refined by safeguarded Newton steps on rates from state vectors'
    : `adaptive steps of |Δλ| / ${(rBound / DEG).toFixed(3)}°/d (the bound on the rate of change of the longitude difference), at least ${(minStepDays * 24).toFixed(1)} h; every sign change refined by safeguarded Newton steps; near-zero minima probed for hidden double crossings`;
  return { events, evaluations: budget.evaluations - evalsBefore, frame: source.frame(seenFrom), method: `${method} (tolerance ${(tolDays * 86400).toFixed(0)} s)`, methodKind };
}

/**
 * Geocentric oppositions of a superior planet (Mars … Pluto): instants when its
 * geocentric ecliptic longitude of date is 180° from the Sun's.
 * @throws RangeError for a body that is not a superior planet; LimitError, CancelledError, EphemerisError as {@link findConjunctions}
 */
export function findOppositions(q: OppositionQuery): OppositionSearchResult {
  const source = q.source ?? astronomyEngine;
  const { a, budget } = q;
  if (!SUPERIOR_PLANETS.includes(a)) throw new RangeError('only a superior planet (Mars to Pluto) comes to opposition');
  const tolDays = timeTolDays(q);
  checkWindow(q.start, q.end, budget, [a], source);
  const evalsBefore = budget.evaluations;
  const probe: ProbeFn = (tt) => {
    const st = source.states([a, 'sun'], 'earth', tt, true, budget);
    const [sa, ss] = [st[0]!, st[1]!];
    return { tt, f: wrapPi(sa.lonRad - ss.lonRad - Math.PI), rate: sa.lonRateRadPerDay - ss.lonRateRadPerDay, states: st };
  };
  const [aMin, aMax] = source.lonRateBounds(a, 'earth');
  const [sMin, sMax] = source.lonRateBounds('sun', 'earth');
  // The Sun always outruns a superior planet: f decreases at a rate within [sMin − aMax, sMax − aMin].
  const rMin = sMin - aMax;
  const rMax = sMax - aMin;
  const nMean = Math.abs(meanLonRate('sun', 'earth') - meanLonRate(a, 'earth'));
  const roots: RootFound[] = [];
  const onRoot = (r: RootFound): void => { roots.push(r); checkEvents(roots.length, budget); };
  let method = 'each opposition predicted from the mean motions, bracketed by bounds on the longitude rates, refined by safeguarded Newton steps on rates from state vectors';
  if (!monotoneRoots(probe, q.start.tt, q.end.tt, -1, rMin, rMax, nMean, tolDays, onRoot)) {
    roots.length = 0;
    adaptiveRoots(probe, q.start.tt, q.end.tt, rMax, source.lonAccelBound(a, 'earth') + source.lonAccelBound('sun', 'earth'), 0.5, tolDays, onRoot);
    method = 'adaptive steps bounded by the rate of the longitude difference, every sign change refined';
  }
  const events: OppositionEvent[] = roots.map((r) => {
    const dt = r.tt - r.last.tt;
    const [sa, ss] = [r.last.states[0]!, r.last.states[1]!];
    return {
      instant: instantFromTt(r.tt),
      lonRad: ((sa.lonRad + sa.lonRateRadPerDay * dt) % TWO_PI + TWO_PI) % TWO_PI,
      latRad: sa.latRad + sa.latRateRadPerDay * dt,
      distanceAu: sa.distanceAu + sa.distanceRateAuPerDay * dt,
      elongationRad: angleBetweenRad(sa, ss),
    };
  });
  return { events, evaluations: budget.evaluations - evalsBefore, frame: source.frame('earth'), method: `${method} (tolerance ${(tolDays * 86400).toFixed(0)} s)` };
}
