/**
 * `conjunctions A B from D to D [seen-from sun|earth] [within ANGLE]`: every instant of
 * equal ecliptic longitude (of date) of two built-in bodies in the span, with a summary of
 * the intervals; geocentric events also with the least separation, its time and the
 * elongation from the Sun.
 */
import type { Ident, Range, Statement } from '../../language/ast.js';
import { Code } from '../../language/diagnostics.js';
import { findConjunctions, type ConjunctionEvent } from '../conjunctions.js';
import { fail, type EvalContext, type ResolvedBody } from '../context.js';
import {
  accuracyWarning, astronomyEngine, EphemerisError, EphemerisRangeError, type PositionBody,
} from '../ephemeris.js';
import { ENGINE_LABEL, ORBIT_NOTES_VERSION } from '../provenance.js';
import type { EventRecord, Provenance, StatementResult, Table } from '../result.js';
import { intervalStats } from '../synodic.js';
import { deltaTSeconds, formatUtcMinutes, isoUtc, jdTt, type CalendarMode, type Instant } from '../time.js';

type ConjunctionsStmt = Extract<Statement, { kind: 'conjunctions' }>;

const DEG = Math.PI / 180;

/** Events closer than this to the Sun (seen from Earth) get the solar-filter caution. */
export const SOLAR_CAUTION_DEG = 15;

/** The caution a careful practitioner prints beside events near the Sun. */
export const SOLAR_CAUTION = 'Never point binoculars, a telescope or a camera near the Sun without a proper solar filter over the front of the optics: the focused sunlight can blind instantly and permanently.';

/**
 * A built-in body with positions, or an EvalError: user bodies have a period but no
 * ephemeris (OB204), the barycentre has no longitude (OB204).
 */
export function positionBody(id: Ident, ctx: EvalContext, what: string): { body: PositionBody; name: string } {
  const resolved: ResolvedBody = ctx.body(id);
  if (resolved.kind === 'user') {
    fail(Code.NoEphemeris, `\`${resolved.name}\` has a period but no ephemeris: ${what} needs positions, which only the built-in bodies have (\`synodic\` and \`ratio\` work from its period)`, id.range);
  }
  if (resolved.id === 'ssb') fail(Code.NoEphemeris, `\`ssb\` (the barycentre) has no ecliptic longitude of its own: ${what} needs bodies with positions`, id.range);
  return { body: resolved.id, name: resolved.name };
}

/** The span of a statement as instants, end after start (OB302 otherwise). */
export function spanInstants(span: ConjunctionsStmt['span'], ctx: EvalContext): { start: Instant; end: Instant } {
  const start = ctx.instant(span.from);
  const end = ctx.instant(span.to);
  if (!(end.tt > start.tt)) fail(Code.OutOfRange, 'the end of the span must come after its start', span.to.range);
  return { start, end };
}

/** Angle for tables: arcminutes below 1°, degrees above. */
export function formatAngle(rad: number): string {
  const deg = rad / DEG;
  if (Math.abs(deg) < 1) return `${(deg * 60).toFixed(1)}′`;
  return `${deg.toFixed(2)}°`;
}

/** Longitude in degrees with three decimals (3.6″). */
export function formatLon(rad: number): string {
  return `${(rad / DEG).toFixed(3)}°`;
}

/** An interval in days or, from two years on, in Julian years. */
export function formatInterval(days: number): string {
  return days >= 730.5 ? `${(days / 365.25).toFixed(2)} yr` : `${days.toFixed(2)} d`;
}

/** JD TT with five decimals (about a second). */
export function formatJdTt(i: Instant): string {
  return (jdTt(i)).toFixed(5);
}

/** Provenance of a search result: library, time scale, ΔT over the events, frame, validity. */
export function searchProvenance(frame: string, instants: readonly Instant[], start: Instant, end: Instant, validityExtra: string | undefined): Provenance {
  const first = instants[0] ?? start;
  const last = instants[instants.length - 1] ?? end;
  const d0 = deltaTSeconds(first.ut);
  const d1 = deltaTSeconds(last.ut);
  const dt = Math.abs(d1 - d0) < 0.05 ? `ΔT = ${d0.toFixed(1)} s` : `ΔT from ${d0.toFixed(1)} s to ${d1.toFixed(1)} s`;
  return {
    libraries: [ENGINE_LABEL, `orbit-notes ${ORBIT_NOTES_VERSION}`],
    timeScale: 'TT for positions and JD; UTC shown = TT − ΔT',
    deltaT: `${dt} (astronomy-engine: Espenak & Meeus 2006 polynomials, extrapolated outside −500…2150)`,
    frame,
    validity: validityExtra ? `${astronomyEngine.validity}. ${validityExtra}` : astronomyEngine.validity,
  };
}

/** Cautions shared by the searches: accuracy outside the good span, extrapolated ΔT. */
export function spanCautions(start: Instant, end: Instant, bodies: readonly PositionBody[]): { cautions: string[]; validity: string | undefined } {
  const cautions: string[] = [];
  const warn = accuracyWarning(start.ut, end.ut, bodies);
  if (warn) cautions.push(`Accuracy: ${warn.message}`);
  const y0 = 2000 + start.ut / 365.25;
  const y1 = 2000 + end.ut / 365.25;
  if (y0 < -500 || y1 > 2150) {
    cautions.push('ΔT is extrapolated outside −500…2150: the UTC times there inherit its uncertainty; the JD TT column does not.');
  }
  return { cautions, validity: warn?.message };
}

/**
 * The result of an event search: its text parts plus provenance over the events found and
 * the accuracy note, which is also a warning diagnostic (the Problems panel), not only a caution.
 */
export function searchResult(
  kind: 'conjunctions' | 'oppositions',
  text: Pick<StatementResult, 'summary' | 'details' | 'tables' | 'cautions'>,
  frame: string, instants: readonly Instant[], events: readonly EventRecord[], start: Instant, end: Instant, validity: string | undefined,
): StatementResult {
  return {
    kind,
    ...text,
    provenance: searchProvenance(frame, instants, start, end, validity),
    events,
    ...(validity ? { warnings: [{ code: Code.EphemerisAccuracy, message: validity }] } : {}),
  };
}

/** Map the search's failures to diagnostics at the statement; limits and cancellation pass through. */
export function searchFailure(err: unknown, range: Range): never {
  if (err instanceof EphemerisRangeError || err instanceof RangeError) fail(Code.OutOfRange, err.message, range);
  if (err instanceof EphemerisError) fail(Code.Internal, `the ephemeris failed: ${err.message}`, range);
  throw err;
}

/** Summary rows over event instants and longitudes: count, mean/min/max interval, longitude advance. */
export function summaryTable(title: string, instants: readonly Instant[], lonsRad: readonly number[]): Table {
  const rows: string[][] = [['count', String(instants.length)]];
  const stats = intervalStats(instants.map((i) => i.tt));
  if (stats) {
    rows.push(['mean interval', formatInterval(stats.meanDays)], ['min interval', formatInterval(stats.minDays)], ['max interval', formatInterval(stats.maxDays)]);
    let sum = 0;
    for (let k = 1; k < lonsRad.length; k++) {
      let d = (lonsRad[k]! - lonsRad[k - 1]!) % (2 * Math.PI);
      if (d < 0) d += 2 * Math.PI;
      sum += d;
    }
    const adv = sum / (lonsRad.length - 1) / DEG;
    rows.push(['longitude advance per event', adv > 180 ? `${adv.toFixed(2)}° (= −${(360 - adv).toFixed(2)}°)` : `${adv.toFixed(2)}°`]);
  }
  return { title, columns: ['quantity', 'value'], rows, align: ['l', 'r'] };
}

function dateOnly(i: Instant, mode: CalendarMode): string {
  return formatUtcMinutes(i, mode);
}

/**
 * Evaluate a `conjunctions` statement.
 * @throws EvalError OB204 for a user body or the barycentre, OB301 when `within` is not an
 *   angle, OB302 for an impossible pair, a reversed span or dates outside the ephemeris,
 *   OB405 when the ephemeris fails; LimitError and CancelledError pass through.
 */
export function evalConjunctions(stmt: ConjunctionsStmt, ctx: EvalContext): StatementResult {
  const a = positionBody(stmt.a, ctx, 'a conjunction search');
  const b = positionBody(stmt.b, ctx, 'a conjunction search');
  if (a.body === b.body) fail(Code.OutOfRange, `a conjunction needs two different bodies (both are \`${a.name}\`)`, stmt.b.range);
  const seenFrom = stmt.seenFrom;
  if (seenFrom === 'sun') {
    for (const [x, id] of [[a, stmt.a], [b, stmt.b]] as const) {
      if (x.body === 'sun') fail(Code.OutOfRange, 'seen from the Sun, the Sun has no longitude: write `seen-from earth` for a conjunction with the Sun', id.range);
      if (x.body === 'moon') fail(Code.OutOfRange, 'seen from the Sun, the Moon moves with Earth: write `seen-from earth` for conjunctions with the Moon', id.range);
    }
  } else {
    for (const [x, id] of [[a, stmt.a], [b, stmt.b]] as const) {
      if (x.body === 'earth') fail(Code.OutOfRange, 'seen from Earth, Earth has no position: write `seen-from sun` for heliocentric conjunctions with Earth', id.range);
    }
  }
  let withinRad: number | undefined;
  if (stmt.within) {
    const w = ctx.value(stmt.within);
    if (w.dim !== 'angle') fail(Code.DimensionMismatch, '`within` takes an angle, e.g. `within 1 deg`', stmt.within.range);
    if (!(w.value > 0)) fail(Code.OutOfRange, '`within` must be a positive angle', stmt.within.range);
    withinRad = w.value;
  }
  const { start, end } = spanInstants(stmt.span, ctx);

  let found: ReturnType<typeof findConjunctions>;
  try {
    found = findConjunctions({ a: a.body, b: b.body, start, end, seenFrom, budget: ctx.budget, ...(withinRad !== undefined ? { withinRad } : {}) });
  } catch (err) {
    searchFailure(err, stmt.range);
  }
  const events = found.events;
  const geo = seenFrom === 'earth';
  const mode = ctx.calendar;
  const { cautions, validity } = spanCautions(start, end, [a.body, b.body]);
  if (geo) {
    const near = events.filter((e) => e.elongationRad !== undefined && e.elongationRad < SOLAR_CAUTION_DEG * DEG);
    if (near.length > 0) {
      cautions.unshift(`${near.length === events.length ? (events.length === 1 ? 'This conjunction lies' : 'All these conjunctions lie') : `${near.length} of these conjunctions lie`} within ${SOLAR_CAUTION_DEG}° of the Sun. ${SOLAR_CAUTION}`);
    }
  }

  const pair = `${a.name}–${b.name}`;
  const whereText = geo ? 'seen from Earth' : 'seen from the Sun';
  const spanText = `${dateOnly(start, mode).slice(0, 10)} to ${dateOnly(end, mode).slice(0, 10)}`;
  const stats = intervalStats(events.map((e) => e.instant.tt));
  let summary: string;
  if (events.length === 0) {
    summary = `no ${pair} conjunctions ${whereText} from ${spanText}${withinRad !== undefined ? ` within ${formatAngle(withinRad)}` : ''}`;
  } else if (events.length === 1) {
    summary = `1 conjunction: ${formatUtcMinutes(events[0]!.instant, mode)}`;
  } else {
    summary = `${events.length} conjunctions, mean interval ${formatInterval(stats!.meanDays)}`;
  }
  if (geo && events.length > 0) {
    const closest = events.reduce((m, e) => ((e.minSeparation?.separationRad ?? Infinity) < (m.minSeparation?.separationRad ?? Infinity) ? e : m));
    if (closest.minSeparation) summary += `, closest ${formatAngle(closest.minSeparation.separationRad)} on ${formatUtcMinutes(closest.minSeparation.instant, mode).slice(0, 10)}`;
  }

  const details = [
    `Conjunctions in ecliptic longitude of ${a.name} and ${b.name}, ${whereText}, ${spanText}${withinRad !== undefined ? `, keeping those ${geo ? 'whose least separation is' : 'separated by'} at most ${formatAngle(withinRad)}` : ''}.`,
    `Frame: ${found.frame}.`,
    `Method: ${found.method}.`,
    `Found ${events.length} event${events.length === 1 ? '' : 's'} with ${found.evaluations} ephemeris evaluations (one body at one instant each).`,
  ];
  if (geo) details.push('Least separation: the smallest angle between the two bodies near each conjunction; with slow relative motion in longitude it can fall days from the conjunction.');
  if (events.length === 0) details.push('None in the window: the search covered the whole span and found no instant of equal longitude.');

  const hasKind = events.some((e) => e.kind !== undefined);
  const columns = geo
    ? ['#', 'UTC', 'JD TT', 'longitude', 'least separation', 'at (UTC)', 'elongation', ...(hasKind ? ['side'] : [])]
    : ['#', 'UTC', 'JD TT', 'longitude', 'separation'];
  const rows = events.map((e, i) => geo
    ? [String(i + 1), formatUtcMinutes(e.instant, mode), formatJdTt(e.instant), formatLon(e.lonRad), formatAngle(e.minSeparation!.separationRad), formatUtcMinutes(e.minSeparation!.instant, mode), formatAngle(e.elongationRad!), ...(hasKind ? [e.kind ?? ''] : [])]
    : [String(i + 1), formatUtcMinutes(e.instant, mode), formatJdTt(e.instant), formatLon(e.lonRad), formatAngle(e.separationRad)]);
  const tables: Table[] = [
    { title: `Conjunctions of ${pair}, ${whereText}`, columns, rows, align: columns.map((c) => (c === 'UTC' || c === 'at (UTC)' || c === 'side' ? 'l' : 'r')) },
    summaryTable(`Summary, ${spanText}`, events.map((e) => e.instant), events.map((e) => e.lonRad)),
  ];

  const records: EventRecord[] = events.map((e) => eventRecord(e, mode));
  return searchResult('conjunctions', { summary, details, tables, cautions }, found.frame, events.map((e) => e.instant), records, start, end, validity);
}

function eventRecord(e: ConjunctionEvent, mode: CalendarMode): EventRecord {
  const fields: Record<string, number | string> = {
    longitude_deg: e.lonRad / DEG,
    latitude_a_deg: e.latARad / DEG,
    latitude_b_deg: e.latBRad / DEG,
    separation_deg: e.separationRad / DEG,
    distance_a_au: e.distanceAAu,
    distance_b_au: e.distanceBAu,
  };
  if (e.minSeparation) {
    fields.min_separation_deg = e.minSeparation.separationRad / DEG;
    fields.min_separation_jd_tt = jdTt(e.minSeparation.instant);
    fields.min_separation_utc = isoUtc(e.minSeparation.instant, mode);
  }
  if (e.elongationRad !== undefined) fields.elongation_deg = e.elongationRad / DEG;
  if (e.kind) fields.kind = e.kind;
  return { jd_tt: jdTt(e.instant), utc: isoUtc(e.instant, mode), fields };
}
