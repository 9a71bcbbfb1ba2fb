/**
 * `synodic A B [from D to D]`: the synodic (beat) period of two bodies or periods, with its
 * uncertainty; for two built-in planets also the actual intervals between heliocentric
 * conjunctions over a span (default 1900–2100).
 */
import type { Range, Statement } from '../../language/ast.js';
import { PERIOD_SOURCE } from '../bodies.js';
import { findConjunctions } from '../conjunctions.js';
import { accuracyWarning, EphemerisError } from '../ephemeris.js';
import { Code } from '../../language/diagnostics.js';
import { fail, type BuiltinBody, type EvalContext } from '../context.js';
import type { Budget } from '../limits.js';
import { ENGINE_LABEL, ORBIT_NOTES_VERSION } from '../provenance.js';
import { defaultUnit, formatQuantity, formatSig, reciprocal, sigmaOf, toJson, type Quantity, type UnitDef } from '../quantity.js';
import type { StatementResult, Table } from '../result.js';
import { intervalStats, synodicPeriod, type IntervalStats } from '../synodic.js';
import { formatUtcMinutes, instantFromCalendar, type Instant } from '../time.js';
import { periodOperand, type PeriodOperand } from './operands.js';

type SynodicStmt = Extract<Statement, { kind: 'synodic' }>;

/** Default span of the interval statistics: 1900-01-01 to 2100-01-01 UTC. */
export const DEFAULT_SYNODIC_SPAN_YEARS = { from: 1900, to: 2100 } as const;

/** Built-in bodies that have heliocentric positions of their own (the Sun, Moon and barycentre do not orbit the Sun here). */
const HELIOCENTRIC: ReadonlySet<BuiltinBody> = new Set<BuiltinBody>(['mercury', 'venus', 'earth', 'mars', 'jupiter', 'saturn', 'uranus', 'neptune', 'pluto']);

/** Heliocentric conjunctions of two planets in a span, as the conjunction search reports them. */
export interface ConjunctionTimes {
  /** TT, days since J2000, ascending. */
  readonly timesTt: readonly number[];
  readonly frame: string;
  readonly evaluations: number;
  /** Accuracy warning for spans outside the ephemeris's good range, when there is one. */
  readonly accuracy?: string;
}

/**
 * Heliocentric conjunction times of two planets in a span: the one place this statement
 * calls the conjunction search (compute/conjunctions.ts).
 * @throws EvalError OB302 for a pair the search cannot take, OB302 with the library's
 *   sentence when the span leaves the ephemeris's range; LimitError, CancelledError as raised
 */
export function heliocentricConjunctionTimes(a: BuiltinBody, b: BuiltinBody, from: Instant, to: Instant, budget: Budget, range: Range): ConjunctionTimes {
  if (a === 'ssb' || b === 'ssb') return fail(Code.NoEphemeris, 'the barycentre has no heliocentric longitude', range);
  try {
    const found = findConjunctions({ a, b, start: from, end: to, seenFrom: 'sun', budget });
    const warn = accuracyWarning(from.ut, to.ut, [a, b]);
    return {
      timesTt: found.events.map((e) => e.instant.tt),
      frame: found.frame,
      evaluations: found.evaluations,
      ...(warn ? { accuracy: warn.message } : {}),
    };
  } catch (err) {
    if (err instanceof EphemerisError || err instanceof RangeError) fail(Code.OutOfRange, `actual conjunction intervals: ${err.message}`, range);
    throw err;
  }
}

/**
 * Evaluate a `synodic` statement.
 * @throws EvalError: operand errors (see {@link periodOperand}); OB302 for equal periods;
 *   OB204 when a span is given but an operand has no ephemeris; OB401 for a span over the limit.
 */
export function evalSynodic(stmt: SynodicStmt, ctx: EvalContext): StatementResult {
  const a = periodOperand(stmt.a, ctx, 'the first operand');
  const b = periodOperand(stmt.b, ctx, 'the second operand');
  let s: Quantity;
  try {
    s = synodicPeriod(a.period, b.period);
  } catch (err) {
    if (err instanceof RangeError) fail(Code.OutOfRange, `\`${a.label}\` and \`${b.label}\` have the same period: their synodic period is infinite`, stmt.range);
    throw err;
  }
  if (!Number.isFinite(s.value)) fail(Code.OutOfRange, `the synodic period of \`${a.label}\` and \`${b.label}\` is not a finite number of days`, stmt.range);
  const unit = defaultUnit(s);
  const dayUnit: UnitDef = { name: 'd', dim: 'time', factor: 1 };
  const alt = unit.name === 'd' && s.value >= 100 ? ` (${formatQuantity(s, { name: 'yr', dim: 'time', factor: 365.25 })})` : unit.name === 'yr' ? ` (${formatQuantity(s, dayUnit)})` : '';

  const details = [
    'Formula: 1/S = |1/Pa − 1/Pb| (the beat of two periods).',
    `Pa = ${formatQuantity(a.period)} (${a.label})${a.body ? bodySource(a) : ''}`,
    `Pb = ${formatQuantity(b.period)} (${b.label})${b.body ? bodySource(b) : ''}`,
    `Beat frequency 1/S = ${formatQuantity(reciprocal(s))}`,
    'Uncertainty: first order (GUM, JCGM 100:2008, §5.1), each input counted once, so operands that share an input are correlated correctly.',
  ];
  const tables: Table[] = [{
    columns: ['quantity', 'value'],
    rows: [['Pa', formatQuantity(a.period)], ['Pb', formatQuantity(b.period)], ['synodic period S', formatQuantity(s)]],
    align: ['l', 'r'],
  }];
  const warnings: Array<{ code: string; message: string }> = [];
  const cautions: string[] = [];
  const libraries = [`orbit-notes ${ORBIT_NOTES_VERSION}`];
  let summary = `S = ${formatQuantity(s)}${alt}`;
  let frame: string | undefined;

  const aId = heliocentricId(a);
  const bId = heliocentricId(b);
  if (aId && bId) {
    const from = stmt.span ? ctx.instant(stmt.span.from) : instantFromCalendar({ year: DEFAULT_SYNODIC_SPAN_YEARS.from, month: 1, day: 1, hour: 0, minute: 0, second: 0 }, ctx.calendar);
    const to = stmt.span ? ctx.instant(stmt.span.to) : instantFromCalendar({ year: DEFAULT_SYNODIC_SPAN_YEARS.to, month: 1, day: 1, hour: 0, minute: 0, second: 0 }, ctx.calendar);
    if (!(to.tt > from.tt)) fail(Code.OutOfRange, 'the end of the span must come after its start', stmt.span?.to.range ?? stmt.range);
    ctx.budget.checkSpan(to.tt - from.tt);
    const fromText = formatUtcMinutes(from, ctx.calendar).split(' ')[0]!;
    const toText = formatUtcMinutes(to, ctx.calendar).split(' ')[0]!;
    const spanText = `${fromText} to ${toText}`;
    const found = heliocentricConjunctionTimes(aId, bId, from, to, ctx.budget, stmt.span?.from.range ?? stmt.range);
    libraries.push(ENGINE_LABEL);
    frame = found.frame;
    if (found.accuracy) { cautions.push(found.accuracy); warnings.push({ code: Code.EphemerisAccuracy, message: found.accuracy }); }
    const stats = intervalStats(found.timesTt);
    if (!stats) {
      details.push(`Actual intervals between conjunctions (${spanText}): fewer than two conjunctions in the span, no interval to measure.`);
    } else {
      summary += ` · actual ${yearOf(fromText)}–${yearOf(toText)}: ${intervalSummary(stats)}`;
      tables.push(intervalTable(stats, s, spanText));
      details.push(`Actual intervals: ${stats.intervals} intervals between ${stats.events} heliocentric conjunctions, ${spanText} (${found.evaluations} ephemeris evaluations); they differ from S because the orbits are eccentric and the longitudes are of date.`);
    }
  } else if (stmt.span) {
    const user = !aId ? a : b;
    fail(Code.NoEphemeris, `\`${user.label}\` has no ephemeris: actual conjunction intervals need two built-in planets (leave out the span to get the synodic period alone)`, (user === a ? stmt.a : stmt.b).range);
  }

  return {
    kind: 'synodic',
    summary,
    details,
    tables,
    provenance: { libraries, ...(frame ? { frame } : {}) },
    cautions,
    value: toJson(s, unit),
    ...(warnings.length > 0 ? { warnings } : {}),
  };
}

function heliocentricId(o: PeriodOperand): BuiltinBody | undefined {
  return o.body?.kind === 'builtin' && HELIOCENTRIC.has(o.body.id) ? o.body.id : undefined;
}

function bodySource(o: PeriodOperand): string {
  return o.body?.kind === 'builtin' ? `, mean sidereal period from the ${PERIOD_SOURCE}` : ', from its `body` definition';
}

function yearOf(isoDate: string): string {
  return /^-?\d+/.exec(isoDate)?.[0] ?? isoDate;
}

function intervalSummary(st: IntervalStats): string {
  return `mean ${formatSig(st.meanDays, 5)} d, spread ${formatSig(st.spreadDays, 2)} d, ${formatSig(st.minDays, 5)}–${formatSig(st.maxDays, 5)} d`;
}

function intervalTable(st: IntervalStats, s: Quantity, spanText: string): Table {
  const d = (x: number): string => `${x.toFixed(2)} d`;
  return {
    title: `Intervals between heliocentric conjunctions, ${spanText}`,
    columns: ['statistic', 'value'],
    rows: [
      ['conjunctions', String(st.events)],
      ['mean interval', d(st.meanDays)],
      ['spread (sample s.d.)', d(st.spreadDays)],
      ['shortest', d(st.minDays)],
      ['longest', d(st.maxDays)],
      ['mean − S', `${(st.meanDays - s.value).toFixed(2)} d${sigmaOf(s) > 0 ? ` (σ of S: ${formatSig(sigmaOf(s), 2)} d)` : ' (S from exact periods)'}`],
    ],
    align: ['l', 'r'],
  };
}
