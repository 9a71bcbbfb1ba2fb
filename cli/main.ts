/**
 * `orbit-notes`: evaluate notes, write results back, check committed results.
 *
 *   orbit-notes run PATHS… [--json] [--summary]
 *   orbit-notes write PATHS… [--force]
 *   orbit-notes check PATHS…
 *
 * Exit codes: 0 fine; 1 `check` found regions missing, stale or edited, or `write` left a
 * region alone (edited by hand, damaged, or the note changed meanwhile); 2 usage error or a
 * note with errors.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import { createTwoFilesPatch } from 'diff';
import { DEFAULT_LIMITS, type Limits } from '../compute/limits.js';
import { createNoteEvaluator, type NoteEvaluation } from '../compute/note.js';
import { ORBIT_NOTES_VERSION } from '../compute/provenance.js';
import { planWrite, regionStatuses } from '../compute/writeback.js';
import { createFsHost, findWorkspace, writeFileAtomic } from './fsHost.js';
import { renderStandalonePage } from './page.js';

const USAGE = `usage: orbit-notes <command> PATHS… [options]

commands:
  run PATHS…     evaluate the orbit blocks of each note and print every result
  write PATHS…   evaluate and write results into the generated regions under each block
  check PATHS…   evaluate and compare with the regions in the notes (exit 1 on a difference)
  html NOTE -o FILE.html   a standalone page of the note with its results, tables and plots

PATHS are Markdown files or folders (searched for *.md).
options:
  --json                 (run) one JSON document with every statement's result
  --summary              (run) one line per note instead of one per statement
  --force                (write) also overwrite regions that were edited by hand
  -o, --output FILE      (html) where to write the page
  --workspace DIR        folder that data files must lie in (default: the note's git work tree)
  --max-evaluations N    ephemeris evaluations one statement may use (default ${DEFAULT_LIMITS.maxEvaluations})
  --max-span-years N     longest search span in years (default ${DEFAULT_LIMITS.maxSpanDays / 365.25})
  --max-trials N         Monte-Carlo trials one statement may use (default ${DEFAULT_LIMITS.maxTrials})
  --version, --help`;

class UsageError extends Error {}

interface Options {
  command: 'run' | 'write' | 'check' | 'html';
  output?: string;
  paths: string[];
  json: boolean;
  summary: boolean;
  force: boolean;
  workspace?: string;
  limits: Limits;
}

function parseArgs(argv: readonly string[]): Options | 'help' | 'version' {
  if (argv.includes('--help') || argv.includes('-h')) return 'help';
  if (argv.includes('--version')) return 'version';
  const [command, ...rest] = argv;
  if (command !== 'run' && command !== 'write' && command !== 'check' && command !== 'html') {
    throw new UsageError(command ? `unknown command \`${command}\`` : 'no command given');
  }
  const o: Options = { command, paths: [], json: false, summary: false, force: false, limits: { ...DEFAULT_LIMITS } };
  const num = (flag: string, v: string | undefined, whole = true): number => {
    const n = Number(v);
    if (v === undefined || !Number.isFinite(n) || n <= 0 || (whole && !Number.isInteger(n))) throw new UsageError(`${flag} needs a positive ${whole ? 'whole ' : ''}number`);
    return n;
  };
  for (let i = 0; i < rest.length; i++) {
    const a = rest[i]!;
    switch (a) {
      case '--json': o.json = true; break;
      case '--summary': o.summary = true; break;
      case '--force': o.force = true; break;
      case '-o': case '--output': { const v = rest[++i]; if (!v) throw new UsageError(`${a} needs a file name`); o.output = v; break; }
      case '--workspace': { const v = rest[++i]; if (!v) throw new UsageError('--workspace needs a folder'); o.workspace = v; break; }
      case '--max-evaluations': o.limits = { ...o.limits, maxEvaluations: num(a, rest[++i]) }; break;
      case '--max-span-years': o.limits = { ...o.limits, maxSpanDays: num(a, rest[++i], false) * 365.25 }; break;
      case '--max-trials': o.limits = { ...o.limits, maxTrials: num(a, rest[++i]) }; break;
      default:
        if (a.startsWith('--')) throw new UsageError(`unknown option \`${a}\``);
        o.paths.push(a);
    }
  }
  if (o.paths.length === 0) throw new UsageError(`\`${command}\` needs at least one note or folder`);
  if (o.json && command !== 'run') throw new UsageError('--json goes with `run`');
  if (o.force && command !== 'write') throw new UsageError('--force goes with `write`');
  if (command === 'html' && (o.paths.length !== 1 || !o.output)) throw new UsageError('`html` takes one note and -o FILE.html');
  if (o.output && command !== 'html') throw new UsageError('-o goes with `html`');
  if (o.output && !/\.html?$/i.test(o.output)) throw new UsageError('the page is written to a .html file (so that a note is never overwritten)');
  return o;
}

/** Markdown files under the given paths, sorted, skipping dependency and VCS folders. */
export function collectNotes(paths: readonly string[]): string[] {
  const out = new Set<string>();
  const walk = (p: string): void => {
    const st = statSync(p);
    if (st.isDirectory()) {
      for (const name of readdirSync(p).sort()) {
        if (name === 'node_modules' || name.startsWith('.')) continue;
        walk(join(p, name));
      }
    } else if (/\.(md|markdown)$/i.test(p)) {
      out.add(resolve(p));
    }
  };
  for (const p of paths) {
    try { statSync(p); } catch { throw new UsageError(`no such file or folder: ${p}`); }
    const st = statSync(p);
    if (st.isFile() && !/\.(md|markdown)$/i.test(p)) throw new UsageError(`not a Markdown file: ${p}`);
    walk(p);
  }
  return [...out].sort();
}

interface NoteRun { path: string; display: string; text: string; evaluation: NoteEvaluation }

async function evaluateNote(path: string, o: Options): Promise<NoteRun> {
  const text = readFileSync(path, 'utf8');
  const host = createFsHost(path, o.workspace ?? findWorkspace(path));
  const evaluator = createNoteEvaluator({ host, limits: o.limits, log: (m) => process.stderr.write(`${m}\n`) });
  const tty = process.stderr.isTTY === true;
  const display = relative(process.cwd(), path) || path;
  const evaluation = await evaluator.evaluate(text, tty
    ? { onProgress: (done, total, s) => { process.stderr.write(`\r\x1b[K${display}: ${done + 1}/${total} ${s.kind} (line ${s.range.start.line + 1})`); } }
    : {});
  if (tty) process.stderr.write('\r\x1b[K');
  return { path, display, text, evaluation };
}

const pos = (r: NoteRun, line: number, character: number): string => `${r.display}:${line + 1}:${character + 1}`;

function hasErrors(e: NoteEvaluation): boolean {
  return e.diagnostics.some((d) => d.severity === 'error');
}

function printDiagnostics(r: NoteRun): void {
  for (const d of r.evaluation.diagnostics) {
    process.stderr.write(`${pos(r, d.range.start.line, d.range.start.character)}: ${d.severity} ${d.code}: ${d.message}\n`);
  }
}

export async function main(argv: readonly string[]): Promise<number> {
  let o: Options;
  try {
    const parsed = parseArgs(argv);
    if (parsed === 'help') { process.stdout.write(`${USAGE}\n`); return 0; }
    if (parsed === 'version') { process.stdout.write(`orbit-notes ${ORBIT_NOTES_VERSION}\n`); return 0; }
    o = parsed;
    o.paths = collectNotes(o.paths);
  } catch (err) {
    if (err instanceof UsageError) { process.stderr.write(`orbit-notes: ${err.message}\n\n${USAGE}\n`); return 2; }
    throw err;
  }
  let code = 0;
  const json: unknown[] = [];
  let mismatches = 0;
  for (const path of o.paths) {
    const r = await evaluateNote(path, o);
    if (hasErrors(r.evaluation)) code = 2;
    if (o.command === 'run') {
      if (o.json) {
        for (const b of r.evaluation.blocks) {
          for (const s of b.statements) {
            json.push({
              file: r.display,
              line: s.statement.range.start.line + 1,
              block: b.block.name ?? null,
              kind: s.statement.kind,
              summary: s.result?.summary ?? null,
              diagnostics: s.diagnostics.map((d) => ({ line: d.range.start.line + 1, column: d.range.start.character + 1, endLine: d.range.end.line + 1, endColumn: d.range.end.character + 1, severity: d.severity, code: d.code, message: d.message })),
              ...(s.result?.value ? { value: s.result.value } : {}),
              ...(s.result?.events ? { events: s.result.events.map((e) => ({ jd_tt: e.jd_tt, utc: e.utc, ...e.fields })) } : {}),
              ...(s.result ? { provenance: s.result.provenance, cautions: s.result.cautions } : {}),
            });
          }
        }
      } else if (o.summary) {
        const n = r.evaluation.blocks.reduce((k, b) => k + b.statements.length, 0);
        const errs = r.evaluation.diagnostics.filter((d) => d.severity === 'error').length;
        process.stdout.write(`${r.display}: ${r.evaluation.blocks.length} blocks, ${n} statements, ${errs} errors\n`);
        printDiagnostics(r);
      } else {
        for (const b of r.evaluation.blocks) {
          for (const s of b.statements) {
            if (s.result) process.stdout.write(`${pos(r, s.statement.range.start.line, s.statement.range.start.character)}: ${s.statement.kind}: ${s.result.summary}\n`);
          }
        }
        printDiagnostics(r);
      }
    } else if (o.command === 'html') {
      writeFileAtomic(resolve(o.output!), renderStandalonePage(r.text, r.evaluation, r.display));
      process.stdout.write(`${r.display}: page written to ${o.output}\n`);
      printDiagnostics(r);
    } else if (o.command === 'write') {
      const plan = planWrite(r.text, r.evaluation, { force: o.force });
      // Re-read just before writing: never overwrite a change made while we computed.
      const now = readFileSync(path, 'utf8');
      if (now !== r.text) {
        process.stderr.write(`${r.display}: changed while its results were computed; not written (run again)\n`);
        code = Math.max(code, 1);  // 1: not every region was written
        continue;
      }
      if (plan.edits.length > 0) writeFileAtomic(path, plan.text);
      const changed = plan.edits.length;
      const current = plan.statuses.filter((s) => s.state === 'current').length;
      process.stdout.write(`${r.display}: ${changed} region${changed === 1 ? '' : 's'} written, ${current} already current${plan.skipped.length ? `, ${plan.skipped.length} left alone` : ''}\n`);
      const skipCode: Record<string, string> = { edited: 'OB502', damaged: 'OB502', unclosed: 'OB110' };
      for (const s of plan.skipped) process.stderr.write(`${pos(r, s.fenceLine, 0)}: warning ${skipCode[s.state] ?? 'OB504'}: ${s.message}\n`);
      if (plan.skipped.length > 0) code = Math.max(code, 1);  // 1: not every region was written
      printDiagnostics(r);
    } else {
      const statuses = regionStatuses(r.evaluation);
      for (const s of statuses) {
        if (s.state === 'current') continue;
        mismatches += 1;
        process.stdout.write(`${pos(r, s.fenceLine, 0)}: ${s.state}: ${s.message}\n`);
        if (s.state !== 'unclosed') {
          process.stdout.write(createTwoFilesPatch(`${r.display} (in the note)`, `${r.display} (recomputed)`, s.actual ? `${s.actual}\n` : '', `${s.expected}\n`, undefined, undefined, { context: 2 }));
        }
      }
      printDiagnostics(r);
      if (statuses.length > 0 && statuses.every((s) => s.state === 'current')) process.stdout.write(`${r.display}: ${statuses.length} region${statuses.length === 1 ? '' : 's'} current\n`);
    }
  }
  if (o.command === 'run' && o.json) process.stdout.write(`${JSON.stringify({ tool: 'orbit-notes', version: ORBIT_NOTES_VERSION, statements: json }, null, 2)}\n`);
  if (o.command === 'check' && mismatches > 0 && code === 0) code = 1;
  return code;
}

if (require.main === module) {
  main(process.argv.slice(2)).then((c) => { process.exitCode = c; }, (err: unknown) => {
    process.stderr.write(`orbit-notes: internal error: ${err instanceof Error ? err.stack ?? err.message : String(err)}\n`);
    process.exitCode = 2;
  });
}
