/**
 * Lines, statements and tokens of an `orbit` block.
 *
 * A statement may run over several physical lines (a line indented deeper than the
 * statement line continues it), so the lexer works on the statement's lines joined
 * with `\n` and maps offsets back to document positions through {@link StatementSource}.
 * Tokens are produced on demand: dates are read by the parser straight from the text,
 * because `2031-03-14` is not a sequence of expression tokens.
 */
import type { Position, Range } from './ast.js';

/** One physical line of a statement, with where it starts in the joined text. */
export interface SourceLine {
  /** 0-based document line. */
  readonly line: number;
  /** Full text of the line (without its line break). */
  readonly text: string;
  /** Offset of the line's first character in {@link StatementSource.text}. */
  readonly offset: number;
}

/** The text of one statement (its lines joined by `\n`) and the offset → position map. */
export class StatementSource {
  readonly text: string;
  constructor(readonly lines: readonly SourceLine[]) {
    this.text = lines.map((l) => l.text).join('\n');
  }

  /** Document position of an offset in {@link text}; offsets past the end clamp to the last line's end. */
  position(offset: number): Position {
    // Binary search: a statement may run over many continuation lines.
    let lo = 0;
    let hi = this.lines.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.lines[mid]!.offset <= offset) lo = mid;
      else hi = mid - 1;
    }
    const seg = this.lines[lo]!;
    const character = Math.max(0, Math.min(offset - seg.offset, seg.text.length));
    return { line: seg.line, character };
  }

  /** Document range of the offsets [start, end). */
  range(start: number, end: number): Range {
    return { start: this.position(start), end: this.position(Math.max(start, end)) };
  }
}

/** Split block content into physical lines the way the editor does (`\r\n`, `\r` or `\n`). */
export function splitLines(content: string): string[] {
  return content.split(/\r\n|\r|\n/);
}

/** Visual indentation width of a line (a tab advances to the next multiple of 4; common practice). */
export function indentWidth(text: string): number {
  let w = 0;
  for (const ch of text) {
    if (ch === ' ') w += 1;
    else if (ch === '\t') w += 4 - (w % 4);
    else break;
  }
  return w;
}

/** True for a line that holds nothing but whitespace or a `#` comment. */
export function isTrivialLine(text: string): boolean {
  const t = text.trimStart();
  return t === '' || t.startsWith('#');
}

/**
 * Group a block's lines into statements: a line indented deeper than the statement line
 * continues it; blank and comment-only lines are skipped (they neither start nor end one).
 * @param contentStartLine document line of the block's first content line.
 */
export function splitStatements(content: string, contentStartLine: number): StatementSource[] {
  const out: StatementSource[] = [];
  let current: SourceLine[] | undefined;
  let currentIndent = 0;
  let offset = 0;
  splitLines(content).forEach((text, i) => {
    if (isTrivialLine(text)) return;
    const indent = indentWidth(text);
    if (current && indent > currentIndent) {
      current.push({ line: contentStartLine + i, text, offset });
      offset += text.length + 1;
      return;
    }
    if (current) out.push(new StatementSource(current));
    current = [{ line: contentStartLine + i, text, offset: 0 }];
    currentIndent = indent;
    offset = text.length + 1;
  });
  if (current) out.push(new StatementSource(current));
  return out;
}

export type TokenType = 'ident' | 'number' | 'string' | 'op' | 'unknown' | 'eof';

export interface Token {
  readonly type: TokenType;
  /** Text as written (for strings: with the quotes). */
  readonly text: string;
  /** Offsets in the statement text, [start, end). */
  readonly start: number;
  readonly end: number;
  /** Whitespace, a comment or a line break precedes the token. */
  readonly spaceBefore: boolean;
  /** For strings: whether the closing quote was found on the same line. */
  readonly closed?: boolean;
}

const IDENT = /[\p{L}_][\p{L}\p{N}_]*/uy;
/** Option words may contain hyphens (`up-to`, `seen-from`, `time-unit`). */
const WORD = /[\p{L}_][\p{L}\p{N}_]*(?:-[\p{L}_][\p{L}\p{N}_]*)*/uy;
const NUMBER = /(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?/y;
const OPS = new Set(['+', '-', '*', '/', '(', ')', ',', '=', '±', '°']);

/** Offset of the first character at or after `offset` that is not whitespace or part of a `#` comment. */
export function skipTrivia(text: string, offset: number): number {
  let i = offset;
  while (i < text.length) {
    const ch = text[i]!;
    if (ch === '#') {
      const nl = text.indexOf('\n', i);
      i = nl < 0 ? text.length : nl;
    } else if (/\s/u.test(ch)) {
      i += 1;
    } else {
      break;
    }
  }
  return i;
}

function sticky(re: RegExp, text: string, at: number): string | undefined {
  re.lastIndex = at;
  const m = re.exec(text);
  return m ? m[0] : undefined;
}

/**
 * The token starting at or after `offset`.
 * @param words read hyphenated option words (`seen-from`) as one identifier.
 */
export function lexAt(text: string, offset: number, words = false): Token {
  const start = skipTrivia(text, offset);
  const spaceBefore = start > offset || offset === 0;
  if (start >= text.length) return { type: 'eof', text: '', start, end: start, spaceBefore };
  const ch = text[start]!;
  const ident = sticky(words ? WORD : IDENT, text, start);
  if (ident !== undefined) return { type: 'ident', text: ident, start, end: start + ident.length, spaceBefore };
  const num = sticky(NUMBER, text, start);
  if (num !== undefined) return { type: 'number', text: num, start, end: start + num.length, spaceBefore };
  if (ch === '"') {
    const nl = text.indexOf('\n', start);
    const lineEnd = nl < 0 ? text.length : nl;
    const close = text.indexOf('"', start + 1);
    if (close >= 0 && close < lineEnd) {
      return { type: 'string', text: text.slice(start, close + 1), start, end: close + 1, spaceBefore, closed: true };
    }
    return { type: 'string', text: text.slice(start, lineEnd), start, end: lineEnd, spaceBefore, closed: false };
  }
  if (OPS.has(ch)) return { type: 'op', text: ch, start, end: start + 1, spaceBefore };
  // One code point (a surrogate pair stays whole, so ranges never split a character).
  const cp = String.fromCodePoint(text.codePointAt(start)!);
  return { type: 'unknown', text: cp, start, end: start + cp.length, spaceBefore };
}

/** Every token of a text (for completion and tests). */
export function tokenize(text: string, words = false): Token[] {
  const out: Token[] = [];
  let at = 0;
  for (;;) {
    const t = lexAt(text, at, words);
    if (t.type === 'eof') return out;
    out.push(t);
    at = t.end;
  }
}
