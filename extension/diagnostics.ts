/** Publishes the core's diagnostics (stable codes) in the Problems panel after each evaluation. */
import * as vscode from 'vscode';
import { toDiagnostic } from './adapter.js';
import type { EvaluationService } from './service.js';

/** Keeps the Problems panel in step with each note's last applied evaluation; cleared on close. */
export function registerDiagnostics(service: EvaluationService): vscode.Disposable {
  const collection = vscode.languages.createDiagnosticCollection('orbit-notes');
  const publish = (uri: vscode.Uri): void => {
    const evaluation = service.view(uri)?.evaluation;
    collection.set(uri, evaluation ? evaluation.diagnostics.map(toDiagnostic) : []);
  };
  for (const v of service.views()) publish(v.uri);
  return vscode.Disposable.from(
    collection,
    service.onDidEvaluate((v) => publish(v.uri)),
    vscode.workspace.onDidCloseTextDocument((d) => collection.delete(d.uri)),
  );
}
