/**
 * The one adapter between the core's plain data and the editor's types: ranges,
 * diagnostics, and lookups of blocks and statements in a note's view (through the line
 * tracker, so stale results still find their lines).
 */
import * as vscode from 'vscode';
import type { Range as CoreRange } from '../language/ast.js';
import type { Diagnostic as CoreDiagnostic, Severity } from '../language/diagnostics.js';
import type { BlockEvaluation, StatementEvaluation } from '../compute/note.js';
import type { NoteView } from './service.js';

/** Diagnostics' `source`, as shown in the Problems panel. */
export const DIAGNOSTIC_SOURCE = 'orbit-notes';

/** A core range (0-based line, UTF-16 character) as an editor range; the two use the same coordinates. */
export function toRange(r: CoreRange): vscode.Range {
  return new vscode.Range(r.start.line, r.start.character, r.end.line, r.end.character);
}

const SEVERITY: Readonly<Record<Severity, vscode.DiagnosticSeverity>> = {
  error: vscode.DiagnosticSeverity.Error,
  warning: vscode.DiagnosticSeverity.Warning,
  information: vscode.DiagnosticSeverity.Information,
};

/** A core diagnostic as an editor one: same range and message, the stable code, source `orbit-notes`. */
export function toDiagnostic(d: CoreDiagnostic): vscode.Diagnostic {
  const out = new vscode.Diagnostic(toRange(d.range), d.message, SEVERITY[d.severity]);
  out.code = d.code;
  out.source = DIAGNOSTIC_SOURCE;
  return out;
}

/** A statement of the view with its current lines (after edits since it was evaluated). */
export interface PlacedStatement {
  readonly evaluation: StatementEvaluation;
  readonly block: BlockEvaluation;
  readonly startLine: number;
  readonly endLine: number;
}

/** Every statement whose lines survive the edits since evaluation, in document order. */
export function placedStatements(view: NoteView): PlacedStatement[] {
  const out: PlacedStatement[] = [];
  for (const block of view.evaluation?.blocks ?? []) {
    for (const s of block.statements) {
      const startLine = view.tracker.map(s.statement.range.start.line);
      const endLine = view.tracker.map(s.statement.range.end.line);
      if (startLine === undefined || endLine === undefined) continue;
      out.push({ evaluation: s, block, startLine, endLine });
    }
  }
  return out;
}

/** The statement covering a current line, if any. */
export function statementAt(view: NoteView, line: number): PlacedStatement | undefined {
  return placedStatements(view).find((p) => p.startLine <= line && line <= p.endLine);
}

/** The current line of a block's opening fence, or undefined when it was edited. */
export function fenceLineOf(view: NoteView, block: BlockEvaluation): number | undefined {
  return view.tracker.map(block.block.fenceLine);
}
