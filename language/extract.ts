/**
 * The one block extractor, used by the CLI, the extension and the preview alike:
 * finds `orbit` fences with markdown-it's block parser (so fences inside lists, after
 * indented code, in HTML blocks etc. follow CommonMark exactly) and the generated
 * result region that belongs to each.
 */
import MarkdownIt from 'markdown-it';
import type { Block } from './ast.js';

const md = new MarkdownIt('commonmark');

/** Region markers. The begin line carries the input digest and a digest of the body as written. */
export const REGION_BEGIN_PREFIX = '<!-- orbit results';
export const REGION_END = '<!-- orbit results end -->';
const BEGIN_RE = /^<!-- orbit results · inputs ([0-9a-f]{8,}) · body ([0-9a-f]{8,}) · (.*)-->\s*$/;
const END_RE = /^<!-- orbit results end -->\s*$/;

/** A generated region found in the note. Lines are 0-based document lines. */
export interface Region {
  readonly beginLine: number;
  /** Line of the end marker (or undefined when the end marker is missing). */
  readonly endLine: number | undefined;
  readonly inputsDigest: string;
  readonly bodyDigest: string;
  /** Text between the marker lines, joined with `\n`. */
  readonly body: string;
}

export interface ExtractedBlock extends Block {
  /** Columns the opening fence is indented by. `content` keeps document columns already. */
  readonly indent: number;
  /**
   * What each line of the block's container starts with: spaces for a list item or an
   * indented fence, `> ` in a block quote. The results region is written with it, so it
   * stays inside the same container.
   */
  readonly prefix: string;
  readonly region?: Region;
  /** A begin marker without an end marker, or other region damage. */
  readonly regionProblem?: string;
}

/** Lines as CommonMark (and the editor) count them: `\r\n`, `\r` and `\n` all end a line. */
export { splitLines } from './lexer.js';
import { splitLines } from './lexer.js';

/** Does an info string name an orbit block? Returns the block name ('' if none) or undefined. */
export function orbitInfo(info: string): string | undefined {
  const m = /^orbit(?:\s+(\S+))?\s*$/.exec(info.trim());
  if (!m) return undefined;
  return m[1] ?? '';
}

/** Find every `orbit` block of a note, in document order, with its result region. */
export function extractBlocks(text: string): ExtractedBlock[] {
  const tokens = md.parse(text, {});
  const lines = splitLines(text);
  const out: ExtractedBlock[] = [];
  for (const t of tokens) {
    if (t.type !== 'fence' || !t.map) continue;
    const name = orbitInfo(t.info);
    if (name === undefined) continue;
    const [start, endExclusive] = t.map;
    const fenceLineText = lines[start] ?? '';
    const indent = fenceLineText.length - fenceLineText.trimStart().length;
    // markdown-it's map ends after the closing fence; an unclosed fence runs to the end.
    const closeLine = endExclusive - 1;
    // The container prefix of the fence: indentation, `> ` of a quote; list markers become spaces.
    const markerAt = fenceLineText.indexOf(t.markup);
    const prefix = (markerAt > 0 ? fenceLineText.slice(0, markerAt) : '').replace(/[^\s>]/g, ' ');
    const closeText = (lines[closeLine] ?? '').replace(/^[\s>]*/, '').trimEnd();
    const closed = closeLine > start && /^(`{3,}|~{3,})$/.test(closeText) && closeText[0] === t.markup[0] && closeText.length >= t.markup.length;
    // Keep document columns: each content line is the source line with its container
    // prefix (fence indentation, list indentation, `> ` of a block quote) blanked out, so
    // every range the parser reports is a true document position.
    const contentLines = t.content.replace(/\n$/, '').split('\n');
    const content = (t.content === '' ? [] : contentLines).map((c, i) => {
      const raw = lines[start + 1 + i] ?? '';
      // A tab in the indentation can be split by CommonMark; keep the source's own
      // whitespace then, so the line keeps its length.
      const body = raw.endsWith(c) ? c : c.trimStart();
      if (!raw.endsWith(body)) return c;
      return raw.slice(0, raw.length - body.length).replace(/[^\t ]/g, ' ') + body;
    }).join('\n');
    const block: ExtractedBlock = {
      ...(name !== '' ? { name } : {}),
      fenceLine: start,
      closeLine,
      contentStartLine: start + 1,
      content,
      index: out.length,
      indent,
      prefix,
      ...(closed ? {} : { regionProblem: 'unclosed' }),
    };
    out.push(closed ? withRegion(block, lines) : block);
  }
  return out;
}

function withRegion(block: ExtractedBlock, allLines: readonly string[]): ExtractedBlock {
  // Lines of the block's container without its prefix; undefined once the container ends.
  const p = block.prefix;
  const line = (i: number): string | undefined => {
    const l = allLines[i];
    if (l === undefined || p === '') return l;
    if (l.startsWith(p)) return l.slice(p.length);
    if (l === p.trimEnd()) return '';
    return undefined;
  };
  // The region starts on the line right after the closing fence, or after one blank line.
  let i = block.closeLine + 1;
  if ((line(i) ?? 'x').trim() === '' && (line(i + 1) ?? '').startsWith(REGION_BEGIN_PREFIX)) i += 1;
  const beginText = line(i) ?? '';
  if (!beginText.startsWith(REGION_BEGIN_PREFIX) || END_RE.test(beginText)) return block;
  const m = BEGIN_RE.exec(beginText);
  if (!m) return { ...block, regionProblem: `the results marker on line ${i + 1} is damaged; delete the region and write results again` };
  let end: number | undefined;
  const body: string[] = [];
  for (let j = i + 1; j < allLines.length; j++) {
    const l = line(j);
    if (l === undefined) break;
    if (END_RE.test(l)) { end = j; break; }
    if (l.startsWith(REGION_BEGIN_PREFIX) || /^(`{3,}|~{3,})\s*orbit\b/.test(l.trim())) break;
    body.push(l);
  }
  if (end === undefined) {
    return { ...block, regionProblem: `the results region starting on line ${i + 1} has no end marker \`${REGION_END}\`` };
  }
  return { ...block, region: { beginLine: i, endLine: end, inputsDigest: m[1]!, bodyDigest: m[2]!, body: body.join('\n') } };
}

/** The begin marker line for given digests. */
export function regionBeginLine(inputsDigest: string, bodyDigest: string): string {
  return `${REGION_BEGIN_PREFIX} · inputs ${inputsDigest} · body ${bodyDigest} · generated from the block above; edit the block, not this -->`;
}
