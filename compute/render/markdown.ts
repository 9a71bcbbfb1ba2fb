/**
 * Plain-Markdown renderings of results: the body of a written-back region and the
 * tables shared with the CLI. Output is deterministic (no clocks, no paths) so that a
 * rerun reproduces it byte for byte, and every user-supplied string is escaped.
 */
import type { Diagnostic } from '../../language/diagnostics.js';
import type { StatementResult, Table } from '../result.js';

/** The smallest shape of a block evaluation the renderer needs (avoids an import cycle). */
export interface RenderableBlock {
  readonly statements: ReadonlyArray<{ readonly source: string; readonly result?: StatementResult; readonly diagnostics: readonly Diagnostic[] }>;
  readonly diagnostics: readonly Diagnostic[];
}

/** Longest table written into a note; longer ones keep their head and tail. */
export const MAX_REGION_ROWS = 40;

/** Escape text for a Markdown paragraph or table cell, inert in HTML too. */
export function escapeMarkdown(text: string): string {
  return text
    .replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;')
    .replace(/\\/g, '\\\\').replace(/([`*_[\]|#~])/g, '\\$1')
    .replace(/\r?\n/g, ' ');
}

/** A code span that survives backticks inside the text (CommonMark 6.1). */
export function codeSpan(text: string): string {
  const oneLine = text.replace(/\s*\r?\n\s*/g, ' ').trim();
  let longest = 0;
  for (const m of oneLine.matchAll(/`+/g)) longest = Math.max(longest, m[0].length);
  const fence = '`'.repeat(longest + 1);
  const pad = oneLine.startsWith('`') || oneLine.endsWith('`') ? ' ' : '';
  return `${fence}${pad}${oneLine}${pad}${fence}`;
}

/** A GFM table; long tables keep their first and last rows with a marker between. */
export function markdownTable(t: Table, maxRows = MAX_REGION_ROWS): string {
  const align = t.columns.map((_, i) => (t.align?.[i] === 'r' ? '---:' : ':---'));
  const cell = (s: string): string => escapeMarkdown(s) || ' ';
  const out: string[] = [];
  if (t.title) out.push(`*${escapeMarkdown(t.title)}*`, '');
  out.push(`| ${t.columns.map(cell).join(' | ')} |`, `| ${align.join(' | ')} |`);
  let rows = t.rows;
  let omitted = 0;
  if (rows.length > maxRows) {
    const head = Math.ceil(maxRows / 2);
    const tail = maxRows - head;
    omitted = rows.length - maxRows;
    rows = [...rows.slice(0, head), t.columns.map((_, i) => (i === 0 ? `… ${omitted} more rows …` : '')), ...rows.slice(rows.length - tail)];
  }
  for (const r of rows) out.push(`| ${t.columns.map((_, i) => cell(r[i] ?? '')).join(' | ')} |`);
  if (omitted > 0) out.push('', `*${omitted} rows not shown here; \`orbit-notes run --json\` prints them all.*`);
  return out.join('\n');
}

/**
 * A diagnostic as written into a region: without line numbers, which would change
 * whenever a region above grows and so make writing results never settle.
 */
function regionDiagnostic(d: Diagnostic): string {
  const message = d.message.replace(/ \((?:first )?on line \d+\)/g, '').replace(/ on line \d+/g, ' above');
  return `${severityMark(d)} ${d.code}: ${escapeMarkdown(message)}`;
}

function severityMark(d: Diagnostic): string {
  return d.severity === 'error' ? 'error' : d.severity === 'warning' ? 'warning' : 'note';
}

/** The region body for a block: one entry per statement, tables, cautions, provenance. */
export function renderRegionBody(block: RenderableBlock, settings: { readonly calendar: string; readonly seed: number }): string {
  const parts: string[] = [];
  const provenance = new Set<string>();
  const cautions = new Set<string>();
  const statementDiagnostics = new Set<Diagnostic>();
  for (const s of block.statements) {
    for (const d of s.diagnostics) statementDiagnostics.add(d);
    const head = codeSpan(s.source);
    if (s.result) {
      parts.push(`- ${head} → ${escapeMarkdown(s.result.summary)}`);
      for (const t of s.result.tables) parts.push('', indent(markdownTable(t)));
      for (const c of s.result.cautions) cautions.add(c);
      const p = s.result.provenance;
      for (const l of p.libraries) provenance.add(l);
      for (const extra of [p.timeScale, p.deltaT, p.frame, p.validity, p.random]) if (extra) provenance.add(extra);
    } else if (s.diagnostics.length === 0) {
      parts.push(`- ${head}`);
    } else {
      parts.push(`- ${head} → not computed`);
    }
    for (const d of s.diagnostics) parts.push(`  - ${regionDiagnostic(d)}`);
  }
  const loose = block.diagnostics.filter((d) => !statementDiagnostics.has(d));
  for (const d of loose) parts.push(`- ${regionDiagnostic(d)}`);
  if (cautions.size > 0) {
    parts.push('');
    for (const c of cautions) parts.push(`> **Caution.** ${escapeMarkdown(c)}`, '>');
    parts.pop();
  }
  const settingsLine = `calendar ${settings.calendar === 'gregorian' ? 'proleptic Gregorian' : 'Julian before 1582-10-15, Gregorian after'}; seed ${settings.seed}`;
  parts.push('', `<sub>${[...provenance, settingsLine].map(escapeMarkdown).join(' · ')}</sub>`);
  return parts.join('\n');
}

function indent(text: string): string {
  return text.split('\n').map((l) => (l === '' ? '' : `  ${l}`)).join('\n');
}
