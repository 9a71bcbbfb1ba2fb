/**
 * Inline results: each statement's one-line summary after its last line, in theme
 * colours. States: fresh, stale (edited since; dimmed and marked), computing (the
 * statement in work), and failed (the first error's code). `orbitNotes.inline.enabled`
 * switches them off.
 */
import * as vscode from 'vscode';
import { placedStatements, type PlacedStatement } from './adapter.js';
import type { EvaluationService, NoteView } from './service.js';
import { readSettings } from './settings.js';

/** Longest inline text; the hover has the rest. */
const MAX_INLINE_CHARS = 120;

/** One inline text as shown (for the host tests: decorations cannot be read back through the API). */
export interface InlineText {
  readonly kind: 'fresh' | 'stale' | 'computing' | 'failed';
  readonly line: number;
  readonly text: string;
}

/** The inline results feature: a disposable that can also describe what it shows. */
export interface InlineResults extends vscode.Disposable {
  /** The inline texts of a document as last computed for its view. */
  describe(doc: vscode.TextDocument): InlineText[];
}

/** Registers the decoration types and keeps visible editors decorated as views change. */
export function registerInlineResults(service: EvaluationService): InlineResults {
  const after = (color: string, fontStyle = 'normal'): vscode.DecorationRenderOptions => ({
    after: { color: new vscode.ThemeColor(color), margin: '0 0 0 2em', fontStyle },
    rangeBehavior: vscode.DecorationRangeBehavior.ClosedClosed,
  });
  const types = {
    fresh: vscode.window.createTextEditorDecorationType(after('orbitNotes.inlineResultForeground')),
    stale: vscode.window.createTextEditorDecorationType(after('orbitNotes.inlineStaleForeground', 'italic')),
    computing: vscode.window.createTextEditorDecorationType(after('orbitNotes.inlineStaleForeground', 'italic')),
    failed: vscode.window.createTextEditorDecorationType(after('orbitNotes.inlineErrorForeground')),
  };

  const describe = (doc: vscode.TextDocument): InlineText[] => {
    const view = service.view(doc.uri);
    const out: InlineText[] = [];
    if (!view || !readSettings(doc.uri).inlineEnabled) return out;
    // The statement in work (its line is in the text being evaluated, i.e. the current one).
    const inWork = view.running ? view.progress?.line : undefined;
    let computingShown = false;
    for (const p of placedStatements(view)) {
      if (p.endLine >= doc.lineCount) continue;
      if (inWork !== undefined && p.startLine <= inWork && inWork <= p.endLine) {
        out.push({ kind: 'computing', line: p.endLine, text: '⋯ computing' });
        computingShown = true;
        continue;
      }
      const d = inlineTextOf(view, p);
      if (d) out.push(d);
    }
    if (inWork !== undefined && !computingShown && inWork < doc.lineCount) out.push({ kind: 'computing', line: inWork, text: '⋯ computing' });
    return out;
  };

  const render = (editor: vscode.TextEditor): void => {
    const buckets: Record<keyof typeof types, vscode.DecorationOptions[]> = { fresh: [], stale: [], computing: [], failed: [] };
    for (const t of describe(editor.document)) {
      const end = editor.document.lineAt(t.line).range.end;
      buckets[t.kind].push({ range: new vscode.Range(end, end), renderOptions: { after: { contentText: t.text } } });
    }
    for (const [k, t] of Object.entries(types) as Array<[keyof typeof types, vscode.TextEditorDecorationType]>) editor.setDecorations(t, buckets[k]);
  };
  const renderFor = (uri: vscode.Uri): void => {
    for (const e of vscode.window.visibleTextEditors) if (e.document.uri.toString() === uri.toString()) render(e);
  };

  for (const e of vscode.window.visibleTextEditors) render(e);
  const disposable = vscode.Disposable.from(
    ...Object.values(types),
    service.onDidChange((v) => renderFor(v.uri)),
    vscode.window.onDidChangeVisibleTextEditors((es) => es.forEach(render)),
    vscode.workspace.onDidChangeConfiguration((e) => {
      if (e.affectsConfiguration('orbitNotes.inline')) vscode.window.visibleTextEditors.forEach(render);
    }),
  );
  return { describe, dispose: () => disposable.dispose() };
}

function inlineTextOf(view: NoteView, p: PlacedStatement): InlineText | undefined {
  const s = p.evaluation;
  if (s.result) {
    const text = truncate(`= ${s.result.summary}`);
    return { kind: view.stale ? 'stale' : 'fresh', line: p.endLine, text: view.stale ? `◌ ${text}` : text };
  }
  const firstError = s.diagnostics.find((d) => d.severity === 'error') ?? s.diagnostics[0];
  if (!firstError) return undefined;
  return { kind: view.stale ? 'stale' : 'failed', line: p.endLine, text: truncate(`✗ ${firstError.code} ${firstError.message}`) };
}

function truncate(text: string): string {
  const oneLine = text.replace(/\s+/g, ' ');
  return oneLine.length > MAX_INLINE_CHARS ? `${oneLine.slice(0, MAX_INLINE_CHARS - 1)}…` : oneLine;
}
