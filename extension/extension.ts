/**
 * Entry point of the Orbit Notes extension: the one place that builds and owns every
 * registration. Feature modules return disposables; all go into `context.subscriptions`.
 */
import * as vscode from 'vscode';

/** Command identifiers, all under the `orbitNotes.` prefix and listed in package.json. */
export const Commands = {
  showOutput: 'orbitNotes.showOutput',
} as const;

/** What `activate` returns: used by the host tests through `extension.exports`. */
export interface OrbitNotesApi {
  readonly output: vscode.OutputChannel;
  /** The contributed markdown-it plugin (`markdown.markdownItPlugins`). */
  extendMarkdownIt<T>(md: T): T;
}

/**
 * Called by VS Code on the first Markdown document or preview. Failures are logged to
 * the "Orbit Notes" output channel and shown, never swallowed.
 */
export function activate(context: vscode.ExtensionContext): OrbitNotesApi {
  const output = vscode.window.createOutputChannel('Orbit Notes');
  context.subscriptions.push(output);
  try {
    context.subscriptions.push(
      vscode.commands.registerCommand(Commands.showOutput, () => output.show(true)),
    );
    output.appendLine(`Orbit Notes ${String(context.extension.packageJSON['version'] ?? '')} activated`);
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    output.appendLine(`activation failed: ${message}`);
    void vscode.window.showErrorMessage(`Orbit Notes failed to start: ${message}`);
  }
  return {
    output,
    extendMarkdownIt: (md) => md,
  };
}

/** Nothing to do: every registration is disposed through `context.subscriptions`. */
export function deactivate(): void {}
