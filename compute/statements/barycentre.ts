/**
 * `barycentre from D to D [step Q]`: the Sun's offset from the barycentre of the Sun and the four
 * giant planets (the members of the library's `ssb`), with extremes and dominant periods
 * (compute/barycentre.ts on positions from compute/ephemeris.ts).
 */
import type { Statement } from '../../language/ast.js';
import { Code } from '../../language/diagnostics.js';
import { analyseBarycentre, ALL_PLANETS, ephemerisPlanets, GIANT_PLANETS, sunOffsetFunction, type TurningPoint } from '../barycentre.js';
import { builtinPeriod, PERIOD_SOURCE } from '../bodies.js';
import { fail, type EvalContext } from '../context.js';
import { accuracyWarning, EphemerisError, sunFromBarycentre } from '../ephemeris.js';
import { ENGINE_LABEL, ORBIT_NOTES_VERSION } from '../provenance.js';
import { AU_KM, NOMINAL_SOLAR_RADIUS_KM, formatSig } from '../quantity.js';
import type { EventRecord, PlotSpec, StatementResult, Table } from '../result.js';
import { deltaTSeconds, formatUtcMinutes, instantFromTt, isoUtc, jdTt } from '../time.js';
import { formatDeltaT } from './date.js';

type BarycentreStmt = Extract<Statement, { kind: 'barycentre' }>;

const YEAR_DAYS = 365.25;
/** Default sampling: about 2000 samples over the span, between 5 days and one year. */
export const DEFAULT_SAMPLES = 2000;
const MIN_DEFAULT_STEP_DAYS = 5;
const MAX_DEFAULT_STEP_DAYS = YEAR_DAYS;
/** Instants at which the all-planet and library-vector comparisons are made. */
const COMPARISON_SAMPLES = 400;
/** Most turning points listed in the table. */
const MAX_TURNING_ROWS = 200;

/**
 * Periods a practitioner compares the peaks with: sidereal periods of the giants, their pair
 * synodic periods, and the halves of both (a distance that swings twice per cycle, as with an
 * eccentric orbit or two bodies passing on both sides, shows the first harmonic).
 */
function namedPeriods(): Array<{ label: string; periodDays: number }> {
  const base: Array<{ label: string; periodDays: number }> = [];
  const p = GIANT_PLANETS.map((name) => ({ name, days: builtinPeriod(name)!.value }));
  for (const a of p) base.push({ label: `period(${a.name})`, periodDays: a.days });
  for (let i = 0; i < p.length; i++) {
    for (let j = i + 1; j < p.length; j++) {
      // 1/S = |1/Pa − 1/Pb| (the synodic period).
      base.push({ label: `synodic(${p[i]!.name}, ${p[j]!.name})`, periodDays: 1 / Math.abs(1 / p[i]!.days - 1 / p[j]!.days) });
    }
  }
  return [...base, ...base.map((c) => ({ label: `${c.label} / 2`, periodDays: c.periodDays / 2 }))];
}

const fmtKm = (km: number): string => `${Math.round(km).toLocaleString('en-US')} km`;
const fmtRsun = (km: number): string => `${(km / NOMINAL_SOLAR_RADIUS_KM).toFixed(3)} R☉`;
const fmtYears = (days: number): string => `${formatSig(days / YEAR_DAYS, 4)} yr`;

/**
 * Evaluate a `barycentre` statement.
 * @throws EvalError: OB301 for a step that is not a time, OB302 for a bad span or step, or dates
 *   the ephemeris cannot compute; LimitError (OB401) for the span or evaluation limits; CancelledError.
 */
export function evalBarycentre(stmt: BarycentreStmt, ctx: EvalContext): StatementResult {
  const from = ctx.instant(stmt.span.from);
  const to = ctx.instant(stmt.span.to);
  if (!(to.tt > from.tt)) fail(Code.OutOfRange, 'the end date must come after the start date', stmt.span.to.range);
  const spanDays = to.tt - from.tt;
  ctx.budget.checkSpan(spanDays);
  let stepDays: number;
  if (stmt.step) {
    const q = ctx.value(stmt.step);
    if (q.dim !== 'time') fail(Code.DimensionMismatch, 'the step must be a time, e.g. `step 10 d`', stmt.step.range);
    if (!(q.value > 0)) fail(Code.OutOfRange, 'the step must be positive', stmt.step.range);
    if (spanDays / q.value < 2) fail(Code.OutOfRange, 'the step is longer than half the span: use a smaller step', stmt.step.range);
    stepDays = q.value;
  } else {
    stepDays = Math.min(MAX_DEFAULT_STEP_DAYS, Math.max(MIN_DEFAULT_STEP_DAYS, spanDays / DEFAULT_SAMPLES));
  }

  let analysis;
  let allPlanetsMaxKm = 0;
  let libraryVectorMaxKm = 0;
  try {
    const giants = ephemerisPlanets(GIANT_PLANETS, ctx.budget);
    analysis = analyseBarycentre(giants, { fromTt: from.tt, toTt: to.tt, stepDays, budget: ctx.budget, peaks: 5 });
    // How much the terrestrial planets, and the library's own barycentre vector, would change the answer.
    const ours = sunOffsetFunction(giants);
    const all = sunOffsetFunction(ephemerisPlanets(ALL_PLANETS, ctx.budget));
    for (let k = 0; k <= COMPARISON_SAMPLES; k++) {
      const tt = from.tt + spanDays * k / COMPARISON_SAMPLES;
      const a = ours(tt);
      const b = all(tt);
      const lib = sunFromBarycentre(tt, ctx.budget);
      allPlanetsMaxKm = Math.max(allPlanetsMaxKm, Math.hypot(a.xKm - b.xKm, a.yKm - b.yKm, a.zKm - b.zKm));
      // The library vector is in the J2000 equator: compare distances, which no rotation changes.
      libraryVectorMaxKm = Math.max(libraryVectorMaxKm, Math.abs(a.distanceKm - Math.hypot(lib.xAu, lib.yAu, lib.zAu) * AU_KM));
    }
  } catch (err) {
    if (err instanceof EphemerisError || err instanceof RangeError) fail(Code.OutOfRange, `barycentre: ${err.message}`, stmt.range);
    throw err;
  }

  const when = (tt: number): string => formatUtcMinutes(instantFromTt(tt), ctx.calendar);
  const { max, min } = analysis;
  const named = namedPeriods();
  const peakRows = analysis.peaks.map((p, i) => {
    const halfWidthDays = p.periodDays * p.periodDays * p.halfWidthPerDay;
    let best = named[0]!;
    for (const c of named) if (Math.abs(1 / c.periodDays - p.frequencyPerDay) < Math.abs(1 / best.periodDays - p.frequencyPerDay)) best = c;
    const within = Math.abs(1 / best.periodDays - p.frequencyPerDay) <= p.halfWidthPerDay;
    return [String(i + 1), `${fmtYears(p.periodDays)} ± ${formatSig(halfWidthDays / YEAR_DAYS, 2)}`, p.power.toFixed(3), `${best.label} = ${fmtYears(best.periodDays)}`, within ? 'yes' : 'no'];
  });

  const tpRows = (tp: TurningPoint): string[] => [tp.kind === 'max' ? 'maximum' : 'minimum', when(tp.tt), fmtKm(tp.distanceKm), fmtRsun(tp.distanceKm)];
  const tables: Table[] = [
    {
      title: 'Extremes of the Sun’s distance from the barycentre',
      columns: ['', 'when (UTC)', 'distance', 'solar radii'],
      rows: [
        ['largest', `${when(max.tt)}${max.tt === analysis.tt[0] || max.tt === analysis.tt[analysis.tt.length - 1] ? ' (span end)' : ''}`, fmtKm(max.distanceKm), fmtRsun(max.distanceKm)],
        ['smallest', `${when(min.tt)}${min.tt === analysis.tt[0] || min.tt === analysis.tt[analysis.tt.length - 1] ? ' (span end)' : ''}`, fmtKm(min.distanceKm), fmtRsun(min.distanceKm)],
      ],
      align: ['l', 'l', 'r', 'r'],
    },
    {
      title: `Turning points (${analysis.turningPoints.length}${analysis.turningPoints.length > MAX_TURNING_ROWS ? `, first ${MAX_TURNING_ROWS} shown` : ''})`,
      columns: ['kind', 'when (UTC)', 'distance', 'solar radii'],
      rows: analysis.turningPoints.slice(0, MAX_TURNING_ROWS).map(tpRows),
      align: ['l', 'l', 'r', 'r'],
    },
  ];
  if (peakRows.length > 0) {
    tables.push({
      title: 'Dominant periods of the distance (Lomb–Scargle peaks)',
      columns: ['#', 'period ± HWHM', 'power', 'nearest planetary period', 'within HWHM'],
      rows: peakRows,
      align: ['r', 'r', 'r', 'l', 'l'],
    });
  }

  const events: EventRecord[] = analysis.turningPoints.map((tp) => {
    const inst = instantFromTt(tp.tt);
    return { jd_tt: jdTt(inst), utc: isoUtc(inst, ctx.calendar), fields: { kind: tp.kind, distance_km: tp.distanceKm, distance_rsun: tp.distanceKm / NOMINAL_SOLAR_RADIUS_KM } };
  });

  const year = (tt: number): number => 2000 + tt / YEAR_DAYS;
  const circle = Array.from({ length: 121 }, (_, k) => 2 * Math.PI * k / 120);
  const plots: PlotSpec[] = [
    {
      kind: 'path',
      title: 'The Sun’s centre about the barycentre (J2000 ecliptic plane)',
      xLabel: 'x toward the J2000 equinox (R☉)',
      yLabel: 'y (R☉)',
      series: [
        { label: 'Sun’s centre', x: analysis.xKm.map((v) => v / NOMINAL_SOLAR_RADIUS_KM), y: analysis.yKm.map((v) => v / NOMINAL_SOLAR_RADIUS_KM) },
        { label: '1 R☉ from the barycentre', x: circle.map(Math.cos), y: circle.map(Math.sin) },
      ],
    },
    {
      kind: 'line',
      title: 'Distance of the Sun’s centre from the barycentre',
      xLabel: 'year (TT; J2000 + Julian years)',
      yLabel: 'distance (R☉)',
      series: [{ label: 'distance', x: analysis.tt.map(year), y: analysis.distanceKm.map((v) => v / NOMINAL_SOLAR_RADIUS_KM) }],
      markers: [
        { x: year(max.tt), label: `max ${(max.distanceKm / NOMINAL_SOLAR_RADIUS_KM).toFixed(2)} R☉` },
        { x: year(min.tt), label: `min ${(min.distanceKm / NOMINAL_SOLAR_RADIUS_KM).toFixed(2)} R☉` },
      ],
    },
  ];
  const pg = analysis.periodogram;
  if (pg) {
    plots.push({
      kind: 'periodogram',
      title: 'Periodogram of the distance',
      xLabel: 'period (yr)',
      yLabel: 'power (ZK09 standard, 0–1)',
      series: [{ label: 'distance', x: Array.from(pg.power, (_, k) => 1 / (pg.grid.f0PerDay + k * pg.grid.dfPerDay) / YEAR_DAYS), y: Array.from(pg.power) }],
      markers: named.filter((c) => c.periodDays >= pg.minPeriodDays && c.periodDays <= pg.maxPeriodDays && c.label.startsWith('synodic(jupiter') && !c.label.endsWith('/ 2'))
        .map((c) => ({ x: c.periodDays / YEAR_DAYS, label: c.label })),
      xLog: true,
    });
  }

  const top = analysis.peaks.slice(0, 2).map((p) => fmtYears(p.periodDays));
  const warnings: Array<{ code: string; message: string }> = [];
  const acc = accuracyWarning(from.ut, to.ut, [...GIANT_PLANETS]);
  if (acc) warnings.push({ code: Code.EphemerisAccuracy, message: acc.message });
  if (analysis.peaks.length === 0) {
    warnings.push({ code: Code.OutOfRange, message: `the span is too short for dominant periods: the periodogram needs at least twice its shortest period (${fmtYears(Math.max(4 * stepDays, 2 * YEAR_DAYS))})` });
  }

  return {
    kind: 'barycentre',
    summary: `${fmtRsun(min.distanceKm)}–${fmtRsun(max.distanceKm)} from the barycentre; max on ${when(max.tt).slice(0, 10)}, min on ${when(min.tt).slice(0, 10)}${top.length > 0 ? `; dominant periods ${top.join(', ')}` : ''} (Sun + 4 giant planets)`,
    details: [
      'r☉ = −Σ mᵢ rᵢ / (1 + Σ mᵢ): the Sun relative to the centre of mass of the Sun and the four giant planets (Jupiter, Saturn, Uranus, Neptune, each with its satellites), the members of the library’s barycentre `ssb`; rᵢ heliocentric, mᵢ in solar masses.',
      'Masses: the ephemeris library’s GM values (planet-system GM over the Sun’s GM); positions: its truncated VSOP87 theory.',
      `Adding Mercury, Venus, the Earth–Moon pair and Mars would move the Sun by up to ${fmtKm(allPlanetsMaxKm)} over this span (compared at ${COMPARISON_SAMPLES + 1} instants).`,
      `The library’s own \`ssb\` vector adds each planet’s two-body shift mᵢ/(1 + mᵢ)·rᵢ instead; its distance differs from this one by up to ${fmtKm(libraryVectorMaxKm)} here.`,
      `Sampled every ${formatSig(stepDays, 4)} d (${analysis.tt.length} samples${stmt.step ? '' : ', the default of about 2000 samples'}); turning points refined by Brent’s minimiser (Brent 1973, chapter 5) to 0.001 d.`,
      ...(pg ? [`Dominant periods: floating-mean Lomb–Scargle periodogram (Zechmeister & Kürster 2009) of the sampled distance over periods ${fmtYears(pg.minPeriodDays)} to ${fmtYears(pg.maxPeriodDays)}; the series is computed, not measured, so no false-alarm probability is given. Named periods (and their halves) from ${PERIOD_SOURCE}; synodic 1/S = |1/Pa − 1/Pb|.`] : []),
      `Solar radius: nominal, IAU 2015 Resolution B3 (${NOMINAL_SOLAR_RADIUS_KM.toLocaleString('en-US')} km); au = ${AU_KM.toLocaleString('en-US')} km (IAU 2012 B2).`,
      `${analysis.evaluations} planet positions for the analysis.`,
    ],
    tables,
    provenance: {
      libraries: [ENGINE_LABEL, `orbit-notes ${ORBIT_NOTES_VERSION}`],
      timeScale: 'TT for positions; UTC shown',
      deltaT: `ΔT = ${formatDeltaT(deltaTSeconds(from.ut))} at the start of the span (Espenak & Meeus 2006 polynomials)`,
      frame: 'heliocentric geometric positions, J2000 mean ecliptic and equinox (x–y is the ecliptic plane)',
      validity: 'truncated VSOP87: about 1′ (worst ≈ 100″) heliocentric over 1000–3000; against the full VSOP87 with IAU 2009 masses, the offset agrees to about 80 km over 1900–2100 and 250 km over 1000–3000 (test/unit/barycentre.test.ts)',
    },
    cautions: [
      'A cycle in the Sun’s barycentric motion is a property of the planets’ orbits; by itself it is not a forecast of solar activity or of anything on Earth.',
    ],
    events,
    plots,
    ...(warnings.length > 0 ? { warnings } : {}),
  };
}
