/**
 * Alignment windows: the intervals in which a set of bodies all lie within a given angle of one
 * axis through the observer, some of them (those listed after `against`) on its far side.
 *
 * The **spread** at an instant is the length of the smallest arc of the circle that holds every
 * adjusted longitude (a body `against` the axis counts at its longitude + 180°): 2π minus the
 * largest gap between neighbouring longitudes. A window is a maximal interval with spread ≤ angle.
 *
 * Search. The spread is a continuous function; while bodies i and j are its ends it changes at
 * dλᵢ/dt − dλⱼ/dt, so its rate never exceeds L = max over i ≠ j of (max rateᵢ − min rateⱼ): the sum of
 * the two largest bounds on |dλ/dt| when bodies may move either way. From an
 * instant with spread s outside a window, no instant with spread ≤ angle − δ can come sooner than
 * (s − angle + δ)/L, so the search steps exactly that far; inside a window it steps
 * (angle − s + δ)/L. Every window whose tightest spread is at least δ below the angle is therefore
 * sampled at least once; shallower ones, which last less than 2δ/L, may be missed, and two windows
 * separated by an excursion of less than δ above the angle may be reported as one. Edges are
 * refined by Brent's root finder, the tightest instant by Brent's minimiser on every sampled local
 * minimum of the window (Brent 1973, chapters 4 and 5). No fixed fine scan is made.
 *
 * Pure: longitudes come in through {@link AlignmentBody}; the budget is charged one unit per body
 * per instant evaluated.
 */
import { findMinimum, findRoot } from './brent.js';
import type { Budget } from './limits.js';
import { LimitError } from './limits.js';

const TWO_PI = 2 * Math.PI;

/** One body of an alignment, as the search sees it. */
export interface AlignmentBody {
  readonly label: string;
  /** Ecliptic longitude in radians (any branch) at a TT instant, days since J2000.0. */
  readonly longitudeRad: (ttDays: number) => number;
  /** An upper bound on dλ/dt over the searched span, radians per day (> 0). */
  readonly maxRateRadPerDay: number;
  /**
   * A lower bound on dλ/dt over the span, radians per day (≤ max); default −max. A body that never
   * moves backwards (heliocentric planets) gives a positive bound, which lengthens the steps.
   */
  readonly minRateRadPerDay?: number;
  /** True for a body listed after `against`: it counts at its longitude + 180°. */
  readonly opposite: boolean;
}

export interface AlignmentOptions {
  /** Largest spread of a window, radians, in (0, π). */
  readonly angleRad: number;
  /** Span, TT days since J2000.0. */
  readonly fromTt: number;
  readonly toTt: number;
  /** Charged one unit per body per instant; throws LimitError / CancelledError from it. */
  readonly budget?: Budget;
  /** Depth below the angle that a window must reach to be guaranteed found, radians; default angle/1000. */
  readonly depthToleranceRad?: number;
  /** Tolerance on window edges, days; default 1e-5 (about 1 s). */
  readonly edgeToleranceDays?: number;
  /** Tolerance on the tightest instant, days; default 1e-5. */
  readonly minimumToleranceDays?: number;
  /** Most windows returned before a LimitError; default 100 000. */
  readonly maxWindows?: number;
  /** Keep every sampled (instant, spread) pair, for plots. Default false. */
  readonly keepSamples?: boolean;
}

/** A window: instants in TT days since J2000.0, angles in radians. */
export interface AlignmentWindow {
  readonly startTt: number;
  readonly endTt: number;
  /** The window was already open at the start of the span (its true start is earlier or equal). */
  readonly openAtStart: boolean;
  /** The window was still open at the end of the span. */
  readonly openAtEnd: boolean;
  readonly tightestTt: number;
  /** Spread at the tightest instant. */
  readonly spreadRad: number;
  /** Longitude of the axis at the tightest instant: the middle of the smallest arc, in [0, 2π). */
  readonly axisRad: number;
}

export interface AlignmentSearchResult {
  readonly windows: readonly AlignmentWindow[];
  /** Instants at which all longitudes were evaluated. */
  readonly instants: number;
  /** Body-longitude evaluations (instants × bodies). */
  readonly evaluations: number;
  /** Sampled spreads, in time order (only with `keepSamples`). */
  readonly samples?: { readonly tt: number[]; readonly spreadRad: number[] };
  /** The bound L on the rate of the spread used for the steps, radians per day. */
  readonly spreadRateBoundRadPerDay: number;
}

/** The smallest arc holding the angles: its length and the longitude of its middle, radians. */
export function smallestArc(anglesRad: readonly number[]): { spreadRad: number; centreRad: number } {
  const n = anglesRad.length;
  if (n === 0) return { spreadRad: 0, centreRad: 0 };
  const a = anglesRad.map((x) => ((x % TWO_PI) + TWO_PI) % TWO_PI).sort((p, q) => p - q);
  // The largest gap between neighbours, the wrap-around gap included; the arc starts after it.
  let gap = a[0]! + TWO_PI - a[n - 1]!;
  let startIdx = 0;
  for (let i = 1; i < n; i++) {
    const g = a[i]! - a[i - 1]!;
    if (g > gap) { gap = g; startIdx = i; }
  }
  const spreadRad = Math.max(0, TWO_PI - gap);
  const centre = a[startIdx]! + spreadRad / 2;
  return { spreadRad, centreRad: centre % TWO_PI };
}

/**
 * L = max over i ≠ j of (max rateᵢ − min rateⱼ), radians per day: a bound on |d spread/dt|.
 * With symmetric bounds (min = −max) it is the sum of the two largest bounds.
 */
export function spreadRateBound(bodies: readonly AlignmentBody[]): number {
  let best = 0;
  for (let i = 0; i < bodies.length; i++) {
    for (let j = 0; j < bodies.length; j++) {
      if (i === j) continue;
      const bj = bodies[j]!;
      best = Math.max(best, bodies[i]!.maxRateRadPerDay - (bj.minRateRadPerDay ?? -bj.maxRateRadPerDay));
    }
  }
  return best;
}

/**
 * Every alignment window in [fromTt, toTt].
 * @throws RangeError for fewer than two bodies, a bad angle, span or rate bound;
 *   LimitError when more than `maxWindows` windows are found; whatever the budget throws.
 */
export function findAlignments(bodies: readonly AlignmentBody[], options: AlignmentOptions): AlignmentSearchResult {
  if (bodies.length < 2) throw new RangeError('an alignment needs at least two bodies');
  const angle = options.angleRad;
  if (!(angle > 0 && angle < Math.PI)) throw new RangeError('the angle must be greater than 0° and less than 180°');
  const { fromTt, toTt, budget } = options;
  if (!(Number.isFinite(fromTt) && Number.isFinite(toTt) && toTt > fromTt)) throw new RangeError('the end of the span must come after its start');
  for (const b of bodies) {
    const lo = b.minRateRadPerDay ?? -b.maxRateRadPerDay;
    if (!(b.maxRateRadPerDay > 0 && Number.isFinite(b.maxRateRadPerDay) && Number.isFinite(lo) && lo <= b.maxRateRadPerDay)) {
      throw new RangeError(`no usable rate bounds for ${b.label}`);
    }
  }
  const delta = options.depthToleranceRad ?? angle / 1000;
  const edgeTol = options.edgeToleranceDays ?? 1e-5;
  const minTol = options.minimumToleranceDays ?? 1e-5;
  const maxWindows = options.maxWindows ?? 100_000;
  // A zero bound means a rigid configuration: one step then spans everything.
  const rate = Math.max(spreadRateBound(bodies), 1e-12);
  const n = bodies.length;

  let instants = 0;
  const lon = new Array<number>(n);
  const arcAt = (tt: number): { spreadRad: number; centreRad: number } => {
    budget?.tick(n);
    instants += 1;
    for (let i = 0; i < n; i++) {
      const b = bodies[i]!;
      lon[i] = b.longitudeRad(tt) + (b.opposite ? Math.PI : 0);
    }
    return smallestArc(lon);
  };
  const spreadAt = (tt: number): number => arcAt(tt).spreadRad;

  const keep = options.keepSamples === true;
  const sampleT: number[] = [];
  const sampleS: number[] = [];
  const windows: AlignmentWindow[] = [];

  // The samples of the window being followed, for its minimum.
  let winT: number[] = [];
  let winS: number[] = [];
  let winStart = fromTt;
  let winStartSpread = angle;
  let winOpenAtStart = false;

  /** Close the window being followed at endTt, whose spread is `endSpread` (the angle at a true edge). */
  const closeWindow = (endTt: number, endSpread: number, openAtEnd: boolean): void => {
    if (windows.length >= maxWindows) {
      throw new LimitError(`more than ${maxWindows} alignment windows`, 'max-events',
        'shorten the span or use a smaller angle, or raise orbitNotes.limits.maxEvents / the CLI flag --max-events');
    }
    // Neighbours of each sample: the edges count at the angle itself (or at their own spread when open).
    const ts = [winStart, ...winT, endTt];
    const ss = [winStartSpread, ...winS, endSpread];
    let best = { x: ts[1]!, fx: ss[1]! };
    for (let i = 1; i < ts.length - 1; i++) {
      if (!(ss[i]! <= ss[i - 1]! && ss[i]! <= ss[i + 1]!)) continue;
      const m = ts[i + 1]! - ts[i - 1]! > 2 * minTol
        ? findMinimum(spreadAt, ts[i - 1]!, ts[i + 1]!, minTol, { x: ts[i]!, fx: ss[i]! })
        : { x: ts[i]!, fx: ss[i]! };
      if (m.fx < best.fx) best = m;
    }
    // An open edge can itself be the tightest instant.
    if (winOpenAtStart && ss[0]! < best.fx) best = { x: ts[0]!, fx: ss[0]! };
    if (openAtEnd && ss[ss.length - 1]! < best.fx) best = { x: endTt, fx: ss[ss.length - 1]! };
    const arc = arcAt(best.x);
    windows.push({
      startTt: winStart, endTt, openAtStart: winOpenAtStart, openAtEnd,
      tightestTt: best.x, spreadRad: arc.spreadRad, axisRad: arc.centreRad,
    });
    winT = [];
    winS = [];
  };

  let t = fromTt;
  let s = spreadAt(t);
  if (keep) { sampleT.push(t); sampleS.push(s); }
  let inside = s <= angle;
  if (inside) { winStart = t; winStartSpread = s; winOpenAtStart = true; }
  const f = (x: number): number => spreadAt(x) - angle;
  while (t < toTt) {
    const h = (inside ? angle - s + delta : s - angle + delta) / rate;
    const tn = Math.min(t + h, toTt);
    const sn = spreadAt(tn);
    if (keep) { sampleT.push(tn); sampleS.push(sn); }
    if (!inside && sn <= angle) {
      winStart = findRoot(f, t, tn, edgeTol, s - angle, sn - angle);
      winStartSpread = angle;
      winOpenAtStart = false;
      inside = true;
      if (tn < toTt) { winT.push(tn); winS.push(sn); }
    } else if (inside && sn > angle) {
      closeWindow(findRoot(f, t, tn, edgeTol, s - angle, sn - angle), angle, false);
      inside = false;
    } else if (inside && tn < toTt) {
      winT.push(tn); winS.push(sn);
    }
    t = tn;
    s = sn;
  }
  if (inside) closeWindow(toTt, s, true);
  return {
    windows, instants, evaluations: instants * n, spreadRateBoundRadPerDay: rate,
    ...(keep ? { samples: { tt: sampleT, spreadRad: sampleS } } : {}),
  };
}

/**
 * The same windows by a plain fixed-step scan (edges by linear interpolation, tightest = the lowest
 * sample): the baseline of the benchmark, and a way to see what a coarse scan misses.
 * @param stepDays the scan step, days (> 0)
 */
export function scanAlignments(bodies: readonly AlignmentBody[], options: AlignmentOptions, stepDays: number): AlignmentSearchResult {
  if (!(stepDays > 0)) throw new RangeError('the scan step must be positive');
  const angle = options.angleRad;
  const n = bodies.length;
  const lon = new Array<number>(n);
  let instants = 0;
  const arcAt = (tt: number): { spreadRad: number; centreRad: number } => {
    options.budget?.tick(n);
    instants += 1;
    for (let i = 0; i < n; i++) lon[i] = bodies[i]!.longitudeRad(tt) + (bodies[i]!.opposite ? Math.PI : 0);
    return smallestArc(lon);
  };
  const windows: AlignmentWindow[] = [];
  const steps = Math.ceil((options.toTt - options.fromTt) / stepDays);
  let prevT = options.fromTt;
  let prev = arcAt(prevT);
  let open: { start: number; openAtStart: boolean; bestT: number; best: { spreadRad: number; centreRad: number } } | undefined =
    prev.spreadRad <= angle ? { start: prevT, openAtStart: true, bestT: prevT, best: prev } : undefined;
  for (let k = 1; k <= steps; k++) {
    const t = Math.min(options.fromTt + k * stepDays, options.toTt);
    const cur = arcAt(t);
    const cross = (): number => prevT + (angle - prev.spreadRad) / (cur.spreadRad - prev.spreadRad) * (t - prevT);
    if (!open && cur.spreadRad <= angle) {
      open = { start: cross(), openAtStart: false, bestT: t, best: cur };
    } else if (open && cur.spreadRad > angle) {
      windows.push({ startTt: open.start, endTt: cross(), openAtStart: open.openAtStart, openAtEnd: false, tightestTt: open.bestT, spreadRad: open.best.spreadRad, axisRad: open.best.centreRad });
      open = undefined;
    } else if (open && cur.spreadRad < open.best.spreadRad) {
      open.bestT = t;
      open.best = cur;
    }
    prevT = t;
    prev = cur;
  }
  if (open) windows.push({ startTt: open.start, endTt: options.toTt, openAtStart: open.openAtStart, openAtEnd: true, tightestTt: open.bestT, spreadRad: open.best.spreadRad, axisRad: open.best.centreRad });
  return { windows, instants, evaluations: instants * n, spreadRateBoundRadPerDay: spreadRateBound(bodies) };
}
