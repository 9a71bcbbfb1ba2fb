/**
 * Hovers inside `orbit` blocks. On a statement: its full result — summary, details
 * (formula, inputs, method), tables, uncertainty, provenance (libraries, time scale,
 * ΔT, frame, ephemeris validity), cautions and diagnostics. On a name used in a
 * statement: where it is defined and its value. All user text is escaped; the hover's
 * Markdown is untrusted and carries no HTML.
 */
import * as vscode from 'vscode';
import type { StatementEvaluation } from '../compute/note.js';
import { codeSpan, escapeMarkdown, markdownTable } from '../compute/render/markdown.js';
import type { StatementResult } from '../compute/result.js';
import { placedStatements, statementAt, type PlacedStatement } from './adapter.js';
import type { EvaluationService } from './service.js';

/** Longest table in a hover; the preview and the written region show more. */
const HOVER_TABLE_ROWS = 12;
const NAME_RE = /[A-Za-z_][A-Za-z0-9_-]*/;

/** Registers hovers for Markdown documents; they answer only on evaluated statements. */
export function registerHovers(service: EvaluationService): vscode.Disposable {
  return vscode.languages.registerHoverProvider({ language: 'markdown' }, {
    provideHover(doc, position) {
      const view = service.view(doc.uri);
      if (!view?.evaluation) return undefined;
      const here = statementAt(view, position.line);
      if (!here) return undefined;
      const wordRange = doc.getWordRangeAtPosition(position, NAME_RE);
      if (wordRange) {
        const word = doc.getText(wordRange);
        const definition = definitionOf(placedStatements(view), word);
        if (definition && definition.evaluation !== here.evaluation) {
          return new vscode.Hover(nameHover(word, definition, view.stale), wordRange);
        }
      }
      return new vscode.Hover(statementHover(here.evaluation, view.stale), new vscode.Range(here.startLine, 0, here.endLine, doc.lineAt(here.endLine).text.length));
    },
  });
}

/** The statement that defines `name` (`let`, `body`, `series`). */
function definitionOf(statements: readonly PlacedStatement[], name: string): PlacedStatement | undefined {
  return statements.find((p) => {
    const s = p.evaluation.statement;
    return (s.kind === 'let' || s.kind === 'body' || s.kind === 'series') && s.name.name === name;
  });
}

function untrusted(): vscode.MarkdownString {
  const md = new vscode.MarkdownString('', false);
  md.isTrusted = false;
  md.supportHtml = false;
  return md;
}

function nameHover(name: string, def: PlacedStatement, stale: boolean): vscode.MarkdownString {
  const md = untrusted();
  md.appendMarkdown(`**${escapeMarkdown(name)}** — defined on line ${def.startLine + 1}\n\n`);
  md.appendCodeblock(def.evaluation.source.trim(), 'orbit');
  const r = def.evaluation.result;
  if (r) {
    md.appendMarkdown(`\n${escapeMarkdown(r.summary)}`);
    if (r.value) md.appendMarkdown(`\n\nvalue: ${escapeMarkdown(quantityText(r.value))}`);
  } else {
    md.appendMarkdown('\n\nnot computed: ' + def.evaluation.diagnostics.map((d) => `${d.code} ${escapeMarkdown(d.message)}`).join('; '));
  }
  if (stale) md.appendMarkdown('\n\n*(edited since this was computed)*');
  return md;
}

function statementHover(s: StatementEvaluation, stale: boolean): vscode.MarkdownString {
  const md = untrusted();
  const r = s.result;
  md.appendMarkdown(`${codeSpan(s.source)}${r ? ` → **${escapeMarkdown(r.summary)}**` : ''}\n\n`);
  if (r) appendResult(md, r);
  if (s.diagnostics.length > 0) {
    md.appendMarkdown('\n\n' + s.diagnostics.map((d) => `- ${d.severity} ${d.code}: ${escapeMarkdown(d.message)}`).join('\n'));
  }
  if (stale) md.appendMarkdown('\n\n*(the note was edited since this was computed; new results follow shortly)*');
  if (s.reused) md.appendMarkdown('\n\n*(from the cache: its inputs did not change)*');
  return md;
}

function appendResult(md: vscode.MarkdownString, r: StatementResult): void {
  for (const line of r.details) md.appendMarkdown(`${escapeMarkdown(line)}\n\n`);
  if (r.value) md.appendMarkdown(`Value: ${escapeMarkdown(quantityText(r.value))}\n\n`);
  for (const t of r.tables) md.appendMarkdown(`${markdownTable(t, HOVER_TABLE_ROWS)}\n\n`);
  if (r.events && r.events.length > 0 && r.tables.length === 0) md.appendMarkdown(`${r.events.length} event(s)\n\n`);
  const p = r.provenance;
  const provenance = [
    ...p.libraries.map((l) => `library: ${l}`),
    ...(p.timeScale ? [`time scale: ${p.timeScale}`] : []),
    ...(p.deltaT ? [`ΔT: ${p.deltaT}`] : []),
    ...(p.frame ? [`frame: ${p.frame}`] : []),
    ...(p.validity ? [`validity: ${p.validity}`] : []),
    ...(p.random ? [`random: ${p.random}`] : []),
  ];
  if (provenance.length > 0) md.appendMarkdown(`**Provenance**\n\n${provenance.map((x) => `- ${escapeMarkdown(x)}`).join('\n')}\n\n`);
  for (const w of r.warnings ?? []) md.appendMarkdown(`- warning ${escapeMarkdown(w.code)}: ${escapeMarkdown(w.message)}\n`);
  for (const c of r.cautions) md.appendMarkdown(`\n**Caution.** ${escapeMarkdown(c)}\n`);
}

function quantityText(v: { readonly number: number; readonly unit: string; readonly uncertainty: number }): string {
  return v.uncertainty > 0 ? `${v.number} ${v.unit} ± ${v.uncertainty} ${v.unit} (standard uncertainty)` : `${v.number} ${v.unit} (exact)`;
}
