/** `periodogram NAME [periods P to P] [peaks M] [mark E, …]`: floating-mean Lomb–Scargle of a series. */
import type { Expr, Statement } from '../../language/ast.js';
import { Code } from '../../language/diagnostics.js';
import { EvalError, fail, type EvalContext } from '../context.js';
import { CancelledError, LimitError } from '../limits.js';
import { chanceAtLeast, DEFAULT_OVERSAMPLING, MATCH_MAX_FAP, matchPeriods, MIN_PERIODOGRAM_SAMPLES, PEAK_SEPARATION_WIDTHS, periodogram, type Peak } from '../periodogram.js';
import { ORBIT_NOTES_VERSION } from '../provenance.js';
import { defaultUnit, describeDim, formatSig, sigmaOf, type Quantity, type UnitDef } from '../quantity.js';
import type { PlotSpec, StatementResult, Table } from '../result.js';

type PeriodogramStmt = Extract<Statement, { kind: 'periodogram' }>;

/** Default and largest number of peaks listed. */
export const DEFAULT_PEAKS = 3;
export const MAX_PEAKS = 50;

/** A caution every periodogram result carries. */
export const NOT_A_FORECAST = 'A cycle fitted to past data, or matched to a computed period, is not a forecast: it says nothing by itself about future values.';

/** Short source-like text of an expression, for labels (`synodic(jupiter, saturn)`, `11.86 yr`). */
export function exprLabel(e: Expr): string {
  switch (e.type) {
    case 'number': return `${e.value}${e.unit ? ` ${e.unit}` : ''}${e.sigma !== undefined ? ` ± ${e.sigma}${e.sigmaUnit ? ` ${e.sigmaUnit}` : ''}` : ''}`;
    case 'name': return e.name;
    case 'call': return `${e.fn.name}(${e.args.map(exprLabel).join(', ')})`;
    case 'binary': return `${exprLabel(e.left)} ${e.op} ${exprLabel(e.right)}`;
    case 'neg': return `-${exprLabel(e.operand)}`;
  }
}

/** A period in days from an expression that is a time or a frequency (or a body with a period). */
function periodOf(e: Expr, ctx: EvalContext, what: string): Quantity {
  let q: Quantity;
  try {
    q = ctx.value(e);
  } catch (err) {
    // A bare body name stands for its period, as in `mark jupiter`.
    if (!(err instanceof EvalError) || e.type !== 'name') throw err;
    let period: Quantity | undefined;
    try { period = ctx.body(e).period; } catch { throw err; }
    if (!period) throw err;
    q = period;
  }
  if (q.dim === 'frequency') {
    if (!(q.value > 0)) fail(Code.OutOfRange, `${what} must be a positive frequency`, e.range);
    const p = 1 / q.value;
    const contrib = new Map<string, number>();
    for (const [id, c] of q.contrib) contrib.set(id, c * p * p);
    return { value: p, dim: 'time', contrib };
  }
  if (q.dim !== 'time') fail(Code.DimensionMismatch, `${what} must be a period (a time such as \`11 yr\`) or a frequency (\`0.09 /yr\`), not ${describeDim(q.dim)}`, e.range);
  if (!(q.value > 0)) fail(Code.OutOfRange, `${what} must be a positive period`, e.range);
  return q;
}

function fmtPeriod(days: number, unit: UnitDef, sig = 5): string {
  return `${formatSig(days / unit.factor, sig)} ${unit.name}`;
}

function fmtProb(p: number): string {
  if (p >= 0.995) return '1';
  if (p >= 0.01) return p.toFixed(2);
  if (p < 1e-16) return '< 1e-16';
  return p.toExponential(0);
}

/** Most points a periodogram plot carries; a plot is a few hundred pixels wide. */
export const MAX_PLOT_POINTS = 20_000;

/**
 * The curve as (period in `unitDays`, power) points, thinned to the lowest and highest power of each
 * run of consecutive frequencies when there are more than {@link MAX_PLOT_POINTS}, so no peak is lost.
 */
export function plotPoints(power: Float64Array, f0PerDay: number, dfPerDay: number, unitDays: number): { x: number[]; y: number[] } {
  const x: number[] = [];
  const y: number[] = [];
  const push = (k: number): void => { x.push(1 / (f0PerDay + k * dfPerDay) / unitDays); y.push(power[k]!); };
  const run = Math.ceil(power.length / (MAX_PLOT_POINTS / 2));
  if (run <= 1) { for (let k = 0; k < power.length; k++) push(k); return { x, y }; }
  for (let k0 = 0; k0 < power.length; k0 += run) {
    let lo = k0;
    let hi = k0;
    for (let k = k0; k < Math.min(power.length, k0 + run); k++) {
      if (power[k]! < power[lo]!) lo = k;
      if (power[k]! > power[hi]!) hi = k;
    }
    push(Math.min(lo, hi));
    if (lo !== hi) push(Math.max(lo, hi));
  }
  return { x, y };
}

/**
 * Evaluate a `periodogram` statement.
 * @throws EvalError: `OB201` for an unknown series (from ctx.series), `OB301`/`OB302` for a bad period
 *   range or mark, `OB302` for a series too short or without variation, `OB401` when the frequency
 *   grid exceeds the budget (checked before computing), `OB402` when cancelled.
 */
export function evalPeriodogram(stmt: PeriodogramStmt, ctx: EvalContext): StatementResult {
  const series = ctx.series(stmt.target);
  const n = series.tDays.length;
  if (n < MIN_PERIODOGRAM_SAMPLES) fail(Code.OutOfRange, `\`${series.name}\` has ${n} samples; a periodogram needs at least ${MIN_PERIODOGRAM_SAMPLES}`, stmt.target.range);
  const peaksWanted = stmt.peaks ?? DEFAULT_PEAKS;
  if (!(Number.isInteger(peaksWanted) && peaksWanted >= 1 && peaksWanted <= MAX_PEAKS)) fail(Code.OutOfRange, `peaks must be a whole number from 1 to ${MAX_PEAKS}`, stmt.range);

  let minPeriodDays: number | undefined;
  let maxPeriodDays: number | undefined;
  if (stmt.periods) {
    const a = periodOf(stmt.periods.from, ctx, 'the shortest period').value;
    const b = periodOf(stmt.periods.to, ctx, 'the longest period').value;
    if (a === b) fail(Code.OutOfRange, 'the period range is empty: give two different periods, e.g. `periods 2 yr to 40 yr`', stmt.periods.to.range);
    minPeriodDays = Math.min(a, b);
    maxPeriodDays = Math.max(a, b);
  }
  const marks = (stmt.mark ?? []).map((e) => {
    const q = periodOf(e, ctx, 'a marked period');
    return { label: exprLabel(e), periodDays: q.value, sigmaDays: sigmaOf(q), range: e.range };
  });

  let pg;
  try {
    pg = periodogram(series, {
      ...(minPeriodDays !== undefined ? { minPeriodDays } : {}),
      ...(maxPeriodDays !== undefined ? { maxPeriodDays } : {}),
      peaks: peaksWanted, budget: ctx.budget,
    });
  } catch (e) {
    if (e instanceof LimitError || e instanceof CancelledError || e instanceof EvalError) throw e;
    if (e instanceof RangeError) fail(Code.OutOfRange, `periodogram of \`${series.name}\`: ${e.message}`, stmt.target.range);
    throw e;
  }
  const { prepared, grid, peaks } = pg;
  const fLo = grid.f0PerDay;
  const fHi = grid.f0PerDay + grid.dfPerDay * (grid.count - 1);
  const top = peaks[0];
  const unit = defaultUnit({ value: top ? top.periodDays : pg.maxPeriodDays, dim: 'time', contrib: new Map() });
  const fUnit: UnitDef = unit.name === 'yr' ? { name: '/yr', dim: 'frequency', factor: 1 / 365.25 } : { name: '/d', dim: 'frequency', factor: 1 };

  // Period ± half width: the HWHM in frequency mapped to period, δP = P²·δf.
  const peakRow = (p: Peak, i: number): string[] => [
    String(i + 1),
    `${fmtPeriod(p.periodDays, unit)} ± ${formatSig(p.periodDays * p.periodDays * p.halfWidthPerDay / unit.factor, 2)}`,
    `${formatSig(p.frequencyPerDay / fUnit.factor, 5)} ${fUnit.name}`,
    p.power.toFixed(3),
    fmtProb(p.fap),
  ];
  const matches = matchPeriods(peaks, grid, marks);
  const matchedCount = matches.filter((m) => m.matched).length;
  const tables: Table[] = [{
    title: `Peaks of ${series.name}`,
    columns: ['#', 'period ± HWHM', 'frequency', 'power', 'FAP'],
    rows: peaks.map(peakRow),
    align: ['r', 'r', 'r', 'r', 'r'],
  }];
  if (matches.length > 0) {
    tables.push({
      title: 'Computed periods against the peaks',
      columns: ['period', 'value', `nearest peak with FAP ≤ ${MATCH_MAX_FAP}`, 'offset', 'tolerance', 'match', 'chance'],
      rows: matches.map((m) => [
        m.label,
        `${fmtPeriod(m.periodDays, unit)}${m.sigmaDays > 0 ? ` ± ${formatSig(m.sigmaDays / unit.factor, 2)}` : ''}`,
        m.peakIndex >= 0 ? `#${m.peakIndex + 1} ${fmtPeriod(peaks[m.peakIndex]!.periodDays, unit)}` : 'none listed',
        Number.isFinite(m.offsetPerDay) ? `${formatSig(m.offsetPerDay / fUnit.factor, 2)} ${fUnit.name}` : '—',
        m.peakIndex >= 0 ? `${formatSig(m.tolerancePerDay / fUnit.factor, 2)} ${fUnit.name}` : '—',
        m.matched ? 'yes' : 'no',
        m.peakIndex >= 0 ? fmtProb(m.chance) : '—',
      ]),
      align: ['l', 'r', 'r', 'r', 'r', 'l', 'r'],
    });
  }

  const cautions = [NOT_A_FORECAST,
    'False-alarm probabilities assume white Gaussian noise; correlated ("red") noise, common in natural series, makes long-period peaks look more significant than they are.'];
  const warnings: Array<{ code: string; message: string }> = [];
  if (pg.minPeriodDays < 2 * pg.medianStepDays * (1 - 1e-9)) {
    warnings.push({ code: Code.OutOfRange, message: `periods below ${fmtPeriod(2 * pg.medianStepDays, unit, 3)} (twice the median sampling step) may be aliases of longer ones` });
  }
  if (pg.maxPeriodDays > prepared.spanDays * (1 + 1e-9)) {
    warnings.push({ code: Code.OutOfRange, message: `periods beyond the span of the series (${fmtPeriod(prepared.spanDays, unit, 3)}) are barely constrained: less than one cycle is observed` });
  }

  const summaryParts: string[] = [];
  if (top) summaryParts.push(`top peak ${fmtPeriod(top.periodDays, unit, 4)} (power ${top.power.toFixed(2)}, FAP ${fmtProb(top.fap)})`);
  else summaryParts.push('no peak inside the period range');
  if (peaks.length > 1) summaryParts.push(`next ${peaks.slice(1, 3).map((p) => fmtPeriod(p.periodDays, unit, 4)).join(', ')}`);
  if (matches.length > 0) {
    summaryParts.push(matchedCount === 0
      ? `no marked period matches a significant peak`
      : `${matchedCount} of ${matches.length} marked period${matches.length === 1 ? '' : 's'} match a significant peak (chance ${fmtProb(chanceAtLeast(matchedCount, matches.map((m) => m.chance)))})`);
  }

  const plot: PlotSpec = {
    kind: 'periodogram',
    title: `Periodogram of ${series.name}`,
    xLabel: `period (${unit.name})`,
    yLabel: 'power (ZK09 standard, 0–1)',
    series: [{ label: series.name, ...plotPoints(pg.power, grid.f0PerDay, grid.dfPerDay, unit.factor) }],
    markers: matches.map((m) => ({ x: m.periodDays / unit.factor, label: m.label })),
    xLog: true,
  };

  return {
    kind: 'periodogram',
    summary: summaryParts.join('; '),
    details: [
      'Power p(f) = [SS·YC² + CC·YS² − 2·CS·YC·YS] / (YY·D), D = CC·SS − CS²: the fraction of the variance about the mean explained by a sinusoid plus offset (Zechmeister & Kürster 2009, A&A 496, 577, eqs. 4–5; floating mean).',
      `Series \`${series.name}\`: ${n} samples over ${fmtPeriod(prepared.spanDays, unit, 4)}, equal weights; source ${series.source}.`,
      `Periods ${fmtPeriod(pg.minPeriodDays, unit, 4)} to ${fmtPeriod(pg.maxPeriodDays, unit, 4)}${stmt.periods ? '' : ' (default: twice the median step to the span)'}; ${grid.count} frequencies, uniform in frequency, ${DEFAULT_OVERSAMPLING} per peak width 1/T (VanderPlas 2018, ApJS 236, 16, §7.1).`,
      'Phases advanced by trigonometric recurrence between grid frequencies (Press et al., Numerical Recipes, 2nd ed., §5.5, §13.8), re-seeded exactly every 1024 frequencies.',
      `Peaks: local maxima at least ${PEAK_SEPARATION_WIDTHS}/T apart (so a strong peak's side lobes are not listed), refined by a parabola and a direct evaluation; ± is the half width at half maximum.`,
      `FAP: Baluev 2008, MNRAS 385, 1279 (floating mean, noise level unknown), over the band ${formatSig(fLo / fUnit.factor, 4)}–${formatSig(fHi / fUnit.factor, 4)} ${fUnit.name}.`,
      ...(matches.length > 0 ? [
        `Match: the marked frequency lies within √(HWHM² + (2σ)²) of the nearest listed peak whose FAP is at most ${MATCH_MAX_FAP} (a peak noise could have made matches nothing). Chance: the probability that a period unrelated to the data, uniform in frequency over the band, lands that close to any such peak; for several marks, the chance of at least as many matches (Poisson-binomial).`,
      ] : []),
    ],
    tables,
    provenance: {
      libraries: [`orbit-notes ${ORBIT_NOTES_VERSION}`],
      timeScale: 'times as in the series',
    },
    cautions,
    plots: [plot],
    ...(warnings.length > 0 ? { warnings } : {}),
  };
}
