import { strict as assert } from 'node:assert';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Range, Statement } from '../../language/ast.js';
import { Code } from '../../language/diagnostics.js';
import { Budget, LimitError } from '../../compute/limits.js';
import { EvalError, type EvalContext } from '../../compute/context.js';
import { meanAndSd, parseSeriesCsv, SeriesError, type SeriesSpec } from '../../compute/series.js';
import { CSV_PARSE_VERSION, loadSeries } from '../../compute/statements/series.js';

const at = (line: number, a: number, b: number): Range => ({ start: { line, character: a }, end: { line, character: b } });
const STMT_RANGE = at(3, 0, 60);
const PATH_RANGE = at(3, 17, 30);

type SeriesStmt = Extract<Statement, { kind: 'series' }>;
const stmt = (over: Partial<SeriesStmt> = {}): SeriesStmt => ({
  kind: 'series', name: { name: 'flux', range: at(3, 7, 11) }, path: 'data/flux.csv', pathRange: PATH_RANGE,
  timeColumn: 'year', valueColumn: 'flux', timeUnit: 'yr', range: STMT_RANGE, ...over,
});

/** A context whose only working part is reading files from an inline map. */
function filesContext(files: Record<string, string>): EvalContext {
  const nope = (): never => { throw new Error('not used'); };
  return {
    calendar: 'mixed', seed: 1, budget: new Budget(),
    instant: nope, value: nope, body: nope, series: nope,
    readText: (path, range) => (path in files ? Promise.resolve(files[path]!)
      : Promise.reject(new EvalError(Code.DataFile, `no file "${path}" next to the note`, range))),
  };
}

const spec: SeriesSpec = { timeColumn: 'year', valueColumn: 'flux', timeUnit: 'yr' };

function seriesError(fn: () => unknown): SeriesError {
  try { fn(); } catch (e) { if (e instanceof SeriesError) return e; throw e; }
  assert.fail('expected a SeriesError');
}

describe('CSV series parsing', () => {
  it('reads columns by header name, converts Julian years to days, and keeps file lines', () => {
    const csv = '# invented observatory log\nstation,year,flux\nA,2001.5,3.25\n\nB,2002.5,"4.5"\nC,2003.0,1e1\n';
    const s = parseSeriesCsv(csv, spec);
    assert.deepEqual(s.tFile, [2001.5, 2002.5, 2003.0]);
    assert.deepEqual(s.tDays, [2001.5 * 365.25, 2002.5 * 365.25, 2003.0 * 365.25]);
    assert.deepEqual(s.values, [3.25, 4.5, 10]);
    assert.deepEqual(s.lines, [3, 5, 6]);
  });

  it('accepts a byte-order mark, CRLF line ends, semicolons or tabs, and header case differences', () => {
    for (const csv of ['\uFEFFYear;Flux\r\n1;2\r\n2;3\r\n3;5\r\n', 'YEAR\tFLUX\n1\t2\n2\t3\n3\t5\n']) {
      assert.deepEqual(parseSeriesCsv(csv, spec).values, [2, 3, 5]);
    }
  });

  it('keeps times in days and Julian Dates as written', () => {
    const s = parseSeriesCsv('jd,v\n2451545.0,1\n2451546.5,2\n2451548.0,3\n', { timeColumn: 'jd', valueColumn: 'v', timeUnit: 'jd' });
    assert.deepEqual(s.tDays, [2451545.0, 2451546.5, 2451548.0]);
  });

  it('names a missing column with a suggestion and the columns there are', () => {
    const e = seriesError(() => parseSeriesCsv('yaer,flux\n1,2\n2,3\n3,4\n', spec));
    assert.equal(e.message, 'no time column `year` in the header line — did you mean `yaer`? (columns: `yaer`, `flux`)');
    assert.equal(e.column, 'year');
  });

  it('names the line and column of a non-numeric or empty cell', () => {
    const e = seriesError(() => parseSeriesCsv('year,flux\n1,2\n2,n/a\n3,4\n', spec));
    assert.equal(e.message, 'line 3, column `flux`: `n/a` is not a number (write decimals with a point, e.g. 12.5 or 1.2e-3)');
    assert.equal(e.line, 3);
    const empty = seriesError(() => parseSeriesCsv('year,flux\n1,2\n2,3\n,4\n', spec));
    assert.match(empty.message, /^line 4, column `year`: an empty cell is not a number/);
  });

  it('refuses decimal commas, hexadecimal and infinities instead of guessing', () => {
    for (const cell of ['"1,5"', '0x10', 'Infinity', '1.2.3']) {
      const e = seriesError(() => parseSeriesCsv(`year,flux\n1,2\n2,${cell}\n3,4\n`, spec));
      assert.equal(e.line, 3, cell);
    }
  });

  it('names the line of a time that repeats or goes back', () => {
    const dup = seriesError(() => parseSeriesCsv('year,flux\n1,2\n2,3\n2,4\n', spec));
    assert.equal(dup.message, 'line 4, column `year`: repeats the time 2 of line 3; rows must be sorted by strictly increasing time');
    const back = seriesError(() => parseSeriesCsv('year,flux\n1,2\n3,3\n2,4\n', spec));
    assert.match(back.message, /^line 4, column `year`: goes back in time \(2 after 3 on line 3\)/);
  });

  it('says how many rows a series needs when there are too few', () => {
    assert.equal(seriesError(() => parseSeriesCsv('year,flux\n1,2\n2,3\n', spec)).message, 'the file has 2 data rows; a series needs at least 3');
    assert.match(seriesError(() => parseSeriesCsv('', spec)).message, /^the file is empty/);
  });

  it('reports a row with the wrong number of cells and an unclosed quote with their lines', () => {
    assert.equal(seriesError(() => parseSeriesCsv('year,flux\n1,2\n2,3,9\n3,4\n', spec)).message, 'the file is not valid CSV: line 3 has 3 cells but the header line has 2');
    assert.match(seriesError(() => parseSeriesCsv('year,flux\n1,2\n2,"3\n3,4\n', spec)).message, /^the file is not valid CSV: a quoted cell is never closed/);
  });

  it('stops with a limit error past the row limit', () => {
    assert.throws(() => parseSeriesCsv('year,flux\n1,1\n2,2\n3,3\n4,4\n', spec, 3), (e: unknown) => e instanceof LimitError && e.limit === 'max-samples');
  });

  it('computes mean and standard deviation exactly for NIST StRD NumAcc1 (certified mean 10000002, sd 1; from memory)', () => {
    // NIST Statistical Reference Datasets, univariate summary statistics, NumAcc1: 10000001, 10000003, 10000002.
    const s = parseSeriesCsv('year,flux\n1,10000001\n2,10000003\n3,10000002\n', spec);
    const { mean, sd } = meanAndSd(s.values);
    assert.equal(mean, 10000002);
    assert.equal(sd, 1);
  });
});

describe('the series statement', () => {
  const csv = 'year,flux\n' + Array.from({ length: 12 }, (_, i) => `${1990 + i},${(i % 3) + 1}`).join('\n') + '\n';

  it('returns the series in days with its source digest and a result with summary, head table and line plot', async () => {
    const { series, result } = await loadSeries(stmt(), filesContext({ 'data/flux.csv': csv }));
    assert.equal(series.name, 'flux');
    assert.equal(series.tDays.length, 12);
    assert.equal(series.tDays[0], 1990 * 365.25);
    assert.match(series.source, /^data\/flux\.csv \(digest [0-9a-f]{16}\)$/);
    assert.equal(result.summary, '12 samples, t from 1990.0 yr to 2001.0 yr, mean 2.000 ± 0.853 (sd)');
    const table = result.tables[0]!;
    assert.deepEqual(table.columns, ['line', 'year', 'flux']);
    assert.deepEqual(table.rows[0], ['2', '1990.0 yr', '1.00000']);
    assert.deepEqual(table.rows[5], ['…', '7 more rows', '']);
    const plot = result.plots![0]!;
    assert.equal(plot.kind, 'line');
    assert.deepEqual(plot.series[0]!.x.slice(0, 2), [1990, 1991]);
  });

  it('names the installed csv-parse version in its provenance', () => {
    const installed = (JSON.parse(readFileSync(join(__dirname, '../../node_modules/csv-parse/package.json'), 'utf8')) as { version: string }).version;
    assert.equal(CSV_PARSE_VERSION, installed);
  });

  it('passes on the context’s error for a missing file, at the path', async () => {
    await assert.rejects(loadSeries(stmt({ path: 'data/missing.csv' }), filesContext({})),
      (e: unknown) => e instanceof EvalError && e.code === Code.DataFile && e.range === PATH_RANGE && /missing\.csv/.test(e.message));
  });

  it('turns a malformed file into an OB403 naming the file, line and column, at the statement', async () => {
    const bad = 'year,flux\n1990,1\n1991,x\n1992,2\n';
    await assert.rejects(loadSeries(stmt(), filesContext({ 'data/flux.csv': bad })),
      (e: unknown) => e instanceof EvalError && e.code === Code.DataFile && e.range === STMT_RANGE
        && e.message === '"data/flux.csv": line 3, column `flux`: `x` is not a number (write decimals with a point, e.g. 12.5 or 1.2e-3)');
  });

  it('suggests the nearest column name when the value column is misspelt', async () => {
    await assert.rejects(loadSeries(stmt({ valueColumn: 'flx' }), filesContext({ 'data/flux.csv': csv })),
      (e: unknown) => e instanceof EvalError && /did you mean `flux`\?/.test(e.message));
  });

  it('reports a read failure that is not an evaluation error as OB403 at the path', async () => {
    const ctx = { ...filesContext({}), readText: () => Promise.reject(new Error('device not ready')) };
    await assert.rejects(loadSeries(stmt(), ctx),
      (e: unknown) => e instanceof EvalError && e.code === Code.DataFile && e.range === PATH_RANGE && e.message === 'cannot read "data/flux.csv": device not ready');
  });
});
