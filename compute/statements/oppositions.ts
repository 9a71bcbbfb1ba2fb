/**
 * `oppositions A from D to D`: geocentric oppositions of a superior planet (its apparent
 * ecliptic longitude of date 180° from the Sun's), with distance and elongation.
 */
import type { Statement } from '../../language/ast.js';
import { Code } from '../../language/diagnostics.js';
import { findOppositions, SUPERIOR_PLANETS } from '../conjunctions.js';
import { fail, type EvalContext } from '../context.js';
import type { EventRecord, StatementResult, Table } from '../result.js';
import { formatUtcMinutes, isoUtc, jdTt } from '../time.js';
import {
  formatAngle, formatInterval, formatJdTt, formatLon, positionBody, searchFailure,
  searchResult, spanCautions, spanInstants, summaryTable,
} from './conjunctions.js';
import { intervalStats } from '../synodic.js';

type OppositionsStmt = Extract<Statement, { kind: 'oppositions' }>;

const DEG = Math.PI / 180;

/**
 * Evaluate an `oppositions` statement.
 * @throws EvalError OB204 for a user body or the barycentre, OB302 for a body that never
 *   comes to opposition, a reversed span or dates outside the ephemeris, OB405 when the
 *   ephemeris fails; LimitError and CancelledError pass through.
 */
export function evalOppositions(stmt: OppositionsStmt, ctx: EvalContext): StatementResult {
  const a = positionBody(stmt.a, ctx, 'an opposition search');
  if (!SUPERIOR_PLANETS.includes(a.body)) {
    const hint = a.body === 'mercury' || a.body === 'venus'
      ? ` (it stays near the Sun: try \`conjunctions ${a.name} sun from … to … seen-from earth\` for its inferior and superior conjunctions)`
      : a.body === 'moon' ? ' (the Moon opposite the Sun is the full moon, which this statement does not cover)' : '';
    fail(Code.OutOfRange, `\`${a.name}\` never comes to opposition: only the superior planets (${SUPERIOR_PLANETS.join(', ')}) do${hint}`, stmt.a.range);
  }
  const { start, end } = spanInstants(stmt.span, ctx);
  let found: ReturnType<typeof findOppositions>;
  try {
    found = findOppositions({ a: a.body, start, end, budget: ctx.budget });
  } catch (err) {
    searchFailure(err, stmt.range);
  }
  const mode = ctx.calendar;
  const events = found.events;
  const { cautions, validity } = spanCautions(start, end, [a.body, 'sun']);
  const spanText = `${formatUtcMinutes(start, mode).slice(0, 10)} to ${formatUtcMinutes(end, mode).slice(0, 10)}`;
  const stats = intervalStats(events.map((e) => e.instant.tt));
  let summary: string;
  if (events.length === 0) summary = `no oppositions of ${a.name} from ${spanText}`;
  else if (events.length === 1) summary = `1 opposition: ${formatUtcMinutes(events[0]!.instant, mode)}, ${events[0]!.distanceAu.toFixed(3)} au`;
  else {
    const nearest = events.reduce((m, e) => (e.distanceAu < m.distanceAu ? e : m));
    summary = `${events.length} oppositions, mean interval ${formatInterval(stats!.meanDays)}, nearest ${nearest.distanceAu.toFixed(3)} au on ${formatUtcMinutes(nearest.instant, mode).slice(0, 10)}`;
  }
  const details = [
    `Oppositions of ${a.name}: its apparent geocentric ecliptic longitude 180° from the Sun's, ${spanText}.`,
    `Frame: ${found.frame}.`,
    `Method: ${found.method}.`,
    `Found ${events.length} event${events.length === 1 ? '' : 's'} with ${found.evaluations} ephemeris evaluations (one body at one instant each).`,
    'Elongation: the angle from the Sun at opposition, 180° less the effect of the planet\'s ecliptic latitude; distance: geocentric, light-time corrected.',
  ];
  if (events.length === 0) details.push('None in the window: the search covered the whole span.');
  const columns = ['#', 'UTC', 'JD TT', 'longitude', 'latitude', 'distance', 'elongation'];
  const rows = events.map((e, i) => [
    String(i + 1), formatUtcMinutes(e.instant, mode), formatJdTt(e.instant), formatLon(e.lonRad),
    `${(e.latRad / DEG).toFixed(2)}°`, `${e.distanceAu.toFixed(4)} au`, formatAngle(e.elongationRad),
  ]);
  const tables: Table[] = [
    { title: `Oppositions of ${a.name}`, columns, rows, align: columns.map((c) => (c === 'UTC' ? 'l' : 'r')) },
    summaryTable(`Summary, ${spanText}`, events.map((e) => e.instant), events.map((e) => e.lonRad)),
  ];
  const records: EventRecord[] = events.map((e) => ({
    jd_tt: jdTt(e.instant),
    utc: isoUtc(e.instant, mode),
    fields: { longitude_deg: e.lonRad / DEG, latitude_deg: e.latRad / DEG, distance_au: e.distanceAu, elongation_deg: e.elongationRad / DEG },
  }));
  return searchResult('oppositions', { summary, details, tables, cautions }, found.frame, events.map((e) => e.instant), records, start, end, validity);
}
