/**
 * Parser of `orbit` blocks: block content → statements (language/ast.ts) and diagnostics.
 *
 * One statement per line; a line indented deeper than the statement line continues it;
 * `#` starts a comment; blank lines are ignored. A statement with an error yields
 * diagnostics and no statement, and never stops the statements after it. Names are not
 * resolved here (the evaluator does that); units are checked against compute/quantity.ts.
 */
import { lookupUnit, UNIT_NAMES } from '../compute/quantity.js';
import { STATEMENT_KEYWORDS, type DateLit, type Expr, type Ident, type Range, type SeenFrom, type Statement, type StatementKind } from './ast.js';
import { Code, diag, suggest, type Diagnostic } from './diagnostics.js';
import { lexAt, skipTrivia, splitStatements, type StatementSource, type Token } from './lexer.js';

/** Option words each statement accepts after its operands (`to` belongs to `from` and `periods`). */
export const STATEMENT_OPTIONS: Readonly<Record<StatementKind, readonly string[]>> = {
  date: [],
  let: [],
  body: ['period', 'mass'],
  synodic: ['from'],
  ratio: ['up-to'],
  relation: ['up-to', 'top'],
  conjunctions: ['from', 'seen-from', 'within'],
  oppositions: ['from'],
  alignment: ['against', 'within', 'from', 'seen-from'],
  barycentre: ['from', 'step'],
  series: ['from', 'time', 'value', 'time-unit'],
  periodogram: ['periods', 'peaks', 'mark'],
  set: [],
};

/** What each statement takes before its options, for messages. */
const OPERANDS: Readonly<Record<StatementKind, string>> = {
  date: 'a date', let: 'a name, `=` and a value', body: 'a name', synodic: 'two bodies or periods',
  ratio: 'two bodies or periods', relation: 'two or more bodies or periods', conjunctions: 'two bodies',
  oppositions: 'one body', alignment: 'one or more bodies', barycentre: 'no operands', series: 'a name',
  periodogram: 'a series name', set: 'a setting',
};

/** Every option word of every statement, plus `to`. */
export const OPTION_WORDS: readonly string[] = [...new Set([...Object.values(STATEMENT_OPTIONS).flat(), 'to'])];

/** Functions callable in expressions, with their number of arguments. */
export const FUNCTIONS: Readonly<Record<string, number>> = { period: 1, frequency: 1, synodic: 2, abs: 1 };

/** Values of the enumerated options. */
export const OPTION_VALUES = {
  'seen-from': ['sun', 'earth'] as const,
  'time-unit': ['yr', 'd', 'jd'] as const,
  calendar: ['gregorian', 'mixed'] as const,
  set: ['seed', 'calendar'] as const,
};

/** Default of `series … time-unit` when it is left out: days, the base time unit of compute/. */
export const DEFAULT_TIME_UNIT = 'd';

/** A statement that failed to parse, so the evaluator can flag later uses of the name it defines. */
export interface FailedStatement {
  readonly kind?: StatementKind;
  /** The name a failed `let`, `body` or `series` would have defined. */
  readonly definedName?: string;
  readonly range: Range;
}

export interface ParseOptions {
  /**
   * Names known to be bodies or quantities at this block (built-in bodies, earlier
   * definitions). Used only to tell an operand from a mistyped option word in operand
   * lists (`relation b c d topp 3`); the parser resolves no names.
   */
  readonly knownNames?: ReadonlySet<string>;
}

export interface ParseResult {
  /** Statements that parsed without error, in block order. */
  readonly statements: Statement[];
  /** Every syntax diagnostic, ranges in document coordinates, in block order. */
  readonly diagnostics: Diagnostic[];
  /** Statements that produced errors (and so are absent from `statements`). */
  readonly failed: FailedStatement[];
}

/** Hints for unit spellings that are not units (common spellings; our own table). */
const UNIT_ALIASES: ReadonlyMap<string, string> = new Map(Object.entries({
  y: 'yr', yrs: 'yr', year: 'yr', years: 'yr', day: 'd', days: 'd', hr: 'h', hrs: 'h', hour: 'h', hours: 'h',
  sec: 's', second: 's', seconds: 's', m: 'min', mins: 'min', minute: 'min', minutes: 'min', degree: 'deg',
  degrees: 'deg', radian: 'rad', radians: 'rad', arcminute: 'arcmin', arcsecond: 'arcsec',
  solar_radius: 'rsun', rsol: 'rsun', r_sun: 'rsun', kilometres: 'km', kilometers: 'km',
}));

/**
 * The unit a word not in the language was probably meant to be (`years` → `yr`,
 * `AU` → `au`, `dg` → `deg`), or undefined. One-letter words get no edit-distance guess.
 */
export function unitHint(word: string): string | undefined {
  const lower = word.toLowerCase();
  if (isUnit(lower)) return lower;
  return UNIT_ALIASES.get(lower) ?? (word.length >= 2 ? suggest(word, UNIT_NAMES) : undefined);
}

/**
 * Whether a spelling is a unit. Guards against inherited object keys (`toString`), which
 * `lookupUnit`'s `in` test would otherwise accept.
 */
export function isUnit(spelling: string): boolean {
  const u = lookupUnit(spelling);
  return u !== undefined && typeof u.factor === 'number' && Number.isFinite(u.factor);
}

const STOP_WORDS: ReadonlySet<string> = new Set(OPTION_WORDS);

class Abort extends Error {
  constructor() { super('statement aborted'); this.name = 'Abort'; }
}

function code(s: string): string { return `\`${s}\``; }

/** ` — did you mean `x`?` or `.`, to end the first sentence of a message. */
function meanHint(s: string | undefined): string { return s ? ` — did you mean ${code(s)}?` : '.'; }

const EXAMPLE_DATES = '`2031-03-14`, `2031-03-14T06:30Z`, `JD 2451545.0` or a year such as `1850`';

const JD_RE = /(JD|jd)[ \t]+([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)(?:[ \t]+(TT|UTC)(?![\p{L}\p{N}_]))?/duy;
const CAL_RE = /([+-]?\d+)(?:-(\d{1,2})(?:-(\d{1,2})(?:(?:T|[ \t]+(?=\d{1,2}:))(\d{1,2}):(\d{2})(?::(\d{2}(?:\.\d+)?))?(Z)?)?)?)?(?:[ \t]+(TT|UTC)(?![\p{L}\p{N}_]))?/duy;

/** Mutable builder of a number literal before it becomes an {@link Expr}. */
interface NumberParts { value: number; unit?: string; unitRange?: Range; sigma?: number; sigmaUnit?: string }

class StatementParser {
  private pos = 0;
  private lastStart = 0;
  private lastEnd = 0;
  private failed = false;
  kind: StatementKind | undefined;
  definedName: string | undefined;
  private keywordTok: Token | undefined;
  /** Source text of each number literal, for hints that repeat what the user wrote. */
  private readonly numberText = new WeakMap<Expr, string>();

  constructor(
    private readonly src: StatementSource,
    private readonly diags: Diagnostic[],
    private readonly known: ReadonlySet<string>,
  ) {}

  private get text(): string { return this.src.text; }

  // ---- tokens -------------------------------------------------------------

  private peeked: { pos: number; words: boolean; token: Token } | undefined;

  private peek(words = false): Token {
    const c = this.peeked;
    if (c && c.pos === this.pos && c.words === words) return c.token;
    const token = lexAt(this.text, this.pos, words);
    this.peeked = { pos: this.pos, words, token };
    return token;
  }

  private take(t: Token): Token {
    this.pos = t.end;
    this.lastStart = t.start;
    this.lastEnd = t.end;
    return t;
  }

  private isOp(t: Token, op: string): boolean { return t.type === 'op' && t.text === op; }

  private range(start: number, end: number): Range { return this.src.range(start, end); }

  private describe(t: Token): string {
    if (t.type === 'eof') return 'the end of the statement';
    if (t.type === 'string') return 'a string';
    return code(t.text);
  }

  private error(c: Code, message: string, start: number, end: number): void {
    this.failed = true;
    this.diags.push(diag(c, 'error', message, this.range(start, end)));
  }

  private fatal(c: Code, message: string, start: number, end: number): never {
    this.error(c, message, start, end);
    throw new Abort();
  }

  /** Error at `t`, or at the last token read when the statement ended early. */
  private fatalAt(t: Token, c: Code, message: string): never {
    if (t.type === 'eof') this.fatal(c === Code.UnexpectedToken ? Code.MissingArgument : c, message, this.lastStart, this.lastEnd);
    this.fatal(c, message, t.start, t.end);
  }

  // ---- statement ----------------------------------------------------------

  /** Parse the whole statement; returns undefined when any error was reported. */
  parse(): Statement | undefined {
    try {
      const s = this.statement();
      return this.failed ? undefined : s;
    } catch (e) {
      if (e instanceof Abort) return undefined;
      const kw = this.keywordTok;
      this.failed = true;
      this.diags.push(diag(Code.Internal, 'error', `internal parser error: ${e instanceof Error ? e.message : String(e)}`, this.range(kw?.start ?? 0, kw?.end ?? 0)));
      return undefined;
    }
  }

  get ok(): boolean { return !this.failed; }

  private statement(): Statement {
    const t = this.peek();
    const word = this.peek(true);
    const list = STATEMENT_KEYWORDS.join(', ');
    if (t.type !== 'ident') {
      this.fatal(Code.UnknownStatement, `a statement starts with a keyword (${list}); found ${this.describe(t)}`, t.start, t.end);
    }
    const kw = STATEMENT_KEYWORDS.find((k) => k === t.text);
    if (kw === undefined || word.text !== t.text) {
      const s = suggest(word.text, STATEMENT_KEYWORDS);
      this.fatal(Code.UnknownStatement, `unknown statement ${code(word.text)}${meanHint(s)} Statements are: ${list}`, word.start, word.end);
    }
    this.kind = kw;
    this.keywordTok = this.take(t);
    const start = t.start;
    const r = (): Range => this.range(start, this.lastEnd);
    switch (kw) {
      case 'date': {
        const date = this.date('date');
        this.end();
        return { kind: 'date', date, range: r() };
      }
      case 'let': {
        const name = this.name('a name after `let`, e.g. `let p = 11.86 yr`');
        this.definedName = name.name;
        const eq = this.peek();
        if (!this.isOp(eq, '=')) this.fatalAt(eq, Code.UnexpectedToken, `expected \`=\` after \`let ${name.name}\`, e.g. \`let ${name.name} = 11.86 yr\`; found ${this.describe(eq)}`);
        this.take(eq);
        const expr = this.expr(false, 'a value after `=`');
        this.end();
        return { kind: 'let', name, expr, range: r() };
      }
      case 'body': {
        const name = this.name('a body name after `body`, e.g. `body b period 7.38 d`');
        this.definedName = name.name;
        let period: Expr | undefined;
        let mass: Expr | undefined;
        this.clauses(kw, {
          period: () => { period = this.quantity('the period', ['d', 'yr']); },
          mass: () => { mass = this.expr(false, 'a mass after `mass`'); },
        }, { period: 'a period: add `period 7.38 d`' });
        return { kind: 'body', name, period: period!, ...(mass ? { mass } : {}), range: r() };
      }
      case 'synodic': {
        const [a, b] = this.operandPair(kw);
        let span: { from: DateLit; to: DateLit } | undefined;
        this.clauses(kw, { from: () => { span = this.span(); } }, {});
        return { kind: 'synodic', a, b, ...(span ? { span } : {}), range: r() };
      }
      case 'ratio': {
        const [a, b] = this.operandPair(kw);
        let upTo: number | undefined;
        this.clauses(kw, { 'up-to': () => { upTo = this.whole('up-to', 1); } }, {});
        return { kind: 'ratio', a, b, ...(upTo !== undefined ? { upTo } : {}), range: r() };
      }
      case 'relation': {
        const bodies: Expr[] = [];
        for (;;) {
          const e = this.operand(kw);
          if (!e) break;
          bodies.push(e);
        }
        if (bodies.length < 2) {
          const kwTok = this.keywordTok!;
          this.error(Code.MissingArgument, '`relation` needs at least two bodies or periods, e.g. `relation b c d`', kwTok.start, this.lastEnd);
        }
        let upTo: number | undefined;
        let top: number | undefined;
        this.clauses(kw, {
          'up-to': () => { upTo = this.whole('up-to', 1); },
          top: () => { top = this.whole('top', 1); },
        }, {});
        return { kind: 'relation', bodies, ...(upTo !== undefined ? { upTo } : {}), ...(top !== undefined ? { top } : {}), range: r() };
      }
      case 'conjunctions': {
        const a = this.body(kw, 'two bodies, e.g. `conjunctions venus mars from 2030 to 2040`');
        const b = this.body(kw, 'two bodies, e.g. `conjunctions venus mars from 2030 to 2040`');
        let span: { from: DateLit; to: DateLit } | undefined;
        let seenFrom: SeenFrom = 'sun';
        let within: Expr | undefined;
        this.clauses(kw, {
          from: () => { span = this.span(); },
          'seen-from': () => { seenFrom = this.oneOf('seen-from', OPTION_VALUES['seen-from']); },
          within: () => { within = this.quantity('the angle', ['deg']); },
        }, { from: 'a span: add `from 2030 to 2040`' });
        return { kind: 'conjunctions', a, b, span: span!, seenFrom, ...(within ? { within } : {}), range: r() };
      }
      case 'oppositions': {
        const a = this.body(kw, 'a body, e.g. `oppositions mars from 2030 to 2040`');
        let span: { from: DateLit; to: DateLit } | undefined;
        this.clauses(kw, { from: () => { span = this.span(); } }, { from: 'a span: add `from 2030 to 2040`' });
        return { kind: 'oppositions', a, span: span!, range: r() };
      }
      case 'alignment': {
        const bodies = this.bodyList(kw);
        let against: Ident[] = [];
        let within: Expr | undefined;
        let span: { from: DateLit; to: DateLit } | undefined;
        let seenFrom: SeenFrom = 'sun';
        this.clauses(kw, {
          against: () => {
            against = this.bodyList(kw);
            if (against.length === 0) this.fatalAt(this.peek(), Code.MissingArgument, '`against` needs at least one body, e.g. `against neptune`');
          },
          within: () => { within = this.quantity('the angle', ['deg']); },
          from: () => { span = this.span(); },
          'seen-from': () => { seenFrom = this.oneOf('seen-from', OPTION_VALUES['seen-from']); },
        }, { within: 'an angle: add `within 10 deg`', from: 'a span: add `from 2030 to 2040`' });
        if (bodies.length === 0 || bodies.length + against.length < 2) {
          this.fatal(Code.MissingArgument, '`alignment` needs at least two bodies, e.g. `alignment venus mars jupiter within 10 deg from 2030 to 2040`', t.start, t.end);
        }
        return { kind: 'alignment', bodies, against, within: within!, span: span!, seenFrom, range: r() };
      }
      case 'barycentre': {
        let span: { from: DateLit; to: DateLit } | undefined;
        let step: Expr | undefined;
        this.clauses(kw, {
          from: () => { span = this.span(); },
          step: () => { step = this.quantity('the step', ['d']); },
        }, { from: 'a span: add `from 1900 to 2100`' });
        return { kind: 'barycentre', span: span!, ...(step ? { step } : {}), range: r() };
      }
      case 'series': {
        const name = this.name('a series name after `series`, e.g. `series spots from "spots.csv" time year value count`');
        this.definedName = name.name;
        let path: { text: string; range: Range } | undefined;
        let timeColumn: string | undefined;
        let valueColumn: string | undefined;
        let timeUnit: 'yr' | 'd' | 'jd' = DEFAULT_TIME_UNIT;
        this.clauses(kw, {
          from: () => { path = this.path(); },
          time: () => { timeColumn = this.column('time'); },
          value: () => { valueColumn = this.column('value'); },
          'time-unit': () => { timeUnit = this.oneOf('time-unit', OPTION_VALUES['time-unit']); },
        }, {
          from: 'a file: add `from "data.csv"`',
          time: 'the time column: add `time t`',
          value: 'the value column: add `value v`',
        });
        return { kind: 'series', name, path: path!.text, pathRange: path!.range, timeColumn: timeColumn!, valueColumn: valueColumn!, timeUnit, range: r() };
      }
      case 'periodogram': {
        const target = this.name('a series name after `periodogram`, e.g. `periodogram spots`');
        let periods: { from: Expr; to: Expr } | undefined;
        let peaks: number | undefined;
        let mark: Expr[] | undefined;
        this.clauses(kw, {
          periods: () => {
            const from = this.quantity('the shortest period', ['d', 'yr']);
            this.expectWord('to', '`periods` takes a range, e.g. `periods 2 yr to 30 yr`');
            const to = this.quantity('the longest period', ['d', 'yr']);
            periods = { from, to };
          },
          peaks: () => { peaks = this.whole('peaks', 1); },
          mark: () => {
            const list: Expr[] = [this.quantity('the marked period', ['yr', 'd'])];
            for (;;) {
              const comma = this.peek();
              if (!this.isOp(comma, ',')) break;
              this.take(comma);
              list.push(this.quantity('the marked period', ['yr', 'd']));
            }
            mark = list;
          },
        }, {});
        return {
          kind: 'periodogram', target,
          ...(periods ? { periods } : {}), ...(peaks !== undefined ? { peaks } : {}), ...(mark ? { mark } : {}),
          range: r(),
        };
      }
      case 'set': {
        const keyTok = this.peek(true);
        const keys = OPTION_VALUES.set;
        if (keyTok.type !== 'ident' || (keyTok.text !== 'seed' && keyTok.text !== 'calendar')) {
          const s = keyTok.type === 'ident' ? suggest(keyTok.text, keys) : undefined;
          this.fatalAt(keyTok, Code.BadOption, `${keyTok.type === 'ident' ? `unknown setting ${code(keyTok.text)}${meanHint(s)}` : `expected a setting, found ${this.describe(keyTok)}.`} Settings: \`set seed N\`, \`set calendar gregorian|mixed\``);
        }
        this.take(keyTok);
        if (keyTok.text === 'seed') {
          const v = this.peek();
          this.whole('seed', 0);
          this.end();
          return { kind: 'set', key: 'seed', value: v.text, valueRange: this.range(v.start, v.end), range: r() };
        }
        const v = this.peek(true);
        const value = this.oneOf('calendar', OPTION_VALUES.calendar);
        this.end();
        return { kind: 'set', key: 'calendar', value, valueRange: this.range(v.start, v.end), range: r() };
      }
    }
  }

  /** Nothing may follow. */
  private end(): void {
    const t = this.peek(true);
    if (t.type === 'eof') return;
    this.fatal(Code.UnexpectedToken, `unexpected ${this.describe(t)} after the end of the \`${this.kind}\` statement`, t.start, t.end);
  }

  /**
   * Option clauses in any order, each at most once, until the end of the statement.
   * @param required clause → what to tell the user when it is missing.
   */
  private clauses(kw: StatementKind, handlers: Record<string, () => void>, required: Record<string, string>): void {
    const seen = new Set<string>();
    const options = STATEMENT_OPTIONS[kw];
    const listing = options.length > 0 ? ` Options of \`${kw}\`: ${options.join(', ')}` : '';
    const isHandler = (t: Token): boolean => t.type === 'ident' && Object.hasOwn(handlers, t.text);
    let skipped = false;
    for (;;) {
      const t = this.peek(true);
      if (t.type === 'eof') break;
      if (isHandler(t)) {
        if (seen.has(t.text)) this.fatal(Code.BadOption, `${code(t.text)} is given twice`, t.start, t.end);
        seen.add(t.text);
        this.take(t);
        handlers[t.text]!();
        continue;
      }
      if (t.type === 'ident') {
        const s = suggest(t.text, options);
        const takes = s === undefined ? ` (\`${kw}\` takes ${OPERANDS[kw]}, then options)` : '';
        this.error(Code.BadOption, `unknown option ${code(t.text)} for \`${kw}\`${takes}${meanHint(s)}${listing}`, t.start, t.end);
      } else {
        this.error(Code.UnexpectedToken, `unexpected ${this.describe(t)} in \`${kw}\`; expected an option word.${listing}`, t.start, t.end);
      }
      // Skip to the next option word, so that later mistakes in the line are reported too.
      skipped = true;
      this.take(t);
      const looksLikeOption = (n: Token): boolean => isHandler(n) || (n.type === 'ident' && (n.text.includes('-') || suggest(n.text, options) !== undefined));
      for (let n = this.peek(true); n.type !== 'eof' && !looksLikeOption(n); n = this.peek(true)) this.take(n);
    }
    const kwTok = this.keywordTok!;
    // After a skipped word, a "missing" clause is most likely that word mistyped: say it once.
    if (!skipped) {
      for (const [clause, what] of Object.entries(required)) {
        if (!seen.has(clause)) this.error(Code.MissingArgument, `\`${kw}\` needs ${what}`, kwTok.start, kwTok.end);
      }
    }
    if (this.failed) throw new Abort();
  }

  private expectWord(word: string, message: string): void {
    const t = this.peek(true);
    if (t.type === 'ident' && t.text === word) { this.take(t); return; }
    this.fatalAt(t, Code.MissingArgument, `${message}; found ${this.describe(t)}`);
  }

  private missingOperands(kw: StatementKind, what: string): never {
    const t = this.peek(true);
    const kwTok = this.keywordTok!;
    if (t.type === 'eof' || (t.type === 'ident' && STATEMENT_OPTIONS[kw].includes(t.text))) {
      this.fatal(Code.MissingArgument, `\`${kw}\` needs ${what}`, kwTok.start, this.lastEnd);
    }
    this.fatal(Code.UnexpectedToken, `\`${kw}\` needs ${what}; found ${this.describe(t)}`, t.start, t.end);
  }

  // ---- names, bodies, operands -------------------------------------------

  private name(what: string): Ident {
    const t = this.peek();
    if (t.type === 'ident' && !STOP_WORDS.has(t.text)) {
      this.take(t);
      return { name: t.text, range: this.range(t.start, t.end) };
    }
    if (t.type === 'number') {
      const after = lexAt(this.text, t.end);
      const end = after.type === 'ident' && !after.spaceBefore ? after.end : t.end;
      this.fatal(Code.UnexpectedToken, `${code(this.text.slice(t.start, end))} is not a name: names start with a letter or \`_\`; expected ${what}`, t.start, end);
    }
    this.fatalAt(t, Code.UnexpectedToken, `expected ${what}, found ${this.describe(t)}`);
  }

  /** Whether the next word ends an operand list: an option of `kw`, or what looks like a mistyped one. */
  private endsOperands(kw: StatementKind, t: Token): boolean {
    if (t.type === 'eof') return true;
    if (t.type !== 'ident') return false;
    // `period(b)` is a call even where `period` is also an option word.
    if (this.isOp(lexAt(this.text, t.end), '(')) return false;
    const options = STATEMENT_OPTIONS[kw];
    if (options.includes(t.text) || STOP_WORDS.has(t.text)) return true;
    if (this.known.has(t.text)) return false;
    if (t.text.includes('-')) return true;
    // A word close to an option and followed by a number is taken for a mistyped option.
    const next = lexAt(this.text, t.end);
    return suggest(t.text, options) !== undefined && next.type === 'number';
  }

  private operand(kw: StatementKind): Expr | undefined {
    const t = this.peek(true);
    if (this.endsOperands(kw, t)) return undefined;
    return this.requireUnit(this.expr(true, 'a body or a period'), 'a period', ['d', 'yr']);
  }

  private operandPair(kw: StatementKind): [Expr, Expr] {
    const what = 'two bodies or periods, e.g. `' + kw + ' jupiter saturn` or `' + kw + ' 11.86 yr 29.46 yr`';
    const a = this.operand(kw) ?? this.missingOperands(kw, what);
    const b = this.operand(kw) ?? this.missingOperands(kw, what);
    return [a, b];
  }

  private body(kw: StatementKind, what: string): Ident {
    const t = this.peek(true);
    if (this.endsOperands(kw, t)) this.missingOperands(kw, what);
    return this.name(`a body name (${what.replace(/^.*?e\.g\. /, 'e.g. ')})`);
  }

  private bodyList(kw: StatementKind): Ident[] {
    const out: Ident[] = [];
    for (;;) {
      const t = this.peek(true);
      if (this.endsOperands(kw, t)) return out;
      out.push(this.name('a body name'));
    }
  }

  private oneOf<T extends string>(option: string, values: readonly T[]): T {
    const t = this.peek(true);
    const v = values.find((x) => x === t.text);
    if (t.type === 'ident' && v !== undefined) { this.take(t); return v; }
    const s = t.type === 'ident' ? suggest(t.text, values) : undefined;
    this.fatalAt(t, Code.BadOption, `${code(option)} takes ${values.map(code).join(' or ')}${s ? ` — did you mean ${code(s)}?` : ''}; found ${this.describe(t)}`);
  }

  /** A whole number ≥ `min` (no unit). */
  private whole(option: string, min: number): number {
    const t = this.peek();
    if (t.type === 'number' && /^\d+$/.test(t.text)) {
      const n = Number(t.text);
      this.take(t);
      if (!Number.isSafeInteger(n)) this.fatal(Code.BadNumber, `${code(t.text)} is too large for \`${option}\``, t.start, t.end);
      if (n < min) this.fatal(Code.BadNumber, `\`${option}\` takes a whole number ≥ ${min}; found ${t.text}`, t.start, t.end);
      return n;
    }
    this.fatalAt(t, t.type === 'eof' ? Code.MissingArgument : Code.BadNumber, `\`${option}\` takes a whole number ≥ ${min}, e.g. \`${option} ${Math.max(min, 5)}\`; found ${this.describe(t)}`);
  }

  private path(): { text: string; range: Range } {
    const t = this.peek();
    if (t.type === 'string') {
      if (!t.closed) this.fatal(Code.UnclosedString, 'the path has no closing `"`', t.start, t.end);
      this.take(t);
      if (t.text.length <= 2) this.fatal(Code.MissingArgument, 'the path is empty; write e.g. `from "data/spots.csv"`', t.start, t.end);
      return { text: t.text.slice(1, -1), range: this.range(t.start + 1, t.end - 1) };
    }
    this.fatalAt(t, Code.UnexpectedToken, `put the path in double quotes, e.g. \`from "data/spots.csv"\`; found ${this.describe(t)}`);
  }

  /** A column: a name, a quoted header, or a column number. */
  private column(option: string): string {
    const t = this.peek();
    if (t.type === 'ident' || t.type === 'number') { this.take(t); return t.text; }
    if (t.type === 'string') {
      if (!t.closed) this.fatal(Code.UnclosedString, 'the column name has no closing `"`', t.start, t.end);
      this.take(t);
      return t.text.slice(1, -1);
    }
    this.fatalAt(t, Code.MissingArgument, `\`${option}\` takes a column name or number, e.g. \`${option} t\`; found ${this.describe(t)}`);
  }

  // ---- dates --------------------------------------------------------------

  private span(): { from: DateLit; to: DateLit } {
    const from = this.date('from');
    this.expectWord('to', 'a span is `from DATE to DATE`, e.g. `from 2030 to 2040`');
    const to = this.date('to');
    return { from, to };
  }

  private date(after: string): DateLit {
    const start = skipTrivia(this.text, this.pos);
    JD_RE.lastIndex = start;
    const jd = JD_RE.exec(this.text);
    if (jd) {
      const end = start + jd[0].length;
      this.checkDateEnd(start, end);
      const value = Number(jd[2]);
      this.pos = end; this.lastStart = start; this.lastEnd = end;
      if (!Number.isFinite(value)) this.fatal(Code.BadDate, `${code(jd[2]!)} is not a usable Julian Date`, start, end);
      return { form: 'jd', jd: value, scale: jd[3] === 'TT' ? 'TT' : 'UTC', text: jd[0], range: this.range(start, end) };
    }
    CAL_RE.lastIndex = start;
    const m = CAL_RE.exec(this.text);
    if (!m) {
      const t = this.peek(true);
      this.fatalAt(t, t.type === 'eof' ? Code.MissingArgument : Code.BadDate, `expected a date after \`${after}\` (${EXAMPLE_DATES}); found ${this.describe(t)}`);
    }
    const end = start + m[0].length;
    this.checkDateEnd(start, end);
    this.pos = end; this.lastStart = start; this.lastEnd = end;
    const idx = m.indices!;
    const field = (i: number, name: string, lo: number, hi: number, dflt: number): number => {
      const s = m[i];
      if (s === undefined) return dflt;
      const v = Number(s);
      const [a, b] = idx[i]!;
      if (!(v >= lo && v <= hi) || (i === 1 && !Number.isSafeInteger(v))) {
        this.error(Code.BadDate, i === 1 ? `the year ${code(s)} is out of range` : `the ${name} must be ${lo}…${hi}; found ${code(s)}`, a, b);
      }
      return v;
    };
    const year = field(1, 'year', -Number.MAX_SAFE_INTEGER, Number.MAX_SAFE_INTEGER, 0);
    const month = field(2, 'month', 1, 12, 1);
    const day = field(3, 'day', 1, 31, 1);
    const hour = field(4, 'hour', 0, 24, 0);
    const minute = field(5, 'minute', 0, 59, 0);
    const second = field(6, 'second', 0, 60.999999, 0);
    if (hour === 24 && (minute !== 0 || second !== 0)) this.error(Code.BadDate, '`24:00` is the only time with hour 24', idx[4]![0], end);
    if (m[7] !== undefined && m[8] === 'TT') this.error(Code.BadDate, '`Z` means UTC: write either `Z` or `TT`, not both', idx[7]![0], end);
    if (this.failed) throw new Abort();
    const text = m[0];
    return { form: 'calendar', year, month, day, hour, minute, second, scale: m[8] === 'TT' ? 'TT' : 'UTC', text, range: this.range(start, end) };
  }

  /** A date must end at a space, a comment or the end: `2031-03-14x` or `1850.5` is no date. */
  private checkDateEnd(start: number, end: number): void {
    const rest = this.text.slice(end);
    if (rest === '' || /^[\s#,)]/u.test(rest)) return;
    const junk = /^[^\s#]*/u.exec(rest)![0];
    this.fatal(Code.BadDate, `${code(this.text.slice(start, end + junk.length))} is not a date; write ${EXAMPLE_DATES}`, start, end + junk.length);
  }

  // ---- expressions --------------------------------------------------------

  /** An expression whose literal must carry a unit (`within 5 deg`, `period 7.38 d`). */
  private quantity(what: string, units: readonly string[]): Expr {
    return this.requireUnit(this.expr(false, what), what, units);
  }

  private requireUnit(e: Expr, what: string, units: readonly string[]): Expr {
    const lit = e.type === 'number' ? e : e.type === 'neg' && e.operand.type === 'number' ? e.operand : undefined;
    if (lit?.type === 'number' && lit.unit === undefined) {
      const n = this.numberText.get(lit) ?? String(lit.value);
      const us = lit.sigmaUnit !== undefined ? [lit.sigmaUnit] : units;
      const hint = us.map((u) => code(`${n} ${u}`)).join(' or ');
      this.failed = true;
      this.diags.push(diag(Code.MissingUnit, 'error', `${what} needs a unit: write ${hint}`, lit.range));
    }
    return e;
  }

  /**
   * @param list inside an operand list (`relation b c 3.2 d`): a `-` or `+` written with a
   *   space before and none after starts the next operand, and a word after a number that
   *   looks like no unit is the next operand rather than a unit.
   */
  private expr(list: boolean, what: string): Expr {
    let left = this.term(list, what);
    for (;;) {
      const t = this.peek();
      if (!(this.isOp(t, '+') || this.isOp(t, '-'))) return left;
      if (list && t.spaceBefore && !lexAt(this.text, t.end).spaceBefore) return left;
      this.take(t);
      const right = this.term(list, `a value after \`${t.text}\``);
      const start = this.offsetOf(left);
      left = this.mark({ type: 'binary', op: t.text as '+' | '-', left, right, range: this.range(start, this.lastEnd) }, start);
    }
  }

  private term(list: boolean, what: string): Expr {
    let left = this.unary(list, what);
    for (;;) {
      const t = this.peek();
      if (!(this.isOp(t, '*') || this.isOp(t, '/'))) return left;
      this.take(t);
      const right = this.unary(list, `a value after \`${t.text}\``);
      const start = this.offsetOf(left);
      left = this.mark({ type: 'binary', op: t.text as '*' | '/', left, right, range: this.range(start, this.lastEnd) }, start);
    }
  }

  /** Start offset of a node: kept beside the node because ranges are in document coordinates. */
  private readonly starts = new WeakMap<Expr, number>();
  private offsetOf(e: Expr): number { return this.starts.get(e) ?? 0; }
  private mark<E extends Expr>(e: E, start: number): E { this.starts.set(e, start); return e; }

  private unary(list: boolean, what: string): Expr {
    const t = this.peek();
    if (this.isOp(t, '-')) {
      this.take(t);
      const operand = this.unary(list, 'a value after `-`');
      return this.mark({ type: 'neg', operand, range: this.range(t.start, this.lastEnd) }, t.start);
    }
    if (this.isOp(t, '+')) {
      this.take(t);
      return this.unary(list, 'a value after `+`');
    }
    return this.primary(list, what);
  }

  private primary(list: boolean, what: string): Expr {
    const t = this.peek();
    if (t.type === 'number') return this.number(t, list);
    if (t.type === 'ident') {
      this.take(t);
      const open = this.peek();
      if (this.isOp(open, '(')) return this.call(t, open);
      return this.mark({ type: 'name', name: t.text, range: this.range(t.start, t.end) }, t.start);
    }
    if (this.isOp(t, '(')) {
      this.take(t);
      const inner = this.expr(false, 'a value after `(`');
      const close = this.peek();
      if (!this.isOp(close, ')')) this.fatalAt(close, Code.UnexpectedToken, `expected \`)\` to close the \`(\` at column ${this.src.position(t.start).character + 1}; found ${this.describe(close)}`);
      this.take(close);
      return this.mark({ ...inner, range: this.range(t.start, close.end) }, t.start);
    }
    if (t.type === 'string' && !t.closed) this.fatal(Code.UnclosedString, 'this string has no closing `"`', t.start, t.end);
    const code_ = t.type === 'eof' ? Code.MissingArgument : Code.UnexpectedToken;
    this.fatalAt(t, code_, `expected ${what} (a number with a unit, a name or \`(\`); found ${this.describe(t)}`);
  }

  private call(fnTok: Token, open: Token): Expr {
    const arity = Object.hasOwn(FUNCTIONS, fnTok.text) ? FUNCTIONS[fnTok.text] : undefined;
    if (arity === undefined) {
      const s = suggest(fnTok.text, Object.keys(FUNCTIONS));
      this.fatal(Code.UnknownName, `unknown function ${code(fnTok.text)}${meanHint(s)} Functions: period(B), frequency(B), synodic(A, B), abs(x)`, fnTok.start, fnTok.end);
    }
    this.take(open);
    const args: Expr[] = [];
    const signature = fnTok.text === 'abs' ? 'abs(x)' : arity === 1 ? `${fnTok.text}(B)` : `${fnTok.text}(A, B)`;
    for (;;) {
      const t = this.peek();
      if (this.isOp(t, ')') && args.length === 0) break;
      args.push(this.expr(false, `an argument of \`${fnTok.text}\``));
      const sep = this.peek();
      if (this.isOp(sep, ',')) { this.take(sep); continue; }
      if (this.isOp(sep, ')')) break;
      this.fatalAt(sep, Code.UnexpectedToken, `expected \`,\` or \`)\` in ${code(signature)}; found ${this.describe(sep)}`);
    }
    const close = this.take(this.peek());
    if (args.length !== arity) {
      this.fatal(args.length < arity ? Code.MissingArgument : Code.UnexpectedToken,
        `\`${fnTok.text}\` takes ${arity === 1 ? 'one argument' : `${arity} arguments`}: ${code(signature)}; found ${args.length}`, fnTok.start, close.end);
    }
    const fn: Ident = { name: fnTok.text, range: this.range(fnTok.start, fnTok.end) };
    return this.mark({ type: 'call', fn, args, range: this.range(fnTok.start, close.end) }, fnTok.start);
  }

  private number(t: Token, list: boolean): Expr {
    this.take(t);
    const value = Number(t.text);
    if (!Number.isFinite(value)) this.error(Code.BadNumber, `${code(t.text)} is too large to be a number`, t.start, t.end);
    const parts: NumberParts = { value };
    const unit = this.unitAfter(list);
    if (unit) { parts.unit = unit.text; parts.unitRange = unit.range; }
    const pm = this.peek();
    const plusMinus = this.isOp(pm, '+') && this.isOp(lexAt(this.text, pm.end), '-') && !lexAt(this.text, pm.end).spaceBefore;
    if (this.isOp(pm, '±') || plusMinus) {
      this.take(pm);
      if (plusMinus) this.take(this.peek());
      const s = this.peek();
      if (s.type !== 'number') this.fatalAt(s, Code.MissingArgument, `expected the uncertainty after ${code(plusMinus ? '+-' : '±')}, e.g. \`7.3845 d ± 0.0002 d\`; found ${this.describe(s)}`);
      this.take(s);
      const sigma = Number(s.text);
      if (!Number.isFinite(sigma)) this.error(Code.BadNumber, `${code(s.text)} is too large to be an uncertainty`, s.start, s.end);
      parts.sigma = sigma;
      const su = this.unitAfter(list);
      if (su) parts.sigmaUnit = su.text;
    }
    const e: Expr = { type: 'number', ...parts, range: this.range(t.start, this.lastEnd) };
    this.numberText.set(e, t.text);
    return this.mark(e, t.start);
  }

  /** A unit written right after a number: `d`, `yr`, `°`, `deg`, `/d`, `deg/d` … */
  private unitAfter(list: boolean): { text: string; range: Range } | undefined {
    const t = this.peek();
    const adjacentIdentAfter = (tok: Token): Token | undefined => {
      const n = lexAt(this.text, tok.end);
      return n.type === 'ident' && !n.spaceBefore ? n : undefined;
    };
    const slashUnitAfter = (tok: Token): Token | undefined => {
      const slash = lexAt(this.text, tok.end);
      if (!this.isOp(slash, '/') || slash.spaceBefore) return undefined;
      const den = adjacentIdentAfter(slash);
      return den && isUnit(`${tok.text}/${den.text}`) ? den : undefined;
    };
    const finish = (startTok: Token, endTok: Token): { text: string; range: Range } => {
      this.take(endTok);
      return { text: this.text.slice(startTok.start, endTok.end), range: this.range(startTok.start, endTok.end) };
    };
    if (this.isOp(t, '°')) return finish(t, slashUnitAfter(t) ?? t);
    if (this.isOp(t, '/')) {
      const den = adjacentIdentAfter(t);
      if (den && isUnit(`/${den.text}`)) return finish(t, den);
      return undefined;
    }
    if (t.type !== 'ident') return undefined;
    const den = slashUnitAfter(t);
    if (den) return finish(t, den);
    if (isUnit(t.text)) return finish(t, t);
    // Not a unit. Decide whether it was meant as one.
    const word = this.peek(true);
    if (STOP_WORDS.has(word.text)) return undefined;
    if (list && t.spaceBefore && this.known.has(t.text)) return undefined;
    const hint = unitHint(t.text);
    // In an operand list a spaced word that looks like no unit is the next operand.
    if (list && t.spaceBefore && (hint === undefined || t.text.length < 2)) return undefined;
    this.take(t);
    this.error(Code.UnknownUnit, `unknown unit ${code(t.text)}${meanHint(hint)} Units: ${UNIT_NAMES.join(', ')}`, t.start, t.end);
    // Returned so that no second "needs a unit" error is reported for the same number.
    return { text: t.text, range: this.range(t.start, t.end) };
  }
}

/**
 * Parse the content of one `orbit` block.
 * @param content the text between the fences (any line breaks).
 * @param contentStartLine 0-based document line of the first content line; every range is
 *   in document coordinates (line, UTF-16 character).
 * @returns the statements that parsed cleanly and the diagnostics of all others. Never throws.
 */
export function parseBlock(content: string, contentStartLine: number, opts: ParseOptions = {}): ParseResult {
  const statements: Statement[] = [];
  const diagnostics: Diagnostic[] = [];
  const failed: FailedStatement[] = [];
  const known = opts.knownNames ?? new Set<string>();
  for (const src of splitStatements(content, contentStartLine)) {
    const p = new StatementParser(src, diagnostics, known);
    const s = p.parse();
    if (s && p.ok) {
      statements.push(s);
    } else {
      const first = src.lines[0]!;
      const last = src.lines[src.lines.length - 1]!;
      const start = first.text.length - first.text.trimStart().length;
      failed.push({
        ...(p.kind ? { kind: p.kind } : {}),
        ...(p.definedName !== undefined ? { definedName: p.definedName } : {}),
        range: { start: { line: first.line, character: start }, end: { line: last.line, character: last.text.length } },
      });
    }
  }
  return { statements, diagnostics, failed };
}
