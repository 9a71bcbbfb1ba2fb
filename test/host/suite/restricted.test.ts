import * as assert from 'node:assert/strict';
import * as vscode from 'vscode';
import { diagnosticsWhere, lineOf, openNote, RESTRICTED, scratchFolder, api } from './helpers.js';

(RESTRICTED ? describe : describe.skip)('Restricted Mode', function () {
  this.timeout(60_000);
  const folder = scratchFolder('restricted');

  it('evaluates blocks but reads no data file', async () => {
    await vscode.workspace.fs.writeFile(vscode.Uri.joinPath(folder, 'data.csv'), new TextEncoder().encode('t,v\n0,1\n1,2\n'));
    const { doc } = await openNote(folder, 'note.md', '```orbit\nlet p = 3 d\nseries s from "data.csv" time t value v\n```\n');
    const ds = await diagnosticsWhere(doc.uri, (d) => d.length > 0);
    assert.deepEqual(ds.map((d) => String(d.code)), ['OB403']);
    assert.match(ds[0]!.message, /Restricted Mode/);
    const inline = (await api()).inlineTexts(doc);
    assert.equal(inline.find((t) => t.line === lineOf(doc, 'let p'))?.text, '= p = 3 d');
  });
});
