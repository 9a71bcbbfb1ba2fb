/**
 * Status and progress: a status bar item while evaluations run (click to cancel), and a
 * cancellable progress notification when a run lasts long.
 */
import * as path from 'node:path';
import * as vscode from 'vscode';
import { Commands } from './commandIds.js';
import type { EvaluationService } from './service.js';

/** A run longer than this gets a progress notification with a cancel button. */
const LONG_RUN_MS = 1500;

/** Registers the status bar item and the long-run progress notification. */
export function registerStatus(service: EvaluationService): vscode.Disposable {
  const item = vscode.window.createStatusBarItem('orbitNotes.status', vscode.StatusBarAlignment.Left, 50);
  item.name = 'Orbit Notes';
  item.command = Commands.cancelSearches;
  let longRunTimer: NodeJS.Timeout | undefined;
  let notification: { resolve: () => void; report: (message: string) => void } | undefined;

  const update = (): void => {
    const running = service.views().filter((v) => v.running);
    if (running.length === 0) {
      item.hide();
      clearTimeout(longRunTimer);
      longRunTimer = undefined;
      notification?.resolve();
      notification = undefined;
      return;
    }
    const p = running.find((v) => v.progress)?.progress;
    const names = running.map((v) => path.posix.basename(v.uri.path)).join(', ');
    item.text = p ? `$(sync~spin) Orbit Notes: computing ${p.done + 1}/${p.total}` : '$(sync~spin) Orbit Notes: computing';
    item.tooltip = `Evaluating ${names}. Click to cancel running searches.`;
    item.show();
    notification?.report(p ? `${names}: statement ${p.done + 1} of ${p.total} (line ${p.line + 1})` : names);
    if (!longRunTimer && !notification) {
      longRunTimer = setTimeout(() => {
        longRunTimer = undefined;
        if (!service.busy) return;
        void vscode.window.withProgress(
          { location: vscode.ProgressLocation.Notification, title: 'Orbit Notes', cancellable: true },
          (progress, token) => new Promise<void>((resolve) => {
            token.onCancellationRequested(() => service.cancelAll());
            notification = { resolve, report: (message) => progress.report({ message }) };
          }),
        );
      }, LONG_RUN_MS);
    }
  };

  return vscode.Disposable.from(
    item,
    service.onDidChange(update),
    { dispose: () => { clearTimeout(longRunTimer); notification?.resolve(); } },
  );
}
