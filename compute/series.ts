/**
 * Time series from CSV text: columns chosen by header name, times converted to days,
 * every problem reported with its line and column so the user can fix the file.
 *
 * Parsing is done by the `csv-parse` package (RFC 4180 quoting, BOM, CRLF); this module only
 * interprets the cells. Pure: the text comes in, nothing is read here.
 */
import { parse } from 'csv-parse/sync';
import { editDistance } from '../language/diagnostics.js';
import { JULIAN_YEAR_DAYS } from './quantity.js';
import { LimitError } from './limits.js';

export type TimeUnit = 'yr' | 'd' | 'jd';

/** Fewest rows a series may have: below three there is no spread to speak of. */
export const MIN_SERIES_ROWS = 3;

/** Most data rows one series may have (bounds memory and the periodogram's cost). */
export const MAX_SERIES_ROWS = 1_000_000;

/** What went wrong in a CSV file, with where. */
export class SeriesError extends Error {
  /**
   * @param line 1-based line in the file, when the problem is on one line
   * @param column header name of the column, when it concerns one
   */
  constructor(message: string, readonly line?: number, readonly column?: string) {
    super(message);
    this.name = 'SeriesError';
  }
}

export interface SeriesSpec {
  readonly timeColumn: string;
  readonly valueColumn: string;
  readonly timeUnit: TimeUnit;
}

export interface ParsedSeries {
  /** Times converted to days: `yr` × 365.25 (Julian year), `d` and `jd` as they are. */
  readonly tDays: number[];
  /** Times as written in the file's unit. */
  readonly tFile: number[];
  readonly values: number[];
  /** 1-based file line of each sample. */
  readonly lines: number[];
  /** Header names as written (trimmed). */
  readonly header: string[];
  readonly delimiter: string;
}

const DECIMAL = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/** The delimiter: comma unless the header line has none and has semicolons or tabs. */
function detectDelimiter(text: string): string {
  const firstLine = text.replace(/^\uFEFF/, '').split(/\r?\n/).find((l) => l.trim() !== '' && !l.trimStart().startsWith('#')) ?? '';
  if (firstLine.includes(',')) return ',';
  if (firstLine.includes('\t')) return '\t';
  if (firstLine.includes(';')) return ';';
  return ',';
}

function findColumn(header: readonly string[], wanted: string, role: 'time' | 'value'): number {
  let idx = header.indexOf(wanted);
  if (idx < 0) idx = header.findIndex((h) => h.toLowerCase() === wanted.toLowerCase());
  if (idx >= 0) return idx;
  // Header names are often transposed or abbreviated: allow two edits (more for long names).
  const limit = Math.max(2, Math.floor(wanted.length / 3));
  let hint: string | undefined;
  let best = Infinity;
  for (const h of header) {
    const d = editDistance(wanted.toLowerCase(), h.toLowerCase());
    if (d <= limit && d < best) { best = d; hint = h; }
  }
  const list = header.map((h) => `\`${h}\``).join(', ');
  throw new SeriesError(`no ${role} column \`${wanted}\` in the header line${hint ? ` — did you mean \`${hint}\`?` : ''} (columns: ${list})`, 1, wanted);
}

function describeCell(cell: string): string {
  return cell === '' ? 'an empty cell' : `\`${cell.length > 24 ? `${cell.slice(0, 24)}…` : cell}\``;
}

/**
 * Parse CSV text into a series. The first non-comment line is the header; `#` starts a comment
 * line; blank lines are skipped; cells are trimmed. Times must increase strictly.
 * @throws SeriesError naming the line and column for a malformed file, a missing column (with a
 *   "did you mean"), a non-numeric cell, a time not after the one before it, or fewer than
 *   {@link MIN_SERIES_ROWS} rows; LimitError past {@link MAX_SERIES_ROWS} rows.
 */
export function parseSeriesCsv(text: string, spec: SeriesSpec, maxRows = MAX_SERIES_ROWS): ParsedSeries {
  const delimiter = detectDelimiter(text);
  let records: Array<{ record: string[]; info: { lines: number } }>;
  try {
    records = parse(text, {
      delimiter, bom: true, comment: '#', skip_empty_lines: true, trim: true, info: true,
      relax_column_count: false,
    }) as unknown as Array<{ record: string[]; info: { lines: number } }>;
  } catch (e) {
    const err = e as { message?: string; lines?: number };
    const line = typeof err.lines === 'number' ? err.lines : undefined;
    // csv-parse messages start with an error code in brackets; keep the readable part.
    const raw = String(err.message ?? e);
    const counts = /expect (\d+), got (\d+)/.exec(raw);
    const why = counts ? `line ${line ?? '?'} has ${counts[2]} cells but the header line has ${counts[1]}`
      : raw.startsWith('Quote Not Closed') ? `a quoted cell is never closed: a " opens it and the file ends${line !== undefined ? ` at line ${line}` : ''} without the closing "`
      : `${raw}${line !== undefined && !raw.includes('line') ? ` (line ${line})` : ''}`;
    throw new SeriesError(`the file is not valid CSV: ${why}`, line);
  }
  const head = records[0];
  if (!head) throw new SeriesError('the file is empty: expected a header line naming the columns, then one row per sample');
  const header = head.record.map((h) => h.trim());
  const ti = findColumn(header, spec.timeColumn, 'time');
  const vi = findColumn(header, spec.valueColumn, 'value');
  const rows = records.length - 1;
  if (rows > maxRows) {
    throw new LimitError(`the file has ${rows} rows, more than the limit of ${maxRows}`, 'max-samples',
      'thin or split the file (the limit bounds memory and periodogram time)');
  }
  const tFile: number[] = [];
  const values: number[] = [];
  const lines: number[] = [];
  const cellNumber = (cell: string, line: number, column: string): number => {
    const x = DECIMAL.test(cell) ? Number(cell) : NaN;
    if (!Number.isFinite(x)) {
      throw new SeriesError(`line ${line}, column \`${column}\`: ${describeCell(cell)} is not a number (write decimals with a point, e.g. 12.5 or 1.2e-3)`, line, column);
    }
    return x;
  };
  for (let r = 1; r < records.length; r++) {
    const { record, info } = records[r]!;
    const line = info.lines;
    const t = cellNumber(record[ti] ?? '', line, header[ti]!);
    const v = cellNumber(record[vi] ?? '', line, header[vi]!);
    const prev = tFile[tFile.length - 1];
    if (prev !== undefined && !(t > prev)) {
      const what = t === prev ? `repeats the time ${t} of line ${lines[lines.length - 1]}` : `goes back in time (${t} after ${prev} on line ${lines[lines.length - 1]})`;
      throw new SeriesError(`line ${line}, column \`${header[ti]}\`: ${what}; rows must be sorted by strictly increasing time`, line, header[ti]);
    }
    tFile.push(t);
    values.push(v);
    lines.push(line);
  }
  if (tFile.length < MIN_SERIES_ROWS) {
    throw new SeriesError(`the file has ${tFile.length} data row${tFile.length === 1 ? '' : 's'}; a series needs at least ${MIN_SERIES_ROWS}`);
  }
  const factor = spec.timeUnit === 'yr' ? JULIAN_YEAR_DAYS : 1;
  return { tDays: tFile.map((t) => t * factor), tFile, values, lines, header, delimiter };
}

/** Mean and sample standard deviation (n − 1), two-pass for accuracy (common practice). */
export function meanAndSd(values: readonly number[]): { mean: number; sd: number } {
  const n = values.length;
  if (n === 0) return { mean: NaN, sd: NaN };
  let sum = 0;
  for (const v of values) sum += v;
  const mean = sum / n;
  let ss = 0;
  for (const v of values) ss += (v - mean) * (v - mean);
  return { mean, sd: n > 1 ? Math.sqrt(ss / (n - 1)) : 0 };
}
