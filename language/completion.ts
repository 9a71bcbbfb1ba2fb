/**
 * Completion inside `orbit` blocks (pure): statement keywords at the start of a line,
 * the option words a statement still accepts after its operands, bodies and names where
 * an operand goes, units after a number. Items are not filtered by the word being typed:
 * the editor filters (fuzzily) by the word at the cursor.
 */
import { lookupUnit, UNIT_NAMES } from '../compute/quantity.js';
import { STATEMENT_KEYWORDS, type Position, type StatementKind } from './ast.js';
import { indentWidth, isTrivialLine, splitLines, splitStatements, StatementSource, tokenize, type Token } from './lexer.js';
import { FUNCTIONS, isUnit, OPTION_VALUES, STATEMENT_OPTIONS } from './parser.js';

export type CompletionKind = 'keyword' | 'option' | 'body' | 'name' | 'unit';

export interface CompletionItem {
  readonly label: string;
  readonly kind: CompletionKind;
  /** One line shown beside the label. */
  readonly detail: string;
}

export interface CompletionContext {
  /** Names defined before the cursor (`let`, `body`, `series`). */
  readonly names: readonly string[];
  /** Bodies by name: built-in and user-defined. */
  readonly bodies: readonly string[];
}

/** The written form of each statement, shown as the keyword's detail. */
export const STATEMENT_SYNTAX: Readonly<Record<StatementKind, string>> = {
  date: 'date D — one instant in both calendars, JD in UT and TT, ΔT',
  let: 'let NAME = EXPR — a named quantity',
  body: 'body NAME period Q [± Q] [mass Q] — a body known by its period',
  synodic: 'synodic A B [from D to D] — synodic period of two bodies or periods',
  ratio: 'ratio A B [up-to N] — period ratio and its convergents',
  relation: 'relation A B C … [up-to K] [top M] — integer relations among mean motions',
  conjunctions: 'conjunctions A B from D to D [seen-from sun|earth] [within ANGLE]',
  oppositions: 'oppositions A from D to D — oppositions of a superior planet',
  alignment: 'alignment A B … [against C …] within ANGLE from D to D [seen-from sun|earth]',
  barycentre: "barycentre from D to D [step Q] — the Sun's offset from the barycentre",
  series: 'series NAME from "PATH" time COL value COL [time-unit yr|d|jd]',
  periodogram: 'periodogram NAME [periods P to P] [peaks M] [mark EXPR, …]',
  set: 'set seed N | set calendar gregorian|mixed',
};

const OPTION_DETAIL: Readonly<Record<string, string>> = {
  from: 'from D to D — the span searched',
  to: 'to D — end of the span',
  'up-to': 'up-to N — largest denominator or coefficient',
  top: 'top M — how many relations to list',
  'seen-from': 'seen-from sun|earth — point of view (default sun)',
  within: 'within ANGLE — largest separation',
  against: 'against C … — bodies on the opposite side',
  step: 'step Q — sampling step',
  time: 'time COL — the time column',
  value: 'value COL — the value column',
  'time-unit': 'time-unit yr|d|jd — unit of the time column',
  periods: 'periods P to P — range of trial periods',
  peaks: 'peaks M — how many peaks to list',
  mark: 'mark EXPR, … — periods to mark on the plot',
  period: 'period Q [± Q] — orbital period',
  mass: 'mass Q — mass',
  seed: 'seed N — seed of every Monte-Carlo figure',
  calendar: 'calendar gregorian|mixed — calendar of dates',
  sun: 'heliocentric', earth: 'geocentric', gregorian: 'proleptic Gregorian calendar',
  mixed: 'Julian before 1582-10-15, Gregorian after', yr: 'decimal years', d: 'days', jd: 'Julian Dates',
};

const DIM_DETAIL: Readonly<Record<string, string>> = {
  time: 'time', angle: 'angle', frequency: 'frequency', 'angular-rate': 'angular rate', length: 'length', none: '',
};

function unitItems(): CompletionItem[] {
  return UNIT_NAMES.map((u) => ({ label: u, kind: 'unit' as const, detail: DIM_DETAIL[lookupUnit(u)?.dim ?? 'none'] ?? '' }));
}

function optionItems(words: readonly string[]): CompletionItem[] {
  return words.map((w) => ({ label: w, kind: 'option' as const, detail: OPTION_DETAIL[w] ?? '' }));
}

function operandItems(ctx: CompletionContext, withNames: boolean, withFunctions: boolean): CompletionItem[] {
  const out: CompletionItem[] = ctx.bodies.map((b) => ({ label: b, kind: 'body' as const, detail: 'body' }));
  const bodies = new Set(ctx.bodies);
  if (withNames) for (const n of ctx.names) if (!bodies.has(n)) out.push({ label: n, kind: 'name', detail: 'defined name' });
  if (withFunctions) {
    for (const [f, n] of Object.entries(FUNCTIONS)) out.push({ label: f, kind: 'keyword', detail: f === 'abs' ? 'abs(x)' : n === 1 ? `${f}(B)` : `${f}(A, B)` });
  }
  return out;
}

function keywordItems(): CompletionItem[] {
  return STATEMENT_KEYWORDS.map((k) => ({ label: k, kind: 'keyword' as const, detail: STATEMENT_SYNTAX[k] }));
}

/** The statement the cursor is in, cut at the cursor, and whether the cursor line starts it. */
function statementPrefix(lines: readonly string[], index: number, head: string, contentStartLine: number): { source: StatementSource; newStatement: boolean } {
  const groups = splitStatements([...lines.slice(0, index), head].join('\n'), contentStartLine);
  const last = groups[groups.length - 1];
  const cursorLine = contentStartLine + index;
  if (isTrivialLine(head)) {
    // A blank line: continues the statement above when indented deeper than its first line.
    if (last && indentWidth(head) > indentWidth(last.lines[0]!.text)) {
      const end = last.text.length + 1;
      return { source: new StatementSource([...last.lines, { line: cursorLine, text: head, offset: end }]), newStatement: false };
    }
    return { source: new StatementSource([{ line: cursorLine, text: head, offset: 0 }]), newStatement: true };
  }
  return { source: last!, newStatement: last!.lines[0]!.line === cursorLine };
}

/** Whether the cursor is inside a comment or an unclosed string on its line. */
function inCommentOrString(head: string): boolean {
  let inString = false;
  for (const ch of head) {
    if (ch === '"') inString = !inString;
    else if (ch === '#' && !inString) return true;
  }
  return inString;
}

/** Skip a call's parenthesised arguments starting at `tokens[i]` (the `(`); returns the index after `)`. */
function skipParens(tokens: readonly Token[], i: number): number {
  let depth = 0;
  for (let j = i; j < tokens.length; j++) {
    const t = tokens[j]!;
    if (t.type === 'op' && t.text === '(') depth += 1;
    if (t.type === 'op' && t.text === ')') { depth -= 1; if (depth === 0) return j + 1; }
  }
  return tokens.length;
}

interface OperandScan {
  /** Complete operands read. */
  readonly count: number;
  /** The last token was a number still waiting for its unit. */
  readonly afterNumber: boolean;
}

/** Count operands (`jupiter`, `11.86 yr ± 0.01`, `period(b)`, `a * 2`) in a token run. */
function scanOperands(tokens: readonly Token[]): OperandScan {
  let count = 0;
  // After an operator (or ±) the next value continues the current operand; otherwise it starts one.
  let continues = false;
  let afterNumber = false;
  for (let i = 0; i < tokens.length;) {
    const t = tokens[i]!;
    const n = tokens[i + 1];
    const primary = t.type === 'number' || (t.type === 'ident' && !(afterNumber && isUnit(t.text))) || (t.type === 'op' && t.text === '(');
    if (primary) {
      if (!continues) count += 1;
      continues = false;
      afterNumber = t.type === 'number';
      i = t.type === 'op' ? skipParens(tokens, i) : t.type === 'ident' && n?.type === 'op' && n.text === '(' ? skipParens(tokens, i + 1) : i + 1;
      continue;
    }
    afterNumber = false;
    if (t.type === 'op' && t.text === '+' && n?.type === 'op' && n.text === '-' && !n.spaceBefore) { i += 2; continues = true; continue; }
    if (t.type === 'op' && ['+', '-', '*', '/', ',', '±'].includes(t.text)) continues = true;
    i += 1;
  }
  return { count, afterNumber };
}

/**
 * Completions at a position in a block.
 * @param content the block's content (between the fences).
 * @param contentStartLine 0-based document line of the first content line.
 * @param position the cursor, in document coordinates.
 * @returns items valid at the cursor; empty inside comments and strings or outside the block.
 */
export function complete(content: string, contentStartLine: number, position: Position, ctx: CompletionContext): CompletionItem[] {
  const lines = splitLines(content);
  const index = position.line - contentStartLine;
  if (index < 0 || index >= lines.length) return [];
  const character = Math.min(position.character, lines[index]!.length);
  const head = lines[index]!.slice(0, character);
  if (inCommentOrString(head)) return [];
  const prefix = statementPrefix(lines, index, head, contentStartLine);
  const all = tokenize(prefix.source.text, true);
  // Drop the word being typed: it is what the items replace.
  const text = prefix.source.text;
  const last = all[all.length - 1];
  const typing = last !== undefined && last.end === text.length && last.type === 'ident';
  const tokens = typing ? all.slice(0, -1) : all;
  if (tokens.length === 0) return prefix.newStatement ? keywordItems() : [];
  const kw = STATEMENT_KEYWORDS.find((k) => k === tokens[0]!.text);
  if (kw === undefined) return [];
  return completeStatement(kw, tokens.slice(1), ctx);
}

const INTEGER_OPTIONS = new Set(['up-to', 'top', 'peaks', 'seed']);
const QUANTITY_OPTIONS = new Set(['within', 'step', 'period', 'mass', 'periods', 'mark']);

function completeStatement(kw: StatementKind, tokens: readonly Token[], ctx: CompletionContext): CompletionItem[] {
  const options = STATEMENT_OPTIONS[kw];
  const lastTok = tokens[tokens.length - 1];
  const afterNumber = lastTok?.type === 'number';
  if (kw === 'date') return [];
  if (kw === 'set') {
    if (tokens.length === 0) return optionItems(OPTION_VALUES.set);
    if (tokens.length === 1 && tokens[0]!.text === 'calendar') return optionItems(OPTION_VALUES.calendar);
    return [];
  }
  if (kw === 'let') {
    const eq = tokens.findIndex((t) => t.type === 'op' && t.text === '=');
    if (eq < 0) return [];
    if (afterNumber) return unitItems();
    return operandItems(ctx, true, true);
  }
  // Split at the first option word: operands before, clauses after.
  const firstOpt = tokens.findIndex((t, i) => t.type === 'ident' && options.includes(t.text) && !(tokens[i + 1]?.type === 'op' && tokens[i + 1]!.text === '('));
  const positional = firstOpt < 0 ? tokens : tokens.slice(0, firstOpt);
  const used = new Set(tokens.filter((t) => t.type === 'ident' && options.includes(t.text)).map((t) => t.text));
  const remaining = options.filter((o) => !used.has(o));

  if (firstOpt < 0) {
    const scan = scanOperands(positional);
    if (scan.afterNumber) return unitItems();
    switch (kw) {
      case 'synodic': case 'ratio':
        return scan.count < 2 ? operandItems(ctx, true, true) : optionItems(remaining);
      case 'relation':
        return [...operandItems(ctx, true, true), ...(scan.count >= 2 ? optionItems(remaining) : [])];
      case 'conjunctions':
        return scan.count < 2 ? operandItems(ctx, false, false) : optionItems(remaining);
      case 'oppositions':
        return scan.count < 1 ? operandItems(ctx, false, false) : optionItems(remaining);
      case 'alignment':
        return [...operandItems(ctx, false, false), ...(scan.count >= 1 ? optionItems(remaining) : [])];
      case 'barycentre':
        return optionItems(remaining);
      case 'body': case 'series':
        return scan.count < 1 ? [] : optionItems(remaining);
      case 'periodogram':
        return scan.count < 1 ? ctx.names.map((n) => ({ label: n, kind: 'name' as const, detail: 'defined name' })) : optionItems(remaining);
    }
  }

  // Inside the clause of the last option word.
  let clauseAt = tokens.length - 1;
  while (clauseAt >= 0 && !(tokens[clauseAt]!.type === 'ident' && options.includes(tokens[clauseAt]!.text))) clauseAt -= 1;
  const clause = tokens[clauseAt]!.text;
  const args = tokens.slice(clauseAt + 1);
  const more = optionItems(remaining);
  switch (clause) {
    case 'from': {
      if (kw === 'series') return args.length === 0 ? [] : more;
      const to = args.findIndex((t) => t.type === 'ident' && t.text === 'to');
      if (args.length === 0) return [];
      if (to < 0) return optionItems(['to']);
      return to === args.length - 1 ? [] : more;
    }
    case 'seen-from':
      return args.length === 0 ? optionItems(OPTION_VALUES['seen-from']) : more;
    case 'time-unit':
      return args.length === 0 ? OPTION_VALUES['time-unit'].map((u) => ({ label: u, kind: 'unit' as const, detail: OPTION_DETAIL[u] ?? '' })) : more;
    case 'against': {
      const bodies = operandItems(ctx, false, false);
      return args.length === 0 ? bodies : [...bodies, ...more];
    }
    case 'time': case 'value':
      return args.length === 0 ? [] : more;
    default: {
      if (INTEGER_OPTIONS.has(clause)) return args.length === 0 ? [] : more;
      if (QUANTITY_OPTIONS.has(clause)) {
        if (afterNumber && clause !== 'mass') return unitItems();
        if (args.length === 0) return clause === 'mark' ? operandItems(ctx, true, true) : [];
        const lastArg = args[args.length - 1]!;
        if (lastArg.type === 'op' && lastArg.text === ',') return operandItems(ctx, true, true);
        if (clause === 'periods' && !args.some((t) => t.type === 'ident' && t.text === 'to')) return optionItems(['to']);
        if (lastArg.type === 'ident' && lastArg.text === 'to') return [];
        return more;
      }
      return more;
    }
  }
}
