/** File access for the evaluator from the command line: confined to a workspace folder. */
import { existsSync, readFileSync, realpathSync, renameSync, statSync, writeFileSync, unlinkSync } from 'node:fs';
import { dirname, isAbsolute, join, relative, resolve, sep, basename } from 'node:path';
import { FileAccessError, type NoteHost } from '../compute/note.js';

/** The workspace of a note: the nearest folder above it holding `.git`, else the note's folder. */
export function findWorkspace(notePath: string): string {
  let dir = dirname(resolve(notePath));
  for (;;) {
    if (existsSync(join(dir, '.git'))) return dir;
    const up = dirname(dir);
    if (up === dir) return dirname(resolve(notePath));
    dir = up;
  }
}

/** Is `child` the folder `root` or inside it (both real paths)? */
export function isInside(root: string, child: string): boolean {
  const rel = relative(root, child);
  return rel === '' || (rel !== '..' && !rel.startsWith(`..${sep}`) && !isAbsolute(rel));
}

export const MAX_DATA_FILE_BYTES = 64 * 1024 * 1024;

/** A host that reads files relative to `notePath`, refusing anything outside `workspace` (symlinks resolved). */
export function createFsHost(notePath: string, workspace: string): NoteHost & { readonly filesRead: Set<string> } {
  const root = realpathSync(workspace);
  const filesRead = new Set<string>();
  return {
    filesRead,
    readText: async (rel: string) => {
      const target = resolve(dirname(resolve(notePath)), rel);
      if (!existsSync(target)) throw new FileAccessError(`file not found: \`${rel}\` (looked for ${relative(root, target) || target})`, 'not-found');
      const real = realpathSync(target);
      if (!isInside(root, real)) throw new FileAccessError(`\`${rel}\` lies outside the workspace ${root}; data files must be inside it`, 'outside-workspace');
      const st = statSync(real);
      if (!st.isFile()) throw new FileAccessError(`\`${rel}\` is not a file`, 'unreadable');
      if (st.size > MAX_DATA_FILE_BYTES) throw new FileAccessError(`\`${rel}\` is larger than ${MAX_DATA_FILE_BYTES / 1048576} MiB`, 'unreadable');
      filesRead.add(real);
      return readFileSync(real, 'utf8');
    },
  };
}

/** Write a file atomically: a temporary file in the same folder, then rename over the original. */
export function writeFileAtomic(path: string, text: string): void {
  const tmp = join(dirname(path), `.${basename(path)}.orbit-${process.pid}-${Date.now()}.tmp`);
  let mode: number | undefined;
  try { mode = statSync(path).mode; } catch { mode = undefined; }
  try {
    writeFileSync(tmp, text, mode === undefined ? { encoding: 'utf8' } : { encoding: 'utf8', mode });
    renameSync(tmp, path);
  } catch (err) {
    try { unlinkSync(tmp); } catch { /* already gone */ }
    throw err;
  }
}
