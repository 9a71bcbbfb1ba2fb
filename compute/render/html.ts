/**
 * HTML renderings of block results, for the Markdown preview and the standalone export.
 * Every user-supplied string is escaped; nothing here emits script or event handlers.
 */
import type { Diagnostic } from '../../language/diagnostics.js';
import type { StatementResult, Table } from '../result.js';
import { renderSvg } from './svg.js';

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => (c === '&' ? '&amp;' : c === '<' ? '&lt;' : c === '>' ? '&gt;' : c === '"' ? '&quot;' : '&#39;'));
}

/** Longest table shown in the preview; longer ones scroll inside a collapsed details element. */
const OPEN_TABLE_ROWS = 25;

export function tableHtml(t: Table): string {
  const align = (i: number): string => (t.align?.[i] === 'r' ? ' class="num"' : '');
  const head = `<tr>${t.columns.map((c, i) => `<th${align(i)}>${escapeHtml(c)}</th>`).join('')}</tr>`;
  const body = t.rows.map((r) => `<tr>${t.columns.map((_, i) => `<td${align(i)}>${escapeHtml(r[i] ?? '')}</td>`).join('')}</tr>`).join('');
  const table = `<table class="orbit-table"><thead>${head}</thead><tbody>${body}</tbody></table>`;
  const title = t.title ? escapeHtml(t.title) : 'table';
  if (t.rows.length > OPEN_TABLE_ROWS) return `<details class="orbit-long"><summary>${title} (${t.rows.length} rows)</summary>${table}</details>`;
  return t.title ? `<div class="orbit-table-title">${title}</div>${table}` : table;
}

export interface HtmlStatement {
  readonly source: string;
  readonly line: number;
  readonly result?: StatementResult;
  readonly diagnostics: readonly Diagnostic[];
}

export interface HtmlBlockOptions {
  /** A word shown in the block's header: e.g. `live`, `stored region matches`, `stale`. */
  readonly status?: { readonly text: string; readonly kind: 'ok' | 'stale' | 'computing' | 'error' | 'edited' };
  readonly name?: string;
  /** Show plots (off for places that cannot show SVG). */
  readonly plots?: boolean;
}

function diagnosticHtml(d: Diagnostic): string {
  return `<div class="orbit-diag orbit-${d.severity}"><span class="orbit-code">${escapeHtml(d.code)}</span> ${escapeHtml(d.message)}</div>`;
}

/** One statement with its result: the source, the summary, tables, plots, cautions, diagnostics. */
export function statementHtml(s: HtmlStatement, options: HtmlBlockOptions = {}): string {
  const parts: string[] = [`<div class="orbit-stmt" data-orbit-line="${s.line}">`];
  parts.push(`<div class="orbit-head"><code class="orbit-src">${escapeHtml(s.source.trim())}</code>`);
  if (s.result) parts.push(` <span class="orbit-summary">${escapeHtml(s.result.summary)}</span>`);
  parts.push('</div>');
  for (const d of s.diagnostics) parts.push(diagnosticHtml(d));
  if (s.result) {
    for (const t of s.result.tables) parts.push(tableHtml(t));
    if (options.plots !== false) for (const p of s.result.plots ?? []) parts.push(`<figure class="orbit-plot">${renderSvg(p)}</figure>`);
    for (const c of s.result.cautions) parts.push(`<div class="orbit-caution"><strong>Caution.</strong> ${escapeHtml(c)}</div>`);
  }
  parts.push('</div>');
  return parts.join('');
}

/** A whole block: header with name and status, then each statement. */
export function blockHtml(statements: readonly HtmlStatement[], blockDiagnostics: readonly Diagnostic[], options: HtmlBlockOptions = {}): string {
  const status = options.status ? `<span class="orbit-status orbit-status-${options.status.kind}">${escapeHtml(options.status.text)}</span>` : '';
  const name = options.name ? `<span class="orbit-name">${escapeHtml(options.name)}</span>` : '';
  const provenance = new Set<string>();
  for (const s of statements) {
    const p = s.result?.provenance;
    if (!p) continue;
    for (const l of p.libraries) provenance.add(l);
    for (const x of [p.timeScale, p.deltaT, p.frame, p.validity, p.random]) if (x) provenance.add(x);
  }
  const inStatements = new Set(statements.flatMap((s) => s.diagnostics));
  const loose = blockDiagnostics.filter((d) => !inStatements.has(d));
  return [
    '<div class="orbit-block">',
    `<div class="orbit-block-head">${name}${status}</div>`,
    ...loose.map(diagnosticHtml),
    ...statements.map((s) => statementHtml(s, options)),
    provenance.size > 0 ? `<div class="orbit-provenance">${[...provenance].map(escapeHtml).join(' · ')}</div>` : '',
    '</div>',
  ].join('');
}
