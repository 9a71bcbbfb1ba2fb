/** `series NAME from "PATH" time COL value COL [time-unit yr|d|jd]`: load a CSV time series. */
import type { Statement } from '../../language/ast.js';
import { Code } from '../../language/diagnostics.js';
import { EvalError, type EvalContext, type Series } from '../context.js';
import { digest } from '../digest.js';
import { ORBIT_NOTES_VERSION } from '../provenance.js';
import { formatSig } from '../quantity.js';
import type { PlotSpec, StatementResult } from '../result.js';
import { meanAndSd, parseSeriesCsv, SeriesError, type TimeUnit } from '../series.js';

type SeriesStmt = Extract<Statement, { kind: 'series' }>;

/** Version of the CSV parser named in provenance. */
export const CSV_PARSE_VERSION = '7.0.3';

/** Rows shown in the result's table. */
const HEAD_ROWS = 5;

/** A time as written in the file, with its unit. */
export function formatFileTime(t: number, unit: TimeUnit, spread: number): string {
  // Enough decimals to tell neighbouring samples apart, at most 6.
  const decimals = Math.min(6, Math.max(0, Math.ceil(-Math.log10(Math.max(spread, 1e-9))) + 1));
  switch (unit) {
    case 'jd': return `JD ${t.toFixed(Math.max(decimals, 1))}`;
    case 'yr': return `${t.toFixed(Math.max(decimals, 1))} yr`;
    case 'd': return `${t.toFixed(decimals)} d`;
  }
}

/**
 * Read and parse the series' file. The evaluator registers `series.name` for later statements.
 * @throws EvalError: whatever `ctx.readText` throws for a missing or outside-workspace file (passed on
 *   as is; other read failures become `OB403` at the path), `OB403` at the statement for a
 *   malformed file (message names line and column), `OB401` past the row limit.
 */
export async function loadSeries(stmt: SeriesStmt, ctx: EvalContext): Promise<{ series: Series; result: StatementResult }> {
  let text: string;
  try {
    text = await ctx.readText(stmt.path, stmt.pathRange);
  } catch (e) {
    if (e instanceof EvalError) throw e;
    throw new EvalError(Code.DataFile, `cannot read "${stmt.path}": ${e instanceof Error ? e.message : String(e)}`, stmt.pathRange);
  }
  let parsed;
  try {
    parsed = parseSeriesCsv(text, { timeColumn: stmt.timeColumn, valueColumn: stmt.valueColumn, timeUnit: stmt.timeUnit });
  } catch (e) {
    if (e instanceof SeriesError) throw new EvalError(Code.DataFile, `"${stmt.path}": ${e.message}`, e.line === undefined && e.column === undefined ? stmt.pathRange : stmt.range);
    throw e;
  }
  const contentDigest = digest(text);
  const series: Series = {
    name: stmt.name.name,
    tDays: parsed.tDays,
    values: parsed.values,
    source: `${stmt.path} (digest ${contentDigest})`,
  };
  const n = parsed.values.length;
  const { mean, sd } = meanAndSd(parsed.values);
  const tf = parsed.tFile;
  const minStep = tf.slice(1).reduce((m, t, i) => Math.min(m, t - tf[i]!), Infinity);
  const fmt = (t: number): string => formatFileTime(t, stmt.timeUnit, minStep);
  const first = tf[0]!;
  const last = tf[n - 1]!;
  const headRows = tf.slice(0, HEAD_ROWS).map((t, i) => [String(parsed.lines[i]), fmt(t), formatSig(parsed.values[i]!, 6)]);
  if (n > HEAD_ROWS) headRows.push(['…', `${n - HEAD_ROWS} more rows`, '']);
  const plot: PlotSpec = {
    kind: 'line',
    title: `${stmt.name.name}: ${stmt.valueColumn} against ${stmt.timeColumn}`,
    xLabel: `${stmt.timeColumn} (${stmt.timeUnit === 'jd' ? 'JD' : stmt.timeUnit})`,
    yLabel: stmt.valueColumn,
    series: [{ label: stmt.valueColumn, x: tf, y: parsed.values }],
  };
  const result: StatementResult = {
    kind: 'series',
    summary: `${n} samples, t from ${fmt(first)} to ${fmt(last)}, mean ${formatSig(mean, 4)} ± ${formatSig(sd, 3)} (sd)`,
    details: [
      `File: ${stmt.path} (digest ${contentDigest}), ${parsed.header.length} columns, delimiter ${parsed.delimiter === '\t' ? 'tab' : `"${parsed.delimiter}"`}`,
      `Time: column \`${stmt.timeColumn}\` in ${stmt.timeUnit === 'yr' ? 'Julian years of 365.25 d' : stmt.timeUnit === 'jd' ? 'Julian Date (days)' : 'days'}; value: column \`${stmt.valueColumn}\``,
      `Span: ${formatSig(last - first, 6)} ${stmt.timeUnit === 'yr' ? 'yr' : 'd'}; shortest step ${formatSig(minStep, 4)} ${stmt.timeUnit === 'yr' ? 'yr' : 'd'}`,
      'Spread: sample standard deviation (n − 1 in the denominator).',
    ],
    tables: [{ title: `${stmt.name.name} (first rows)`, columns: ['line', stmt.timeColumn, stmt.valueColumn], rows: headRows, align: ['r', 'r', 'r'] }],
    provenance: {
      libraries: [`orbit-notes ${ORBIT_NOTES_VERSION}`, `csv-parse ${CSV_PARSE_VERSION}`],
      timeScale: 'times as written in the file (no scale conversion)',
    },
    cautions: [],
    plots: [plot],
  };
  return { series, result };
}
