/**
 * The command registry: every command of `Commands` gets its handler here, and nowhere
 * else. Handlers return a value for callers (tests, other extensions) and report to the
 * user through messages and the output channel.
 */
import * as path from 'node:path';
import * as vscode from 'vscode';
import type { RegionStatus } from '../compute/writeback.js';
import { Commands, type CommandId } from './commandIds.js';
import { hasOrbitFence, isNoteDocument, type EvaluationService } from './service.js';
import { checkNote, writeNote, type WriteOutcome } from './writeback.js';

/** Notes the workspace command looks at (generated and dependency folders are skipped). */
const NOTE_GLOB = '**/*.md';
const NOTE_EXCLUDE = '{**/node_modules/**,**/.git/**,**/.cache/**,**/dist/**,**/out/**}';

/** Registers every command of {@link Commands}; the returned disposable unregisters them all. */
export function registerCommands(service: EvaluationService, output: vscode.OutputChannel): vscode.Disposable {
  const handlers: Readonly<Record<CommandId, (...args: unknown[]) => unknown>> = {
    [Commands.writeResults]: async (uri?: unknown) => {
      const doc = await noteFor(uri);
      if (!doc) return undefined;
      const outcome = await writeNote(service, doc);
      report([outcome], output);
      return outcome;
    },
    [Commands.writeBlockResults]: async (uri?: unknown, blockIndex?: unknown) => {
      const doc = await noteFor(uri);
      if (!doc || typeof blockIndex !== 'number') return undefined;
      const outcome = await writeNote(service, doc, { blockIndex });
      report([outcome], output);
      return outcome;
    },
    [Commands.writeWorkspaceResults]: async () => {
      const uris = await vscode.workspace.findFiles(NOTE_GLOB, NOTE_EXCLUDE);
      const outcomes: WriteOutcome[] = [];
      await vscode.window.withProgress({ location: vscode.ProgressLocation.Notification, title: 'Orbit Notes: writing results', cancellable: true }, async (progress, token) => {
        for (const uri of uris.sort((a, b) => a.path.localeCompare(b.path))) {
          if (token.isCancellationRequested) break;
          progress.report({ message: path.posix.basename(uri.path), increment: 100 / uris.length });
          const doc = await vscode.workspace.openTextDocument(uri);
          if (!hasOrbitFence(doc.getText())) continue;
          const wasDirty = doc.isDirty;
          const outcome = await writeNote(service, doc);
          outcomes.push(outcome);
          // Notes the user was not editing are saved, as the command line would write them.
          if (outcome.written > 0 && !wasDirty) await doc.save();
        }
      });
      report(outcomes, output);
      return outcomes;
    },
    [Commands.checkNote]: async (uri?: unknown) => {
      const doc = await noteFor(uri);
      if (!doc) return undefined;
      const statuses = await checkNote(service, doc);
      if (!statuses) {
        void vscode.window.showWarningMessage('Orbit Notes: the note changed during the check; run it again.');
        return undefined;
      }
      reportCheck(doc, statuses, output);
      return statuses;
    },
    [Commands.cancelSearches]: () => {
      const n = service.cancelAll();
      output.appendLine(n > 0 ? `cancelled ${n} running evaluation(s)` : 'nothing to cancel');
      return n;
    },
    [Commands.showOutput]: () => output.show(true),
  };
  return vscode.Disposable.from(...Object.entries(handlers).map(([id, h]) => vscode.commands.registerCommand(id, h)));
}

/** The note a command acts on: the URI given, else the active editor's Markdown document. */
async function noteFor(uri: unknown): Promise<vscode.TextDocument | undefined> {
  if (uri instanceof vscode.Uri) return vscode.workspace.openTextDocument(uri);
  const doc = vscode.window.activeTextEditor?.document;
  if (doc && isNoteDocument(doc)) return doc;
  void vscode.window.showInformationMessage('Orbit Notes: open a Markdown note first.');
  return undefined;
}

function report(outcomes: readonly WriteOutcome[], output: vscode.OutputChannel): void {
  const written = outcomes.reduce((n, o) => n + o.written, 0);
  const skipped = outcomes.flatMap((o) => o.skipped);
  const gaveUp = outcomes.filter((o) => o.gaveUp);
  for (const o of outcomes) if (o.written > 0) output.appendLine(`wrote ${o.written} region(s) in ${o.uri.fsPath || o.uri.toString()}`);
  for (const s of skipped) output.appendLine(`left alone: ${s.message}`);
  for (const o of gaveUp) output.appendLine(`not written, the note kept changing: ${o.uri.toString()}`);
  const parts = [`${written} result region(s) written`];
  if (skipped.length > 0) parts.push(`${skipped.length} left alone (see Output)`);
  if (gaveUp.length > 0) parts.push(`${gaveUp.length} note(s) kept changing and were not written`);
  const message = `Orbit Notes: ${parts.join('; ')}.`;
  if (skipped.length > 0 || gaveUp.length > 0) void vscode.window.showWarningMessage(message);
  else void vscode.window.showInformationMessage(message);
}

function reportCheck(doc: vscode.TextDocument, statuses: readonly RegionStatus[], output: vscode.OutputChannel): void {
  const off = statuses.filter((s) => s.state !== 'current');
  output.appendLine(`check ${doc.uri.fsPath || doc.uri.toString()}:`);
  for (const s of statuses) output.appendLine(`  ${s.state}: ${s.message}`);
  if (off.length === 0) {
    void vscode.window.showInformationMessage(`Orbit Notes: all ${statuses.length} result region(s) match their blocks.`);
  } else {
    void vscode.window.showWarningMessage(`Orbit Notes: ${off.length} of ${statuses.length} result region(s) need attention: ${off.map((s) => s.state).join(', ')} (details in Output).`);
  }
}
