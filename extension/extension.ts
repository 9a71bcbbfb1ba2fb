/**
 * Entry point of the Orbit Notes extension: the one place that builds and owns every
 * registration. Feature modules return disposables; all go into `context.subscriptions`.
 */
import * as path from 'node:path';
import type { MarkdownIt } from 'markdown-it';
import * as vscode from 'vscode';
import { registerCodeLenses } from './codeLens.js';
import { Commands } from './commandIds.js';
import { registerCommands } from './commands.js';
import { registerCompletion } from './completion.js';
import { registerDiagnostics } from './diagnostics.js';
import { registerHovers } from './hover.js';
import { registerInlineResults, type InlineText } from './inline.js';
import { createPreviewPlugin, registerPreviewRefresh } from './preview.js';
import { EvaluationService, type NoteView } from './service.js';
import { registerStatus } from './status.js';

export { Commands };

/** What `activate` returns: the Markdown plugin, plus a small surface the host tests use. */
export interface OrbitNotesApi {
  /** The contributed markdown-it plugin (`markdown.markdownItPlugins`). */
  extendMarkdownIt(md: MarkdownIt): MarkdownIt;
  /** Resolves with a note's view once its current text has been evaluated. */
  whenEvaluated(uri: vscode.Uri, timeoutMs?: number): Promise<NoteView>;
  /** Resolves with a note's view after the next evaluation applied from now on. */
  nextEvaluation(uri: vscode.Uri, timeoutMs?: number): Promise<NoteView>;
  /** Fires on every change of a note's view: edits, progress, applied results. */
  readonly onDidChangeView: vscode.Event<NoteView>;
  /** The inline texts shown for a document (decorations cannot be read back otherwise). */
  inlineTexts(doc: vscode.TextDocument): InlineText[];
}

/**
 * Called by VS Code on the first Markdown document or preview. Failures are logged to
 * the "Orbit Notes" output channel and shown, never swallowed.
 */
export function activate(context: vscode.ExtensionContext): OrbitNotesApi {
  const output = vscode.window.createOutputChannel('Orbit Notes');
  context.subscriptions.push(output);
  const fallback: OrbitNotesApi = {
    extendMarkdownIt: (md) => md,
    whenEvaluated: () => Promise.reject(new Error('Orbit Notes did not start; see its output channel')),
    nextEvaluation: () => Promise.reject(new Error('Orbit Notes did not start; see its output channel')),
    onDidChangeView: () => ({ dispose: () => undefined }),
    inlineTexts: () => [],
  };
  try {
    const service = new EvaluationService(path.join(context.extensionPath, 'dist', 'worker.js'), output);
    const inline = registerInlineResults(service);
    context.subscriptions.push(
      service,
      inline,
      registerDiagnostics(service),
      registerHovers(service),
      registerCompletion(),
      registerCodeLenses(service),
      registerCommands(service, output),
      registerPreviewRefresh(service),
      registerStatus(service),
    );
    output.appendLine(`Orbit Notes ${String(context.extension.packageJSON['version'] ?? '')} activated (workspace ${vscode.workspace.isTrusted ? 'trusted' : 'in Restricted Mode: data files are not read'})`);
    return {
      extendMarkdownIt: createPreviewPlugin(service),
      whenEvaluated: (uri, timeoutMs) => service.whenEvaluated(uri, timeoutMs),
      nextEvaluation: (uri, timeoutMs) => service.nextEvaluation(uri, timeoutMs),
      onDidChangeView: service.onDidChange,
      inlineTexts: (doc) => inline.describe(doc),
    };
  } catch (err) {
    const message = err instanceof Error ? err.stack ?? err.message : String(err);
    output.appendLine(`activation failed: ${message}`);
    // The show-output command still works, so the user can read why.
    context.subscriptions.push(vscode.commands.registerCommand(Commands.showOutput, () => output.show(true)));
    void vscode.window.showErrorMessage(`Orbit Notes failed to start: ${err instanceof Error ? err.message : String(err)}`, 'Show Output')
      .then((choice) => { if (choice) output.show(true); });
    return fallback;
  }
}

/** Nothing to do: every registration is disposed through `context.subscriptions`. */
export function deactivate(): void {}
