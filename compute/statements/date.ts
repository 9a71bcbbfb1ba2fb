/** `date D`: one instant in every form a practitioner checks. */
import type { Statement } from '../../language/ast.js';
import type { EvalContext } from '../context.js';
import { ENGINE_LABEL } from '../provenance.js';
import type { StatementResult } from '../result.js';
import { deltaTSeconds, formatJd, GREGORIAN_START_JD, jdTt, jdUt, weekday } from '../time.js';

type DateStmt = Extract<Statement, { kind: 'date' }>;

export function evalDate(stmt: DateStmt, ctx: EvalContext): StatementResult {
  const i = ctx.instant(stmt.date);
  const jdU = jdUt(i);
  const jdT = jdTt(i);
  const dT = deltaTSeconds(i.ut);
  const julian = formatJd(jdU, 'julian');
  const gregorian = formatJd(jdU, 'gregorian');
  const shown = ctx.calendar === 'gregorian' || jdU >= GREGORIAN_START_JD ? 'gregorian' : 'julian';
  const main = shown === 'gregorian' ? gregorian : julian;
  const other = shown === 'gregorian' ? julian : gregorian;
  const rows: string[][] = [
    [shown === 'gregorian' ? 'Gregorian (UT)' : 'Julian calendar (UT)', main],
  ];
  if (other !== main) rows.push([shown === 'gregorian' ? 'Julian calendar (UT)' : 'proleptic Gregorian (UT)', other]);
  rows.push(
    ['Julian Date (UT)', jdU.toFixed(6)],
    ['Julian Date (TT)', jdT.toFixed(6)],
    ['ΔT = TT − UT', `${formatDeltaT(dT)}`],
    ['weekday', weekday(jdU)],
  );
  return {
    kind: 'date',
    summary: `${main} UT${other !== main ? ` (= ${other.slice(0, 10)} ${shown === 'gregorian' ? 'Julian' : 'Gregorian'})` : ''} · JD ${jdU.toFixed(5)} UT · ΔT ${formatDeltaT(dT)}`,
    details: [
      `Calendar: ${shown === 'gregorian' ? 'Gregorian' : 'Julian'}${ctx.calendar === 'gregorian' ? ' (proleptic, `set calendar gregorian`)' : ' (Julian before 1582-10-15, Gregorian from then on)'}`,
      'Julian Date from the calendar date: Meeus, Astronomical Algorithms (1998), eq. 7.1',
      'Years in astronomical numbering: year 0 is 1 BCE.',
    ],
    tables: [{ columns: ['form', 'value'], rows, align: ['l', 'r'] }],
    provenance: {
      libraries: [ENGINE_LABEL],
      timeScale: 'input read as UT (UTC for modern dates) unless marked TT',
      // The value itself is in the table; the provenance names the model, so that blocks with several dates list it once.
      deltaT: `ΔT from the Espenak & Meeus (2006) polynomials${deltaTExtrapolated(i.ut) ? ', extrapolated outside −500…2150' : ''}`,
    },
    cautions: [],
    events: [{ jd_tt: jdT, utc: `${main.replace(' ', 'T')}Z`, fields: { jd_ut: jdU, delta_t_s: dT } }],
  };
}

export function formatDeltaT(seconds: number): string {
  const a = Math.abs(seconds);
  if (a < 1000) return `${seconds.toFixed(1)} s`;
  if (a < 86400) return `${(seconds / 3600).toFixed(2)} h`;
  return `${(seconds / 86400).toFixed(3)} d`;
}

/** The ΔT polynomials are fitted to −500…2150; outside, they are extrapolations. */
export function deltaTExtrapolated(ut: number): boolean {
  const year = 2000 + ut / 365.25;
  return year < -500 || year > 2150;
}
