/**
 * `alignment A B … [against C …] within ANGLE from D to D [seen-from sun|earth]`: the windows in
 * which all the bodies lie within ANGLE of one axis (those after `against` on its far side),
 * found by compute/alignment.ts on longitudes from compute/ephemeris.ts.
 */
import type { Ident, Statement } from '../../language/ast.js';
import { Code } from '../../language/diagnostics.js';
import { findAlignments, smallestArc, type AlignmentBody, type AlignmentWindow } from '../alignment.js';
import { findMinimum } from '../brent.js';
import { fail, type BuiltinBody, type EvalContext } from '../context.js';
import type { Budget } from '../limits.js';
import {
  accuracyWarning, angleBetweenRad, astronomyEngine, EphemerisError, type PositionBody, type Viewpoint,
} from '../ephemeris.js';
import { ENGINE_LABEL, ORBIT_NOTES_VERSION } from '../provenance.js';
import type { EventRecord, PlotSpec, StatementResult, Table } from '../result.js';
import { deltaTSeconds, formatUtcMinutes, instantFromTt, isoUtc, jdTt } from '../time.js';
import { SOLAR_CAUTION, SOLAR_CAUTION_DEG } from './conjunctions.js';
import { formatDeltaT } from './date.js';

type AlignmentStmt = Extract<Statement, { kind: 'alignment' }>;

const DEG = Math.PI / 180;
const YEAR_DAYS = 365.25;

/** Elongation below which a geocentric window carries the solar-filter caution (the same threshold as conjunctions). */
const SOLAR_CAUTION_ELONGATION_RAD = SOLAR_CAUTION_DEG * DEG;

/** Points of the spread curve drawn in the plot, besides the window edges and minima. */
const PLOT_SAMPLES = 600;
/** Beyond these, the plot keeps only its even grid (search samples) or the first windows (spans). */
const PLOT_MAX_SEARCH_SAMPLES = 4000;
const PLOT_MAX_WINDOWS = 2000;

/** A caution every alignment result carries. */
export const RECURRENCE_NOT_FORECAST = 'An alignment, and the recurrence of alignments, is geometry: it is not a forecast of anything on Earth.';

/**
 * Bodies for compute/alignment.ts with longitudes (ecliptic of date) and rate bounds from the
 * ephemeris adapter. All longitudes of one instant come from one call, since the search asks
 * body by body at the same instant. The adapter charges `budget` one tick per body per instant.
 */
export function ephemerisAlignmentBodies(members: ReadonlyArray<{ readonly body: PositionBody; readonly opposite: boolean }>, seenFrom: Viewpoint, budget: Budget): AlignmentBody[] {
  const names = members.map((m) => m.body);
  let cachedTt = NaN;
  let cachedLon: number[] = [];
  const lonAt = (tt: number): number[] => {
    if (tt !== cachedTt) {
      cachedLon = astronomyEngine.states(names, seenFrom, tt, false, budget).map((s) => s.lonRad);
      cachedTt = tt;
    }
    return cachedLon;
  };
  return members.map((m, i) => {
    const [lo, hi] = astronomyEngine.lonRateBounds(m.body, seenFrom);
    return { label: m.body, opposite: m.opposite, minRateRadPerDay: lo, maxRateRadPerDay: hi, longitudeRad: (tt: number) => lonAt(tt)[i]! };
  });
}

/** The body as a position body for a viewpoint, or an EvalError saying why not. */
function positionBody(id: Ident, ctx: EvalContext, seenFrom: Viewpoint): PositionBody {
  const b = ctx.body(id);
  if (b.kind === 'user') fail(Code.NoEphemeris, `\`${b.name}\` is a user body with a period but no positions; an alignment needs ephemeris positions (built-in bodies only)`, id.range);
  const bid: BuiltinBody = b.id;
  if (bid === 'ssb') fail(Code.NoEphemeris, 'the barycentre `ssb` has no ecliptic longitude to align', id.range);
  if (seenFrom === 'sun' && (bid === 'sun' || bid === 'moon')) {
    fail(Code.OutOfRange, `\`${bid}\` has no heliocentric longitude of its own here; write \`seen-from earth\` to align it as seen from Earth`, id.range);
  }
  if (seenFrom === 'earth' && bid === 'earth') fail(Code.OutOfRange, '`earth` cannot be aligned as seen from Earth; write `seen-from sun` for heliocentric longitudes', id.range);
  return bid;
}

function fmtDuration(days: number): string {
  if (days < 2) return `${(days * 24).toFixed(1)} h`;
  if (days < 1000) return `${days.toFixed(1)} d`;
  return `${(days / YEAR_DAYS).toFixed(2)} yr`;
}

const fmtDeg = (rad: number, digits = 2): string => `${(rad / DEG).toFixed(digits)}°`;

/**
 * Evaluate an `alignment` statement.
 * @throws EvalError: OB203 unknown body (from the context), OB204 for a body without positions,
 *   OB302 for a repeated body, a bad angle, a body that cannot be seen from the viewpoint, or dates
 *   the ephemeris cannot compute; OB301 for an angle that is not an angle; LimitError (OB401) for the
 *   span, evaluation or window limits; CancelledError.
 */
export function evalAlignment(stmt: AlignmentStmt, ctx: EvalContext): StatementResult {
  const seenFrom: Viewpoint = stmt.seenFrom;
  const listed = [...stmt.bodies.map((id) => ({ id, opposite: false })), ...stmt.against.map((id) => ({ id, opposite: true }))];
  const seen = new Map<PositionBody, Ident>();
  const members = listed.map(({ id, opposite }) => {
    const body = positionBody(id, ctx, seenFrom);
    if (seen.has(body)) fail(Code.OutOfRange, `\`${body}\` is listed twice; list each body once`, id.range);
    seen.set(body, id);
    return { body, opposite, id };
  });

  const angle = ctx.value(stmt.within);
  if (angle.dim !== 'angle') fail(Code.DimensionMismatch, 'the angle after `within` must be an angle, e.g. `within 10 deg`', stmt.within.range);
  const angleRad = angle.value;
  if (!(angleRad > 0 && angleRad < Math.PI)) fail(Code.OutOfRange, 'the angle after `within` must be greater than 0° and less than 180°', stmt.within.range);

  const from = ctx.instant(stmt.span.from);
  const to = ctx.instant(stmt.span.to);
  if (!(to.tt > from.tt)) fail(Code.OutOfRange, 'the end date must come after the start date', stmt.span.to.range);
  ctx.budget.checkSpan(to.tt - from.tt);
  for (const m of members) {
    const cov = astronomyEngine.coverage(m.body);
    if (from.tt < cov.startTt || to.tt > cov.endTt) {
      fail(Code.OutOfRange, `\`${m.body}\` has positions only for ${isoUtc(instantFromTt(cov.startTt), ctx.calendar).slice(0, 10)} to ${isoUtc(instantFromTt(cov.endTt), ctx.calendar).slice(0, 10)}; shorten the span`, m.id.range);
    }
  }

  const bodiesList = members.map((m) => m.body);
  const alignmentBodies = ephemerisAlignmentBodies(members, seenFrom, ctx.budget);

  let search;
  try {
    // The ephemeris charges the budget (one tick per body per instant); the search need not.
    search = findAlignments(alignmentBodies, { angleRad, fromTt: from.tt, toTt: to.tt, maxWindows: ctx.budget.limits.maxEvents, keepSamples: true });
  } catch (err) {
    if (err instanceof EphemerisError || err instanceof RangeError) fail(Code.OutOfRange, `alignment: ${err.message}`, stmt.range);
    throw err;
  }
  const windows = search.windows;

  // Geocentric windows: how close to the Sun the bodies stand at the tightest instant.
  const elongations: Array<number | undefined> = windows.map((w) => {
    if (seenFrom !== 'earth') return undefined;
    const others = bodiesList.filter((b) => b !== 'sun');
    if (others.length < bodiesList.length) return 0;
    const st = astronomyEngine.states([...others, 'sun'], 'earth', w.tightestTt, false, ctx.budget);
    const sun = st[st.length - 1]!;
    return Math.min(...st.slice(0, -1).map((s) => angleBetweenRad(s, sun)));
  });

  const when = (tt: number): string => formatUtcMinutes(instantFromTt(tt), ctx.calendar);
  const rows = windows.map((w, i) => {
    const row = [
      String(i + 1),
      w.openAtStart ? `≤ ${when(w.startTt)} (span start)` : when(w.startTt),
      w.openAtEnd ? `≥ ${when(w.endTt)} (span end)` : when(w.endTt),
      fmtDuration(w.endTt - w.startTt),
      when(w.tightestTt),
      fmtDeg(w.spreadRad, 3),
      fmtDeg(w.axisRad, 1),
    ];
    const e = elongations[i];
    if (e !== undefined) row.push(fmtDeg(e, 1));
    return row;
  });
  const columns = ['#', 'start (UTC)', 'end (UTC)', 'duration', 'tightest (UTC)', 'spread', 'axis λ'];
  if (seenFrom === 'earth') columns.push('least elongation');
  const tables: Table[] = [{
    title: `Windows with all ${members.length} bodies within ${fmtDeg(angleRad, 3)} of one axis`,
    columns, rows, align: columns.map((_, k) => (k === 0 || k >= 3 ? 'r' : 'l')),
  }];

  const events: EventRecord[] = windows.map((w, i) => {
    const inst = instantFromTt(w.tightestTt);
    const e = elongations[i];
    return {
      jd_tt: jdTt(inst), utc: isoUtc(inst, ctx.calendar),
      fields: {
        start_jd_tt: w.startTt + 2451545, end_jd_tt: w.endTt + 2451545, duration_d: w.endTt - w.startTt,
        spread_deg: w.spreadRad / DEG, axis_deg: w.axisRad / DEG,
        open_at_start: w.openAtStart ? 'yes' : 'no', open_at_end: w.openAtEnd ? 'yes' : 'no',
        ...(e !== undefined ? { least_elongation_deg: e / DEG } : {}),
      },
    };
  });

  const names = members.map((m) => (m.opposite ? `${m.body} (opposite)` : m.body)).join(', ');
  let summary: string;
  if (windows.length === 0) {
    // The closest approach: Brent's minimiser around the lowest sample of the search.
    const s = search.samples!;
    let k = 0;
    for (let i = 1; i < s.spreadRad.length; i++) if (s.spreadRad[i]! < s.spreadRad[k]!) k = i;
    const spreadAt = (tt: number): number => smallestArc(alignmentBodies.map((b) => b.longitudeRad(tt) + (b.opposite ? Math.PI : 0))).spreadRad;
    const lo = s.tt[Math.max(0, k - 1)]!;
    const hi = s.tt[Math.min(s.tt.length - 1, k + 1)]!;
    const closest = hi > lo ? findMinimum(spreadAt, lo, hi, 1e-4, k > 0 && k < s.tt.length - 1 ? { x: s.tt[k]!, fx: s.spreadRad[k]! } : undefined) : { x: s.tt[k]!, fx: s.spreadRad[k]! };
    const best = closest.fx < s.spreadRad[k]! ? closest : { x: s.tt[k]!, fx: s.spreadRad[k]! };
    summary = `no window: the spread stays above ${fmtDeg(angleRad, 1)} (lowest found ${fmtDeg(best.fx, 2)} on ${when(best.x).slice(0, 10)})`;
  } else {
    const longest = windows.reduce((a, b) => (b.endTt - b.startTt > a.endTt - a.startTt ? b : a));
    const tightest = windows.reduce((a, b) => (b.spreadRad < a.spreadRad ? b : a));
    summary = `${windows.length} window${windows.length === 1 ? '' : 's'}, longest ${fmtDuration(longest.endTt - longest.startTt)} (from ${when(longest.startTt).slice(0, 10)}); tightest ${fmtDeg(tightest.spreadRad, 2)} on ${when(tightest.tightestTt).slice(0, 10)}`;
  }

  const cautions = [RECURRENCE_NOT_FORECAST];
  if (seenFrom === 'earth') {
    const near = windows.map((_, i) => i).filter((i) => (elongations[i] ?? Math.PI) < SOLAR_CAUTION_ELONGATION_RAD);
    if (near.length > 0) {
      cautions.push(`In ${near.length === 1 ? 'window' : 'windows'} ${near.slice(0, 12).map((i) => `#${i + 1}`).join(', ')}${near.length > 12 ? ' …' : ''} a body stands within ${fmtDeg(SOLAR_CAUTION_ELONGATION_RAD, 0)} of the Sun. ${SOLAR_CAUTION}`);
    }
  } else {
    cautions.push('Heliocentric longitudes describe the geometry seen from the Sun, not what an observer on Earth sees.');
  }

  const warnings: Array<{ code: string; message: string }> = [];
  const acc = accuracyWarning(from.ut, to.ut, bodiesList);
  if (acc) warnings.push({ code: Code.EphemerisAccuracy, message: acc.message });

  const evaluationsBefore = ctx.budget.evaluations;
  const plots = [windowsPlot(windows, search.samples!, alignmentBodies, angleRad, from.tt, to.tt, names)];
  const plotEvaluations = ctx.budget.evaluations - evaluationsBefore;

  const deltaT = deltaTSeconds(from.ut);
  return {
    kind: 'alignment',
    summary,
    details: [
      `Bodies: ${names}; seen from ${seenFrom === 'sun' ? 'the Sun' : 'Earth'}; spread = the smallest arc holding every longitude (a body after \`against\` counts at its longitude + 180°).`,
      `A window is an interval with spread ≤ ${fmtDeg(angleRad, 3)}; its axis is the middle of that arc at the tightest instant.`,
      `Steps of (|spread − angle| + δ)/L with L = ${(search.spreadRateBoundRadPerDay / DEG).toFixed(4)}°/d, the largest possible rate of the spread (from the bodies' longitude-rate bounds), δ = ${fmtDeg(angleRad / 1000, 4)}: no window that goes at least δ below the angle can be stepped over.`,
      'Edges by Brent’s root finder (tolerance ≈ 1 s), tightest instants by Brent’s minimiser on every sampled minimum (Brent 1973, Algorithms for Minimization without Derivatives, chapters 4–5).',
      `${search.instants} instants × ${members.length} bodies = ${search.evaluations} ephemeris evaluations for the search (a fixed 1-day scan would take ${Math.ceil(to.tt - from.tt) * members.length} and could step over windows shorter than a day); ${plotEvaluations} more for the plot and elongations.`,
    ],
    tables,
    provenance: {
      libraries: [ENGINE_LABEL, `orbit-notes ${ORBIT_NOTES_VERSION}`],
      timeScale: 'TT for positions; UTC shown',
      deltaT: `ΔT = ${formatDeltaT(deltaT)} at the start of the span (Espenak & Meeus 2006 polynomials)`,
      frame: astronomyEngine.frame(seenFrom),
      validity: astronomyEngine.validity,
    },
    cautions,
    events,
    plots,
    ...(warnings.length > 0 ? { warnings } : {}),
  };
}

/** Spread against time, with the windows shaded and the angle drawn as a level line. */
function windowsPlot(windows: readonly AlignmentWindow[], samples: { readonly tt: readonly number[]; readonly spreadRad: readonly number[] },
  bodies: readonly AlignmentBody[], angleRad: number, fromTt: number, toTt: number, names: string): PlotSpec {
  const year = (tt: number): number => 2000 + tt / YEAR_DAYS;
  // An even grid for the curve's shape, plus the search's own samples and every window's edges and minimum.
  const pts = new Map<number, number>();
  if (samples.tt.length <= PLOT_MAX_SEARCH_SAMPLES) samples.tt.forEach((t, i) => pts.set(t, samples.spreadRad[i]!));
  const shown = windows.slice(0, PLOT_MAX_WINDOWS);
  const spreadAt = (tt: number): number => smallestArc(bodies.map((b) => b.longitudeRad(tt) + (b.opposite ? Math.PI : 0))).spreadRad;
  for (let k = 0; k <= PLOT_SAMPLES; k++) {
    const t = fromTt + (toTt - fromTt) * k / PLOT_SAMPLES;
    if (!pts.has(t)) pts.set(t, spreadAt(t));
  }
  for (const w of shown) {
    pts.set(w.startTt, pts.get(w.startTt) ?? angleRad);
    pts.set(w.endTt, pts.get(w.endTt) ?? angleRad);
    pts.set(w.tightestTt, w.spreadRad);
  }
  const ts = [...pts.keys()].sort((a, b) => a - b);
  return {
    kind: 'windows',
    title: `Spread of ${names}${shown.length < windows.length ? ` (first ${shown.length} of ${windows.length} windows shaded)` : ''}`,
    xLabel: 'year (TT; J2000 + Julian years)',
    yLabel: 'spread (deg)',
    series: [
      { label: 'spread', x: ts.map(year), y: ts.map((t) => pts.get(t)! / DEG) },
      { label: `within ${(angleRad / DEG).toFixed(1)}°`, x: [year(fromTt), year(toTt)], y: [angleRad / DEG, angleRad / DEG] },
    ],
    spans: shown.map((w, i) => ({ x0: year(w.startTt), x1: year(w.endTt), label: `#${i + 1}: ${(w.spreadRad / DEG).toFixed(2)}° at ${year(w.tightestTt).toFixed(2)}` })),
  };
}
