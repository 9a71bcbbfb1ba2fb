/**
 * Writing results back into a note. Only generated regions change: every other byte of
 * the note, line endings included, stays as it was. A region whose body no longer matches
 * the digest recorded in its marker was edited by hand: it is reported and left alone
 * unless the caller forces it.
 */
import { REGION_END, regionBeginLine } from '../language/extract.js';
import { digest } from './digest.js';
import type { BlockEvaluation, NoteEvaluation } from './note.js';

export type RegionState = 'current' | 'missing' | 'stale' | 'edited' | 'damaged' | 'unclosed';

export interface RegionStatus {
  readonly blockIndex: number;
  /** 0-based line of the block's opening fence. */
  readonly fenceLine: number;
  readonly blockName?: string;
  readonly state: RegionState;
  /** The region text the block's results render to (marker lines included, `\n` line ends). */
  readonly expected: string;
  /** The region text found in the note, if any. */
  readonly actual?: string;
  readonly message: string;
}

/** Replace the characters [start, end) of the original text with `text`. */
export interface TextEdit {
  readonly start: number;
  readonly end: number;
  readonly text: string;
  /** 0-based line range [startLine, endLine) of the original text the edit replaces (insertions: equal). */
  readonly startLine: number;
  readonly endLine: number;
}

export interface WritePlan {
  readonly text: string;
  readonly edits: readonly TextEdit[];
  readonly statuses: readonly RegionStatus[];
  /** Regions that needed a change but were left alone (edited by hand, damaged, unclosed fence). */
  readonly skipped: readonly RegionStatus[];
}

/** The digest of a region body as recorded in its begin marker. */
export function bodyDigest(body: string): string {
  return digest('region-body', body).slice(0, 8);
}

/** The full region text (marker lines included) for a block evaluation, with `\n` line ends. */
export function regionText(b: BlockEvaluation): string {
  return [regionBeginLine(b.inputsDigest, bodyDigest(b.regionBody)), b.regionBody, REGION_END].join('\n');
}

/** Compare every block's stored region with what its results render to now. */
export function regionStatuses(evaluation: NoteEvaluation): RegionStatus[] {
  return evaluation.blocks.map((b) => statusOf(b));
}

function statusOf(b: BlockEvaluation): RegionStatus {
  const expected = regionText(b);
  const base = { blockIndex: b.block.index, fenceLine: b.block.fenceLine, ...(b.block.name ? { blockName: b.block.name } : {}), expected };
  const where = `block ${b.block.name ? `\`${b.block.name}\` ` : ''}at line ${b.block.fenceLine + 1}`;
  if (b.block.regionProblem === 'unclosed') return { ...base, state: 'unclosed', message: `${where}: the fence is not closed, so no results can be written` };
  if (b.block.regionProblem) return { ...base, state: 'damaged', message: `${where}: ${b.block.regionProblem}` };
  const r = b.block.region;
  if (!r) return { ...base, state: 'missing', message: `${where}: no results region yet` };
  const actual = [regionBeginLine(r.inputsDigest, r.bodyDigest), r.body, REGION_END].join('\n');
  if (bodyDigest(r.body) !== r.bodyDigest) {
    return { ...base, actual, state: 'edited', message: `${where}: the results region was edited by hand (its text no longer matches its recorded digest); edit the block instead, or overwrite with --force` };
  }
  if (actual !== expected) return { ...base, actual, state: 'stale', message: `${where}: the results region is out of date` };
  return { ...base, actual, state: 'current', message: `${where}: up to date` };
}

/** Offsets where each line of `text` starts; `\r\n`, `\r` and `\n` end lines, as in CommonMark. */
function lineStarts(text: string): number[] {
  const starts = [0];
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 13 && text.charCodeAt(i + 1) === 10) { starts.push(i + 2); i += 1; } else if (c === 10 || c === 13) starts.push(i + 1);
  }
  return starts;
}

/** The note's own line ending: that of its first line break, `\n` when it has none. */
export function eolOf(text: string): '\n' | '\r\n' {
  const i = text.indexOf('\n');
  return i > 0 && text[i - 1] === '\r' ? '\r\n' : '\n';
}

/**
 * Plan the write-back of every block's region.
 * @param options.force overwrite regions edited by hand
 */
export function planWrite(text: string, evaluation: NoteEvaluation, options: { readonly force?: boolean } = {}): WritePlan {
  const statuses = regionStatuses(evaluation);
  const starts = lineStarts(text);
  const eol = eolOf(text);
  const lineCount = starts.length; // the text after the last \n is a (possibly empty) line
  const offsetOfLine = (line: number): number => (line < lineCount ? starts[line]! : text.length);
  const edits: TextEdit[] = [];
  const skipped: RegionStatus[] = [];
  for (const s of statuses) {
    const b = evaluation.blocks[s.blockIndex]!;
    if (s.state === 'current') continue;
    if (s.state === 'unclosed' || s.state === 'damaged' || (s.state === 'edited' && !options.force)) { skipped.push(s); continue; }
    // Inside a list item or a quote, every region line carries the container's prefix.
    const prefix = b.block.prefix;
    const body = s.expected.split('\n').map((l) => (prefix === '' ? l : l === '' ? prefix.trimEnd() : prefix + l)).join(eol);
    const r = b.block.region;
    if (r && r.endLine !== undefined) {
      // Replace from the begin marker to the end of the end marker's text (its line break stays).
      const start = offsetOfLine(r.beginLine);
      const endLineStart = offsetOfLine(r.endLine);
      const endLineText = lineTextAt(text, starts, r.endLine);
      edits.push({ start, end: endLineStart + endLineText.length, text: body, startLine: r.beginLine, endLine: r.endLine + 1 });
    } else {
      // Insert after the closing fence line.
      const after = b.block.closeLine + 1;
      if (after < lineCount) {
        const at = offsetOfLine(after);
        edits.push({ start: at, end: at, text: body + eol, startLine: after, endLine: after });
      } else {
        // At the very end: a note without a final line break stays without one.
        const endsWithBreak = text.endsWith('\n') || text.endsWith('\r');
        edits.push({ start: text.length, end: text.length, text: endsWithBreak ? body + eol : eol + body, startLine: after, endLine: after });
      }
    }
  }
  edits.sort((a, b) => a.start - b.start);
  let out = '';
  let pos = 0;
  for (const e of edits) {
    out += text.slice(pos, e.start) + e.text;
    pos = e.end;
  }
  out += text.slice(pos);
  return { text: out, edits, statuses, skipped };
}

function lineTextAt(text: string, starts: readonly number[], line: number): string {
  const s = starts[line] ?? text.length;
  const next = starts[line + 1];
  return (next === undefined ? text.slice(s) : text.slice(s, next)).replace(/\r?\n$|\r$/, '');
}
