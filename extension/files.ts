/**
 * Data-file reads for notes, confined to the note's workspace folder. On disk the CLI's
 * confinement is reused (symlinks resolved, size capped); other file systems go through
 * `vscode.workspace.fs` with the path normalised and checked against the folder.
 * In Restricted Mode nothing is read.
 */
import * as vscode from 'vscode';
import { createFsHost, MAX_DATA_FILE_BYTES } from '../cli/fsHost.js';
import { FileAccessError } from '../compute/note.js';

/** The result of a read: the text and the URI actually read (for change watching). */
export interface ReadOutcome {
  readonly text: string;
  readonly uri: vscode.Uri;
  /** Modification time when read (ms since the epoch; -1 when unknown). */
  readonly mtimeMs: number;
}

/**
 * Read `relativePath` (relative to the note) from inside the note's workspace folder.
 * @throws FileAccessError 'outside-workspace' for anything outside the folder (or a note
 *   outside every folder), 'unreadable' in Restricted Mode, 'not-found' when missing.
 */
export async function readNoteFile(noteUri: vscode.Uri, relativePath: string): Promise<ReadOutcome> {
  if (!vscode.workspace.isTrusted) {
    throw new FileAccessError(`\`${relativePath}\` was not read: data files are read only in a trusted workspace (Restricted Mode is on)`, 'unreadable');
  }
  const folder = vscode.workspace.getWorkspaceFolder(noteUri);
  if (!folder) {
    throw new FileAccessError(`\`${relativePath}\` was not read: the note is not inside an open workspace folder, and data files are read only from inside one`, 'outside-workspace');
  }
  if (noteUri.scheme === 'file' && folder.uri.scheme === 'file') {
    const host = createFsHost(noteUri.fsPath, folder.uri.fsPath);
    const text = await host.readText(relativePath);
    const [real] = [...host.filesRead];
    const uri = real ? vscode.Uri.file(real) : vscode.Uri.joinPath(noteUri, '..', relativePath);
    return { text, uri, mtimeMs: await mtimeOf(uri) };
  }
  if (relativePath.startsWith('/') || /^[a-z][\w+.-]*:/i.test(relativePath)) {
    throw new FileAccessError(`\`${relativePath}\` must be a path relative to the note`, 'outside-workspace');
  }
  // joinPath normalises `..`; the result must stay under the folder's path.
  const target = vscode.Uri.joinPath(noteUri, '..', relativePath);
  const root = folder.uri.path.endsWith('/') ? folder.uri.path : `${folder.uri.path}/`;
  if (target.scheme !== folder.uri.scheme || target.authority !== folder.uri.authority || !target.path.startsWith(root)) {
    throw new FileAccessError(`\`${relativePath}\` lies outside the workspace folder ${folder.name}; data files must be inside it`, 'outside-workspace');
  }
  let stat: vscode.FileStat;
  try {
    stat = await vscode.workspace.fs.stat(target);
  } catch {
    throw new FileAccessError(`file not found: \`${relativePath}\``, 'not-found');
  }
  if (stat.type & vscode.FileType.Directory) throw new FileAccessError(`\`${relativePath}\` is not a file`, 'unreadable');
  if (stat.size > MAX_DATA_FILE_BYTES) throw new FileAccessError(`\`${relativePath}\` is larger than ${MAX_DATA_FILE_BYTES / 1048576} MiB`, 'unreadable');
  const bytes = await vscode.workspace.fs.readFile(target);
  return { text: new TextDecoder('utf-8').decode(bytes), uri: target, mtimeMs: stat.mtime };
}

async function mtimeOf(uri: vscode.Uri): Promise<number> {
  try {
    return (await vscode.workspace.fs.stat(uri)).mtime;
  } catch {
    return -1;
  }
}
