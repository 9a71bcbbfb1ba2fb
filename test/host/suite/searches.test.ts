import * as assert from 'node:assert/strict';
import * as vscode from 'vscode';
import { api, lineOf, RESTRICTED, scratchFolder, viewWhere, writeText } from './helpers.js';

// A search that takes many seconds: the Sun's barycentric offset at one-day steps over 2000 years.
const SLOW_NOTE = '# Slow\n\n```orbit\nlet p = 2 d\nbarycentre from 1000 to 3000 step 1 d\n```\n';

(RESTRICTED ? describe.skip : describe)('Long searches', function () {
  this.timeout(90_000);
  const folder = scratchFolder('searches');

  it('run off the main thread, show a computing state, and stop when cancelled', async () => {
    const uri = vscode.Uri.joinPath(folder, 'slow.md');
    await writeText(uri, SLOW_NOTE);
    const doc = await vscode.workspace.openTextDocument(uri);
    const searchLine = lineOf(doc, 'barycentre');
    const inSearch = viewWhere(uri, (v) => v.running && v.progress?.line === searchLine);
    await vscode.window.showTextDocument(doc);
    await inSearch;

    const inline = (await api()).inlineTexts(doc);
    assert.deepEqual(inline.find((t) => t.line === searchLine), { kind: 'computing', line: searchLine, text: '⋯ computing' });
    // The extension host answers a completion request while the search runs: the search is in the worker.
    const list = await vscode.commands.executeCommand<vscode.CompletionList>('vscode.executeCompletionItemProvider', uri, new vscode.Position(lineOf(doc, 'let p'), 0));
    assert.ok(list.items.some((i) => i.label === 'synodic'), 'keywords offered');
    assert.equal((await api()).inlineTexts(doc).find((t) => t.line === searchLine)?.kind, 'computing', 'still searching after the completion');

    const cancelled = (await api()).nextEvaluation(uri);
    const n = await vscode.commands.executeCommand<number>('orbitNotes.cancelSearches');
    assert.ok(n >= 1, `cancelled ${n}`);
    const view = await cancelled;
    const statement = view.evaluation?.blocks[0]?.statements.find((s) => s.statement.kind === 'barycentre');
    assert.deepEqual(statement?.diagnostics.map((d) => d.code), ['OB402']);
    assert.equal(statement?.result, undefined);
    const lets = view.evaluation?.blocks[0]?.statements.find((s) => s.statement.kind === 'let');
    assert.equal(lets?.result?.summary, 'p = 2 d');

    // A cancelled search is not cached: the next evaluation starts it again.
    const again = viewWhere(uri, (v) => v.running && v.progress?.line === searchLine + 1);
    const edit = new vscode.WorkspaceEdit();
    edit.insert(uri, new vscode.Position(searchLine, 0), '# searching again\n');
    assert.ok(await vscode.workspace.applyEdit(edit));
    await again;
    const stopped = (await api()).nextEvaluation(uri);
    await vscode.commands.executeCommand('orbitNotes.cancelSearches');
    await stopped;
    await vscode.commands.executeCommand('workbench.action.revertAndCloseActiveEditor');
  });
});
