/**
 * A lens above each `orbit` block: its state (computing, problems, whether the stored
 * results match) and a command writing that block's results.
 */
import * as vscode from 'vscode';
import { regionStatuses, type RegionState } from '../compute/writeback.js';
import { fenceLineOf } from './adapter.js';
import { Commands } from './commandIds.js';
import type { EvaluationService } from './service.js';

const STATE_TEXT: Readonly<Record<RegionState, string>> = {
  current: '$(check) results written and current',
  missing: '$(circle-outline) results not written yet',
  stale: '$(history) written results out of date',
  edited: '$(warning) written results edited by hand',
  damaged: '$(warning) results region damaged',
  unclosed: '$(error) fence not closed',
};

/** Registers the block lenses; they refresh whenever a note's view changes. */
export function registerCodeLenses(service: EvaluationService): vscode.Disposable {
  const changed = new vscode.EventEmitter<void>();
  const provider: vscode.CodeLensProvider = {
    onDidChangeCodeLenses: changed.event,
    provideCodeLenses(doc) {
      const view = service.view(doc.uri);
      const evaluation = view?.evaluation;
      if (!view || !evaluation) return [];
      const statuses = regionStatuses(evaluation);
      const lenses: vscode.CodeLens[] = [];
      for (const [i, block] of evaluation.blocks.entries()) {
        const line = fenceLineOf(view, block);
        if (line === undefined || line >= doc.lineCount) continue;
        const range = new vscode.Range(line, 0, line, 0);
        const errors = block.diagnostics.filter((d) => d.severity === 'error').length;
        const state = statuses[i]?.state ?? 'missing';
        const title = view.running ? '$(sync~spin) computing…'
          : view.stale ? '$(history) edited: updating…'
          : errors > 0 ? `$(error) ${errors} problem${errors === 1 ? '' : 's'} · ${STATE_TEXT[state]}`
          : STATE_TEXT[state];
        lenses.push(new vscode.CodeLens(range, { title, command: '', tooltip: statuses[i]?.message ?? '' }));
        if (state !== 'unclosed' && state !== 'damaged') {
          lenses.push(new vscode.CodeLens(range, { title: 'Write Results', command: Commands.writeBlockResults, arguments: [doc.uri, i], tooltip: 'Write this block\'s results into the note below it' }));
        }
      }
      return lenses;
    },
  };
  return vscode.Disposable.from(
    changed,
    vscode.languages.registerCodeLensProvider({ language: 'markdown' }, provider),
    service.onDidChange(() => changed.fire()),
  );
}
