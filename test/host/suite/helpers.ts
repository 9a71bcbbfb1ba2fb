/**
 * Helpers shared by the host tests: scratch notes written into the committed test
 * workspace (under its git-ignored `scratch/` folder), the extension's test surface,
 * and event-driven waits with time limits.
 */
import * as assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import * as vscode from 'vscode';
import type { OrbitNotesApi } from '../../../extension/extension.js';
import type { NoteView } from '../../../extension/service.js';

export const EXTENSION_ID = 'orbit-notes.orbit-notes';

/** Set by run.mjs --no-trust-flag (and desktop.mjs): the host starts in Restricted Mode. */
export const RESTRICTED = process.env['ORBIT_HOST_RESTRICTED'] === '1';

export async function api(): Promise<OrbitNotesApi> {
  const extension = vscode.extensions.getExtension<OrbitNotesApi>(EXTENSION_ID);
  assert.ok(extension, `extension ${EXTENSION_ID} is loaded from the development path`);
  return extension.activate();
}

export function workspaceRoot(): vscode.Uri {
  const folder = vscode.workspace.workspaceFolders?.[0];
  assert.ok(folder, 'the test workspace is open');
  return folder.uri;
}

let counter = 0;

/** A fresh scratch folder for one test, inside the workspace. */
export function scratchFolder(label: string): vscode.Uri {
  counter += 1;
  return vscode.Uri.joinPath(workspaceRoot(), 'scratch', `${label}-${process.pid}-${counter}`);
}

export async function writeText(uri: vscode.Uri, text: string): Promise<void> {
  await vscode.workspace.fs.writeFile(uri, new TextEncoder().encode(text));
}

export async function readText(uri: vscode.Uri): Promise<string> {
  return new TextDecoder().decode(await vscode.workspace.fs.readFile(uri));
}

/** Write a note, open it in an editor and wait until its text is evaluated. */
export async function openNote(folder: vscode.Uri, name: string, text: string): Promise<{ doc: vscode.TextDocument; editor: vscode.TextEditor }> {
  const uri = vscode.Uri.joinPath(folder, name);
  await writeText(uri, text);
  const doc = await vscode.workspace.openTextDocument(uri);
  const editor = await vscode.window.showTextDocument(doc);
  await (await api()).whenEvaluated(uri);
  return { doc, editor };
}

/** Replace the first occurrence of `from` in the document with `to`; resolves once the edit is applied. */
export async function replaceInDocument(doc: vscode.TextDocument, from: string, to: string): Promise<void> {
  const offset = doc.getText().indexOf(from);
  assert.ok(offset >= 0, `"${from}" is in the document`);
  const edit = new vscode.WorkspaceEdit();
  edit.replace(doc.uri, new vscode.Range(doc.positionAt(offset), doc.positionAt(offset + from.length)), to);
  assert.equal(await vscode.workspace.applyEdit(edit), true, 'the edit was applied');
}

/** The 0-based line of the first line containing `text`. */
export function lineOf(doc: vscode.TextDocument, text: string): number {
  for (let i = 0; i < doc.lineCount; i++) if (doc.lineAt(i).text.includes(text)) return i;
  assert.fail(`no line contains "${text}"`);
}

/** Plain text of hover contents. */
export function hoverText(hovers: readonly vscode.Hover[]): string {
  return hovers.flatMap((h) => h.contents.map((c) => (typeof c === 'string' ? c : c.value))).join('\n');
}

/** Wait for a diagnostics change of `uri` that satisfies `test`, with a time limit. */
export function diagnosticsWhere(uri: vscode.Uri, test: (ds: readonly vscode.Diagnostic[]) => boolean, timeoutMs = 20_000): Promise<readonly vscode.Diagnostic[]> {
  const now = vscode.languages.getDiagnostics(uri);
  if (test(now)) return Promise.resolve(now);
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => { sub.dispose(); reject(new Error(`diagnostics of ${uri.path} did not reach the expected state within ${timeoutMs} ms; last: ${JSON.stringify(vscode.languages.getDiagnostics(uri).map((d) => `${String(d.code)} ${d.message}`))}`)); }, timeoutMs);
    const sub = vscode.languages.onDidChangeDiagnostics((e) => {
      if (!e.uris.some((u) => u.toString() === uri.toString())) return;
      const ds = vscode.languages.getDiagnostics(uri);
      if (test(ds)) { clearTimeout(timer); sub.dispose(); resolve(ds); }
    });
  });
}

export async function closeAllEditors(): Promise<void> {
  await vscode.commands.executeCommand('workbench.action.closeAllEditors');
}

/** Wait for a view change of `uri` that satisfies `test`, with a time limit. */
export async function viewWhere(uri: vscode.Uri, test: (v: NoteView) => boolean, timeoutMs = 20_000): Promise<NoteView> {
  const a = await api();
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => { sub.dispose(); reject(new Error(`the view of ${uri.path} did not reach the expected state within ${timeoutMs} ms`)); }, timeoutMs);
    const sub = a.onDidChangeView((v) => {
      if (v.uri.toString() !== uri.toString() || !test(v)) return;
      clearTimeout(timer);
      sub.dispose();
      resolve(v);
    });
  });
}

/**
 * What `orbit-notes write` makes of a note's text: the built command line run on a copy
 * in a folder of its own. It exits 2 for notes with errors, after writing.
 */
export function cliWrite(text: string): string {
  const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'orbit-cli-'));
  try {
    const copy = path.join(tmp, 'note.md');
    fs.writeFileSync(copy, text);
    const cli = path.join(vscode.extensions.getExtension(EXTENSION_ID)!.extensionPath, 'dist', 'cli.js');
    const run = spawnSync(process.execPath, [cli, 'write', copy], { encoding: 'utf8' });
    assert.ok(run.status === 0 || run.status === 2, `orbit-notes write exited ${run.status}: ${run.stderr}`);
    return fs.readFileSync(copy, 'utf8');
  } finally {
    fs.rmSync(tmp, { recursive: true, force: true });
  }
}
