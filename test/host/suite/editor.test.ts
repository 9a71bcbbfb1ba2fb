import * as assert from 'node:assert/strict';
import * as vscode from 'vscode';
import type { NoteView } from '../../../extension/service.js';
import { api, cliWrite, diagnosticsWhere, hoverText, lineOf, openNote, replaceInDocument, scratchFolder, RESTRICTED, viewWhere } from './helpers.js';

const NOTE = [
  '# Resonance sketch',
  '',
  'Two invented moons of an invented planet.',
  '',
  '```orbit',
  'let inner = 10 d ± 0.01 d',
  'let outer = inner * 2',
  'body vela period 3.5 d',
  '```',
  '',
  'Later, a second block uses the first one\'s names:',
  '',
  '```orbit second',
  'let beat = outer - inner',
  'let broken = missing * 2',
  '```',
  '',
].join('\n');

(RESTRICTED ? describe.skip : describe)('The editor on a note', function () {
  this.timeout(60_000);
  const folder = scratchFolder('editor');

  it('shows each statement\'s result inline after its line', async () => {
    const { doc } = await openNote(folder, 'inline.md', NOTE);
    const texts = (await api()).inlineTexts(doc);
    const at = (needle: string): string | undefined => texts.find((t) => t.line === lineOf(doc, needle))?.text;
    assert.equal(at('let inner ='), '= inner = 10.000 ± 0.010 d');
    assert.equal(at('let outer ='), '= outer = 20.000 ± 0.020 d');
    // outer = 2·inner, so outer − inner is inner again, uncertainty included (correlated inputs).
    assert.equal(at('let beat ='), '= beat = 10.000 ± 0.010 d');
    assert.match(at('let broken =') ?? '', /^✗ OB201 /);
  });

  it('publishes the core\'s diagnostics with their codes and ranges', async () => {
    const { doc } = await openNote(folder, 'diagnostics.md', NOTE);
    const ds = await diagnosticsWhere(doc.uri, (d) => d.length > 0);
    const unknown = ds.find((d) => d.code === 'OB201');
    assert.ok(unknown, `OB201 among ${ds.map((d) => String(d.code)).join(', ')}`);
    assert.equal(unknown.severity, vscode.DiagnosticSeverity.Error);
    assert.equal(unknown.source, 'orbit-notes');
    const line = lineOf(doc, 'let broken');
    assert.equal(unknown.range.start.line, line);
    assert.equal(doc.getText(unknown.range), 'missing');
  });

  it('hovers a statement with its result and provenance, and a name with its definition', async () => {
    const { doc } = await openNote(folder, 'hover.md', NOTE);
    const outerLine = lineOf(doc, 'let outer');
    const onStatement = hoverText(await vscode.commands.executeCommand<vscode.Hover[]>('vscode.executeHoverProvider', doc.uri, new vscode.Position(outerLine, 2)));
    assert.match(onStatement, /outer = 20\.000 ± 0\.020 d/);
    assert.match(onStatement, /Provenance/);
    assert.match(onStatement, /orbit-notes 0\.1\.0/);
    const beatLine = lineOf(doc, 'let beat');
    const column = doc.lineAt(beatLine).text.indexOf('inner') + 2;
    const onName = hoverText(await vscode.commands.executeCommand<vscode.Hover[]>('vscode.executeHoverProvider', doc.uri, new vscode.Position(beatLine, column)));
    assert.match(onName, new RegExp(`inner\\*\\* — defined on line ${lineOf(doc, 'let inner') + 1}`));
    assert.match(onName, /10\.000 ± 0\.010 d/);
  });

  it('hovers a date with its Julian Date and the ΔT used', async () => {
    // J2000.0 is JD 2451545.0 (TT) by definition (IAU 1976; Meeus, Astronomical Algorithms, 2nd ed., ch. 7);
    // 2000-01-01 12:00 UTC is therefore JD 2451545.0 in UT, with ΔT ≈ 64 s (from memory: 63.8 s).
    const { doc } = await openNote(folder, 'date.md', '```orbit\ndate 2000-01-01T12:00Z\n```\n');
    const text = hoverText(await vscode.commands.executeCommand<vscode.Hover[]>('vscode.executeHoverProvider', doc.uri, new vscode.Position(1, 1)));
    assert.match(text, /JD 2451545\.00000 UT/);
    const deltaT = /ΔT (\d+(?:\.\d+)?) s/.exec(text);
    assert.ok(deltaT, `ΔT in ${text}`);
    const toleranceSeconds = 1;
    assert.ok(Math.abs(Number(deltaT[1]) - 63.8) <= toleranceSeconds, `ΔT ${deltaT[1]} s`);
    assert.match(text, /astronomy-engine/);
  });

  it('puts a lens above each block with its state and a command writing its results', async () => {
    const { doc } = await openNote(folder, 'lens.md', NOTE);
    const lenses = await vscode.commands.executeCommand<vscode.CodeLens[]>('vscode.executeCodeLensProvider', doc.uri);
    const fences = [lineOf(doc, '```orbit'), lineOf(doc, '```orbit second')];
    for (const [i, fence] of fences.entries()) {
      const here = lenses.filter((l) => l.range.start.line === fence);
      assert.ok(here.some((l) => l.command?.title.includes('results not written yet')), `state lens on line ${fence + 1}: ${here.map((l) => l.command?.title).join(' | ')}`);
      const write = here.find((l) => l.command?.command === 'orbitNotes.writeBlockResults');
      assert.ok(write, 'a Write Results lens');
      assert.deepEqual(write.command?.arguments?.map(String), [doc.uri.toString(), String(i)]);
    }
    assert.ok(lenses.find((l) => l.range.start.line === fences[1])?.command?.title.includes('1 problem'));
  });

  it('completes keywords at a statement start, units after a number and names in expressions', async () => {
    const { doc, editor } = await openNote(folder, 'completion.md', NOTE);
    const line = lineOf(doc, 'let broken');
    await editor.edit((b) => b.insert(new vscode.Position(line + 1, 0), '\nlet later = 4 \nlet other = \n'));
    const labels = async (l: number, c: number): Promise<string[]> => {
      const list = await vscode.commands.executeCommand<vscode.CompletionList>('vscode.executeCompletionItemProvider', doc.uri, new vscode.Position(l, c));
      return list.items.map((i) => (typeof i.label === 'string' ? i.label : i.label.label));
    };
    const start = await labels(line + 1, 0);
    for (const kw of ['synodic', 'conjunctions', 'relation', 'let', 'body']) assert.ok(start.includes(kw), `keyword ${kw} in ${start.join(',')}`);
    const units = await labels(line + 2, 'let later = 4 '.length);
    for (const u of ['d', 'yr', 'deg']) assert.ok(units.includes(u), `unit ${u} in ${units.join(',')}`);
    const names = await labels(line + 3, 'let other = '.length);
    for (const n of ['inner', 'outer', 'vela', 'jupiter']) assert.ok(names.includes(n), `name ${n} in ${names.join(',')}`);
  });

  it('renders the preview with each statement and its result, in place of nothing written', async () => {
    const { doc } = await openNote(folder, 'preview.md', NOTE);
    const html = await vscode.commands.executeCommand<string>('markdown.api.render', doc.getText());
    assert.match(html, /class="orbit-block"/);
    assert.match(html, /<span class="orbit-summary">outer = 20\.000 ± 0\.020 d<\/span>/);
    assert.match(html, /OB201/);
    // Other fences stay with the built-in renderer; the data-line attribute survives for scroll sync.
    assert.match(html, /data-line="4"[^>]*class="[^"]*orbit-fence|class="[^"]*orbit-fence[^"]*"[^>]*data-line="4"/);
  });

  it('re-evaluates dependents after a definition is edited: inline, hover and preview', async () => {
    const { doc } = await openNote(folder, 'edit.md', NOTE);
    const next = (await api()).nextEvaluation(doc.uri);
    await replaceInDocument(doc, 'let inner = 10 d', 'let inner = 12 d');
    // Until the debounced evaluation lands, the old results stay, marked stale.
    assert.deepEqual((await api()).inlineTexts(doc).find((t) => t.line === lineOf(doc, 'let outer')), { kind: 'stale', line: lineOf(doc, 'let outer'), text: '◌ = outer = 20.000 ± 0.020 d' });
    const view = await next;
    assert.equal(view.stale, false);
    const texts = (await api()).inlineTexts(doc);
    assert.equal(texts.find((t) => t.line === lineOf(doc, 'let outer'))?.text, '= outer = 24.000 ± 0.020 d');
    assert.equal(texts.find((t) => t.line === lineOf(doc, 'let beat'))?.text, '= beat = 12.000 ± 0.010 d');
    const html = await vscode.commands.executeCommand<string>('markdown.api.render', doc.getText());
    assert.match(html, /outer = 24\.000 ± 0\.020 d/);
    assert.doesNotMatch(html, /outer = 20\.000/);
    // Only the edited definition and its dependents were computed again.
    assert.ok(view.evaluation && view.evaluation.reused >= 1, `reused ${view.evaluation?.reused}`);
  });

  it('writes exactly what the command line writes, and is idempotent', async () => {
    const { doc } = await openNote(folder, 'write.md', NOTE);
    const outcome = await vscode.commands.executeCommand<{ written: number }>('orbitNotes.writeResults', doc.uri);
    assert.equal(outcome.written, 2);
    assert.equal(doc.getText(), cliWrite(NOTE));
    const again = await vscode.commands.executeCommand<{ written: number }>('orbitNotes.writeResults', doc.uri);
    assert.equal(again.written, 0);
    const lenses = await vscode.commands.executeCommand<vscode.CodeLens[]>('vscode.executeCodeLensProvider', doc.uri);
    assert.ok(lenses.some((l) => l.command?.title.includes('results written and current')));
    const statuses = await vscode.commands.executeCommand<Array<{ state: string }>>('orbitNotes.checkNote', doc.uri);
    assert.deepEqual(statuses.map((s) => s.state), ['current', 'current']);
    // The preview shows live results in place of the stored region, and says that it matches.
    const html = await vscode.commands.executeCommand<string>('markdown.api.render', doc.getText());
    assert.equal(html.match(/stored results match/g)?.length, 2);
    assert.doesNotMatch(html, /orbit results ·/);
  });

  it('writes one block from its lens and leaves the other alone', async () => {
    const { doc } = await openNote(folder, 'lens-write.md', NOTE);
    const lenses = await vscode.commands.executeCommand<vscode.CodeLens[]>('vscode.executeCodeLensProvider', doc.uri);
    const second = lenses.find((l) => l.range.start.line === lineOf(doc, '```orbit second') && l.command?.command === 'orbitNotes.writeBlockResults');
    assert.ok(second?.command);
    const outcome = await vscode.commands.executeCommand<{ written: number }>(second.command.command, ...(second.command.arguments ?? []));
    assert.equal(outcome.written, 1);
    const text = doc.getText();
    assert.equal(text.match(/<!-- orbit results · /g)?.length, 1);
    assert.ok(text.indexOf('<!-- orbit results · ') > text.indexOf('```orbit second'), 'the region is under the second block');
  });

  it('keeps text typed while results are being written', async () => {
    const { doc } = await openNote(folder, 'typing.md', NOTE);
    const writing = vscode.commands.executeCommand<{ written: number; gaveUp: boolean }>('orbitNotes.writeResults', doc.uri);
    await replaceInDocument(doc, 'Two invented moons', 'Two typed-in moons');
    const outcome = await writing;
    assert.equal(outcome.gaveUp, false);
    const text = doc.getText();
    assert.match(text, /Two typed-in moons/);
    assert.equal(text.match(/<!-- orbit results · /g)?.length, 2);
  });

  it('hides inline results when orbitNotes.inline.enabled is off', async () => {
    const { doc } = await openNote(folder, 'setting.md', NOTE);
    const config = vscode.workspace.getConfiguration('orbitNotes');
    assert.ok((await api()).inlineTexts(doc).length > 0);
    await config.update('inline.enabled', false, vscode.ConfigurationTarget.Global);
    try {
      assert.deepEqual((await api()).inlineTexts(doc), []);
    } finally {
      await config.update('inline.enabled', undefined, vscode.ConfigurationTarget.Global);
    }
    assert.ok((await api()).inlineTexts(doc).length > 0);
  });

  it('writes every note of the workspace and saves those that were not being edited', async () => {
    const committed = vscode.Uri.joinPath(vscode.workspace.workspaceFolders![0]!.uri, 'note.md');
    const original = await vscode.workspace.fs.readFile(committed);
    const other = vscode.Uri.joinPath(folder, 'closed.md');
    await vscode.workspace.fs.writeFile(other, new TextEncoder().encode(NOTE));
    try {
      const outcomes = await vscode.commands.executeCommand<Array<{ uri: vscode.Uri; written: number }>>('orbitNotes.writeWorkspaceResults');
      const byPath = new Map(outcomes.map((o) => [o.uri.path, o.written]));
      assert.equal(byPath.get(other.path), 2);
      assert.equal(byPath.get(committed.path), 1);
      // Written to disk exactly as the command line writes it.
      assert.equal(new TextDecoder().decode(await vscode.workspace.fs.readFile(other)), cliWrite(NOTE));
    } finally {
      const doc = vscode.workspace.textDocuments.find((d) => d.uri.toString() === committed.toString());
      if (doc?.isDirty) await doc.save();
      await vscode.workspace.fs.writeFile(committed, original);
    }
  });

  it('re-evaluates a series when its data file is rewritten', async () => {
    const data = vscode.Uri.joinPath(folder, 'flux.csv');
    await vscode.workspace.fs.writeFile(data, new TextEncoder().encode('t,v\n0,1\n1,2\n2,3\n'));
    const { doc } = await openNote(folder, 'series.md', '# Flux\n\n```orbit\nseries flux from "flux.csv" time t value v\n```\n');
    const line = lineOf(doc, 'series flux');
    const before = (await api()).inlineTexts(doc).find((t) => t.line === line)?.text ?? '';
    assert.match(before, /3 samples/);
    assert.match(before, /mean 2(\b|\.0)/);
    const seriesSummary = (v: NoteView): string => v.evaluation?.blocks[0]?.statements[0]?.result?.summary ?? '';
    const rewritten = viewWhere(doc.uri, (v) => !v.stale && !v.running && /4 samples/.test(seriesSummary(v)));
    // Rewritten in the editor and saved (an outside rewrite is seen through a file watcher,
    // which may miss a write made right after it was set up, so the test does not rely on it).
    const dataDoc = await vscode.workspace.openTextDocument(data);
    const edit = new vscode.WorkspaceEdit();
    edit.replace(data, new vscode.Range(0, 0, dataDoc.lineCount, 0), 't,v\n0,10\n1,20\n2,30\n3,40\n');
    assert.ok(await vscode.workspace.applyEdit(edit));
    assert.ok(await dataDoc.save());
    await rewritten;
    const after = (await api()).inlineTexts(doc).find((t) => t.line === line)?.text ?? '';
    assert.match(after, /4 samples/);
    assert.match(after, /mean 25(\b|\.0)/);
  });

  it('refuses data files outside the workspace', async () => {
    // scratch/<test>/ is five folders below the repository root, which holds package.json.
    const { doc } = await openNote(folder, 'outside.md', '```orbit\nseries s from "../../../../../package.json" time t value v\n```\n');
    const ds = await diagnosticsWhere(doc.uri, (d) => d.length > 0);
    assert.deepEqual(ds.map((d) => `${String(d.code)} ${d.message}`), [`OB404 \`../../../../../package.json\` lies outside the workspace ${vscode.workspace.workspaceFolders![0]!.uri.fsPath}; data files must be inside it`]);
  });

  it('renders markup and script in a note\'s blocks as inert text', async () => {
    const hostile = [
      '```orbit <img/src=x/onerror=alert(1)>',
      'let x = 1 d  # <script>alert("comment")</script>',
      'series s from "<script>alert(2)</script>.csv" time t value v',
      'body <b>bold</b> period 2 d',
      '```',
      '',
    ].join('\n');
    const { doc } = await openNote(folder, 'hostile.md', hostile);
    const html = await vscode.commands.executeCommand<string>('markdown.api.render', doc.getText());
    assert.match(html, /orbit-block/);
    assert.doesNotMatch(html, /<script>alert/);
    assert.doesNotMatch(html, /<img/);
    assert.match(html, /&lt;img\/src=x\/onerror=alert\(1\)&gt;/);
    assert.doesNotMatch(html, /<b>bold<\/b>/);
    assert.match(html, /&lt;script&gt;alert\(2\)&lt;\/script&gt;/);
    const hovers = await vscode.commands.executeCommand<vscode.Hover[]>('vscode.executeHoverProvider', doc.uri, new vscode.Position(lineOf(doc, 'series s'), 2));
    for (const c of hovers.flatMap((h) => h.contents)) {
      assert.ok(typeof c !== 'string' && 'value' in c);
      const md = c as vscode.MarkdownString;
      assert.notEqual(md.isTrusted, true);
      assert.notEqual(md.supportHtml, true);
    }
    // Outside code spans (which show their text literally), no markup survives.
    const prose = hoverText(hovers).replace(/(`+)[^`]*?\1/g, '');
    assert.doesNotMatch(prose, /<script|<img|<b>/);
    assert.match(hoverText(hovers), /&lt;script&gt;alert\(2\)/);
  });
});
