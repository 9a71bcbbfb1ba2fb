/**
 * Note evaluation: every `orbit` block of a note, statements in document order, names
 * shared across blocks. Each statement's result is cached under a digest of its source
 * text, the digests of the definitions it references, the note's settings, data-file
 * contents and library versions — so after an edit only the statements whose inputs
 * changed are evaluated again, and nothing else.
 */
import type { DateLit, Expr, Ident, Range, Statement } from '../language/ast.js';
import { Code, diag, suggest, type Diagnostic } from '../language/diagnostics.js';
import { extractBlocks, splitLines, type ExtractedBlock } from '../language/extract.js';
import { parseBlock } from '../language/parser.js';
import { builtinPeriod } from './bodies.js';
import { BUILTIN_BODIES, EvalError, fail, type BuiltinBody, type EvalContext, type ResolvedBody, type Series } from './context.js';
import { digest } from './digest.js';
import { evaluateExpr, type ExprScope } from './expr.js';
import { Budget, CancelledError, DEFAULT_LIMITS, LimitError, type CancelSignal, type Limits } from './limits.js';
import { ENGINE_LABEL, ORBIT_NOTES_VERSION } from './provenance.js';
import { describeDim, formatQuantity, reciprocal, sigmaOf, toJson, type Quantity } from './quantity.js';
import { renderRegionBody } from './render/markdown.js';
import type { StatementResult } from './result.js';
import { HANDLERS, type Handlers } from './statements/index.js';
import { instantFromCalendar, instantFromTt, instantFromUt, J2000_JD, validateCalendarDate, type CalendarMode, type Instant } from './time.js';

/** Why a file could not be read; the host decides (workspace confinement lives there). */
export class FileAccessError extends Error {
  constructor(message: string, readonly reason: 'outside-workspace' | 'not-found' | 'unreadable') {
    super(message);
    this.name = 'FileAccessError';
  }
}

/** What the evaluator needs from its surroundings. */
export interface NoteHost {
  /**
   * Read a text file given relative to the note. Must refuse (FileAccessError
   * 'outside-workspace') anything that resolves outside the workspace.
   */
  readText(relativePath: string): Promise<string>;
}

export interface NoteEvaluatorInit {
  readonly host?: NoteHost;
  readonly limits?: Limits;
  readonly handlers?: Handlers;
  readonly log?: (message: string) => void;
  /** Most cached statement results kept between evaluations. */
  readonly cacheSize?: number;
}

export interface EvaluateOptions {
  readonly cancel?: CancelSignal;
  /** Called before each statement is evaluated (not for cache hits). */
  readonly onProgress?: (done: number, total: number, statement: Statement) => void;
}

export interface StatementEvaluation {
  readonly statement: Statement;
  /** The statement's source text as written (continuation lines included). */
  readonly source: string;
  readonly result?: StatementResult;
  readonly diagnostics: readonly Diagnostic[];
  readonly digest: string;
  /** True when the result came from the cache. */
  readonly reused: boolean;
}

export interface BlockEvaluation {
  readonly block: ExtractedBlock;
  readonly statements: readonly StatementEvaluation[];
  /** Parse, evaluation and region diagnostics of this block. */
  readonly diagnostics: readonly Diagnostic[];
  /** Digest of everything the block's results depend on. */
  readonly inputsDigest: string;
  /** The region body the block's results render to (plain Markdown). */
  readonly regionBody: string;
}

export interface NoteSettings { readonly calendar: CalendarMode; readonly seed: number }

export interface NoteEvaluation {
  readonly blocks: readonly BlockEvaluation[];
  readonly diagnostics: readonly Diagnostic[];
  readonly settings: NoteSettings;
  /** Statements evaluated afresh / taken from the cache. */
  readonly evaluated: number;
  readonly reused: number;
}

export interface NoteEvaluator {
  evaluate(text: string, options?: EvaluateOptions): Promise<NoteEvaluation>;
  /** Forget cached results (e.g. after a data file changed outside the editor). */
  clearCache(): void;
}

type Binding =
  | { readonly kind: 'quantity'; readonly value: Quantity; readonly digest: string; readonly line: number }
  | { readonly kind: 'body'; readonly body: ResolvedBody; readonly digest: string; readonly line: number }
  | { readonly kind: 'series'; readonly series: Series; readonly digest: string; readonly line: number }
  | { readonly kind: 'failed'; readonly digest: string; readonly line: number };

interface Cached {
  readonly result?: StatementResult;
  readonly diagnostics: readonly Diagnostic[];
  readonly binding?: Binding;
  /** Lines of the statement when cached: diagnostics are re-based when it moves. */
  readonly line: number;
}

const DEFAULT_SEED = 1;

/** Build an evaluator; keep it for the note's lifetime so its cache serves later edits. */
export function createNoteEvaluator(init: NoteEvaluatorInit = {}): NoteEvaluator {
  const handlers = init.handlers ?? HANDLERS;
  const limits = init.limits ?? DEFAULT_LIMITS;
  const cacheSize = init.cacheSize ?? 4000;
  let cache = new Map<string, Cached>();
  // Region bodies by block inputs digest and diagnostics: equal inputs render to equal text.
  let regionBodies = new Map<string, string>();

  async function evaluate(text: string, options: EvaluateOptions = {}): Promise<NoteEvaluation> {
    const lines = splitLines(text);
    const blocks = extractBlocks(text);
    const parsed = blocks.map((b) => {
      const p = parseBlock(b.content, b.contentStartLine);
      return { block: b, statements: p.statements, failed: p.failed, diagnostics: p.diagnostics };
    });
    const noteDiagnostics: Diagnostic[] = [];
    const settings = collectSettings(parsed.flatMap((p) => p.statements), noteDiagnostics);
    const settingsKey = `calendar=${settings.calendar};seed=${settings.seed};${ENGINE_LABEL};orbit-notes ${ORBIT_NOTES_VERSION}`;
    const scope = new Map<string, Binding>();
    const nextCache = new Map<string, Cached>();
    const nextRegionBodies = new Map<string, string>();
    const total = parsed.reduce((n, p) => n + p.statements.length, 0);
    let done = 0;
    let evaluated = 0;
    let reused = 0;
    const blockEvals: BlockEvaluation[] = [];

    for (const p of parsed) {
      const stmtEvals: StatementEvaluation[] = [];
      // A definition that failed to parse still claims its name, so later uses say why they fail.
      const failedByLine = [...p.failed].filter((f) => f.definedName !== undefined).sort((a, b) => a.range.start.line - b.range.start.line);
      const claimFailedBefore = (line: number): void => {
        while (failedByLine.length > 0 && failedByLine[0]!.range.start.line < line) {
          const f = failedByLine.shift()!;
          if (!scope.has(f.definedName!)) scope.set(f.definedName!, { kind: 'failed', digest: digest('failed', sourceOf(p.block, f.range), `@${f.range.start.line}`), line: f.range.start.line });
        }
      };
      for (const stmt of p.statements) {
        claimFailedBefore(stmt.range.start.line);
        const source = sourceOf(p.block, stmt.range);
        const refs = referencedNames(stmt);
        const refKey = refs.map((r) => `${r}=${scope.get(r)?.digest ?? (isBuiltin(r) ? 'builtin' : 'undefined')}`).join(',');
        let fileKey = '';
        let fileText: string | undefined;
        let fileError: EvalError | undefined;
        if (stmt.kind === 'series') {
          try {
            fileText = await readFile(stmt.path, stmt.pathRange);
            fileKey = digest(fileText);
          } catch (err) {
            if (err instanceof EvalError) { fileError = err; fileKey = `error:${err.message}`; } else throw err;
          }
        }
        const stmtDigest = digest('stmt', source, settingsKey, refKey, fileKey);
        let entry = cache.get(stmtDigest) ?? nextCache.get(stmtDigest);
        const wasCached = entry !== undefined;
        if (!entry) {
          options.onProgress?.(done, total, stmt);
          entry = await evaluateStatement(stmt, source, stmtDigest, scope, settings, options, fileText, fileError);
          evaluated += 1;
        } else {
          reused += 1;
        }
        done += 1;
        // A cancelled statement is not a result: leave it out of the cache so the next run computes it.
        if (!entry.diagnostics.some((d) => d.code === Code.Cancelled)) nextCache.set(stmtDigest, entry);
        const lineShift = stmt.range.start.line - entry.line;
        const diagnostics = lineShift === 0 ? entry.diagnostics : entry.diagnostics.map((d) => shiftLines(d, lineShift));
        const definedName = definedNameOf(stmt);
        if (definedName) {
          const redefinition = scope.has(definedName.name) || isBuiltin(definedName.name);
          if (redefinition) {
            const prev = scope.get(definedName.name);
            const d = diag(Code.Redefinition, 'error', prev
              ? `\`${definedName.name}\` is already defined on line ${prev.line + 1}; names cannot be redefined — choose another name`
              : `\`${definedName.name}\` is a built-in body; choose another name`, definedName.range);
            stmtEvals.push({ statement: stmt, source, diagnostics: [d], digest: stmtDigest, reused: false });
            continue;
          }
          if (entry.binding) {
            const line = stmt.range.start.line;
            // Messages of dependents name a failed definition's line, so its position is part of its digest.
            const bound = entry.binding.kind === 'failed' ? { ...entry.binding, digest: digest(entry.binding.digest, `@${line}`) } : entry.binding;
            scope.set(definedName.name, { ...bound, line });
          }
        }
        stmtEvals.push({
          statement: stmt, source, diagnostics, digest: stmtDigest, reused: wasCached,
          ...(entry.result ? { result: entry.result } : {}),
        });
      }
      claimFailedBefore(Infinity);
      const regionDiagnostics: Diagnostic[] = [];
      if (p.block.regionProblem === 'unclosed') {
        regionDiagnostics.push(diag(Code.UnclosedFence, 'error', 'this `orbit` block has no closing fence: add a line with ``` after its last statement', lineRange(lines, p.block.fenceLine)));
      } else if (p.block.regionProblem) {
        regionDiagnostics.push(diag(Code.RegionEdited, 'warning', p.block.regionProblem, lineRange(lines, p.block.closeLine + 1)));
      }
      const inputsDigest = digest('block', p.block.content, settingsKey, ...stmtEvals.map((s) => s.digest)).slice(0, 8);
      const partial: BlockEvaluation = {
        block: p.block, statements: stmtEvals, inputsDigest, regionBody: '',
        diagnostics: [...p.diagnostics, ...stmtEvals.flatMap((s) => s.diagnostics), ...regionDiagnostics],
      };
      // Diagnostics can change with equal inputs (a name defined twice elsewhere), so they key it too.
      const bodyKey = `${inputsDigest}|${partial.diagnostics.map((d) => `${d.code} ${d.message}`).join('\n')}`;
      const regionBody = regionBodies.get(bodyKey) ?? renderRegionBody(partial, settings);
      nextRegionBodies.set(bodyKey, regionBody);
      blockEvals.push({ ...partial, regionBody });
    }
    // Keep the entries of this evaluation plus the most recent older ones, so that undo
    // and toggling an edit back do not recompute.
    for (const [k, v] of cache) {
      if (nextCache.size >= cacheSize) break;
      if (!nextCache.has(k)) nextCache.set(k, v);
    }
    cache = nextCache;
    regionBodies = nextRegionBodies;
    return {
      blocks: blockEvals,
      diagnostics: [...noteDiagnostics, ...blockEvals.flatMap((b) => b.diagnostics)],
      settings,
      evaluated,
      reused,
    };
  }

  async function readFile(path: string, range: Range): Promise<string> {
    if (!init.host) fail(Code.DataFile, 'data files cannot be read here (no file access was given to the evaluator)', range);
    try {
      return await init.host.readText(path);
    } catch (err) {
      if (err instanceof FileAccessError) {
        fail(err.reason === 'outside-workspace' ? Code.OutsideWorkspace : Code.DataFile, err.message, range);
      }
      fail(Code.DataFile, `cannot read \`${path}\`: ${err instanceof Error ? err.message : String(err)}`, range);
    }
  }

  async function evaluateStatement(
    stmt: Statement, source: string, stmtDigest: string, scope: ReadonlyMap<string, Binding>, settings: NoteSettings,
    options: EvaluateOptions, fileText: string | undefined, fileError: EvalError | undefined,
  ): Promise<Cached> {
    const budget = new Budget(limits, options.cancel);
    const line = stmt.range.start.line;
    const exprScope = makeScope(scope, stmtDigest, stmt.range.start.line);
    const ctx: EvalContext = {
      calendar: settings.calendar,
      seed: settings.seed,
      budget,
      instant: (d) => instantOf(d, settings.calendar),
      value: (e) => evaluateExpr(e, exprScope),
      body: (id) => resolveBody(id, scope),
      series: (id) => resolveSeries(id, scope),
      readText: async (path, range) => {
        if (stmt.kind === 'series' && path === stmt.path) {
          if (fileError) throw fileError;
          if (fileText !== undefined) return fileText;
        }
        return readFile(path, range);
      },
    };
    try {
      switch (stmt.kind) {
        case 'let': {
          const value = ctx.value(stmt.expr);
          return { line, diagnostics: [], result: letResult(stmt.name.name, value, source), binding: { kind: 'quantity', value, digest: stmtDigest, line } };
        }
        case 'body': {
          const body = userBody(stmt, ctx);
          return { line, diagnostics: [], result: bodyResult(body), binding: { kind: 'body', body, digest: stmtDigest, line } };
        }
        case 'set':
          return { line, diagnostics: [], result: setResult(stmt) };
        case 'series': {
          const loader = handlers.series;
          if (!loader) return notAvailable(stmt, line, stmtDigest);
          const { series, result } = await loader(stmt, ctx);
          return { line, diagnostics: warningsOf(result, stmt.range), result, binding: { kind: 'series', series, digest: stmtDigest, line } };
        }
        default: {
          const handler = handlers[stmt.kind] as ((s: Statement, c: EvalContext) => StatementResult | Promise<StatementResult>) | undefined;
          if (!handler) return notAvailable(stmt, line, stmtDigest);
          const result = await handler(stmt, ctx);
          return { line, diagnostics: warningsOf(result, stmt.range), result };
        }
      }
    } catch (err) {
      const failed: Binding = { kind: 'failed', digest: stmtDigest, line };
      const binding = definedNameOf(stmt) ? { binding: failed } : {};
      if (err instanceof EvalError) return { line, diagnostics: [diag(err.code, 'error', err.message, err.range)], ...binding };
      if (err instanceof LimitError) return { line, diagnostics: [diag(Code.LimitReached, 'error', err.message, stmt.range)], ...binding };
      if (err instanceof CancelledError) return { line, diagnostics: [diag(Code.Cancelled, 'warning', 'cancelled before it finished; edit or re-run to compute it', stmt.range)], ...binding };
      const message = err instanceof Error ? err.message : String(err);
      init.log?.(`internal error in ${stmt.kind} on line ${line + 1}: ${err instanceof Error ? err.stack ?? message : message}`);
      return { line, diagnostics: [diag(Code.Internal, 'error', `internal error while evaluating \`${stmt.kind}\`: ${message}`, stmt.range)], ...binding };
    }
  }

  return { evaluate, clearCache: () => { cache = new Map(); regionBodies = new Map(); } };
}

function notAvailable(stmt: Statement, line: number, stmtDigest: string): Cached {
  const d = diag(Code.NotAvailable, 'information', `\`${stmt.kind}\` is not available in this version of Orbit Notes; the statement is kept and will be evaluated by a later version`, stmt.range);
  return definedNameOf(stmt) ? { line, diagnostics: [d], binding: { kind: 'failed', digest: stmtDigest, line } } : { line, diagnostics: [d] };
}

function warningsOf(result: StatementResult, range: Range): Diagnostic[] {
  return (result.warnings ?? []).map((w) => diag(w.code as Code, 'warning', w.message, range));
}

function isBuiltin(name: string): name is BuiltinBody {
  return (BUILTIN_BODIES as readonly string[]).includes(name);
}

function definedNameOf(stmt: Statement): Ident | undefined {
  return stmt.kind === 'let' || stmt.kind === 'body' || stmt.kind === 'series' ? stmt.name : undefined;
}

/** Names a statement reads (in any order; duplicates removed). */
export function referencedNames(stmt: Statement): string[] {
  const out = new Set<string>();
  const expr = (e: Expr | undefined): void => {
    if (!e) return;
    switch (e.type) {
      case 'name': out.add(e.name); break;
      case 'call': e.args.forEach(expr); break;
      case 'binary': expr(e.left); expr(e.right); break;
      case 'neg': expr(e.operand); break;
      case 'number': break;
    }
  };
  const id = (i: Ident): void => { out.add(i.name); };
  switch (stmt.kind) {
    case 'let': expr(stmt.expr); break;
    case 'body': expr(stmt.period); expr(stmt.mass); break;
    case 'synodic': case 'ratio': expr(stmt.a); expr(stmt.b); break;
    case 'relation': stmt.bodies.forEach(expr); break;
    case 'conjunctions': id(stmt.a); id(stmt.b); expr(stmt.within); break;
    case 'oppositions': id(stmt.a); break;
    case 'alignment': stmt.bodies.forEach(id); stmt.against.forEach(id); expr(stmt.within); break;
    case 'barycentre': expr(stmt.step); break;
    case 'periodogram': id(stmt.target); expr(stmt.periods?.from); expr(stmt.periods?.to); stmt.mark?.forEach(expr); break;
    case 'date': case 'series': case 'set': break;
  }
  return [...out].sort();
}

function collectSettings(statements: readonly Statement[], out: Diagnostic[]): NoteSettings {
  let calendar: CalendarMode = 'mixed';
  let seed = DEFAULT_SEED;
  const seen = new Map<string, Statement>();
  for (const s of statements) {
    if (s.kind !== 'set') continue;
    const prev = seen.get(s.key);
    if (prev) {
      out.push(diag(Code.Redefinition, 'error', `\`set ${s.key}\` appears twice (first on line ${prev.range.start.line + 1}); settings hold for the whole note, so give each once`, s.range));
      continue;
    }
    seen.set(s.key, s);
    if (s.key === 'seed') {
      const n = Number(s.value);
      if (Number.isSafeInteger(n) && n >= 0) seed = n;
      else out.push(diag(Code.BadOption, 'error', `a seed is a whole number from 0 to ${Number.MAX_SAFE_INTEGER}, got \`${s.value}\``, s.valueRange));
    } else if (s.value === 'gregorian' || s.value === 'mixed') {
      calendar = s.value;
    } else {
      out.push(diag(Code.BadOption, 'error', `the calendar is \`gregorian\` (proleptic) or \`mixed\` (Julian before 1582-10-15), got \`${s.value}\``, s.valueRange));
    }
  }
  return { calendar, seed };
}

function instantOf(d: DateLit, calendar: CalendarMode): Instant {
  if (d.form === 'jd') {
    if (!Number.isFinite(d.jd)) fail(Code.BadDate, 'the Julian Date is not a finite number', d.range);
    return d.scale === 'TT' ? instantFromTt(d.jd - J2000_JD) : instantFromUt(d.jd - J2000_JD);
  }
  const cd = { year: d.year, month: d.month, day: d.day, hour: d.hour, minute: d.minute, second: d.second };
  const problem = validateCalendarDate(cd, calendar);
  if (problem) fail(Code.BadDate, problem, d.range);
  return instantFromCalendar(cd, calendar, d.scale);
}

function makeScope(scope: ReadonlyMap<string, Binding>, stmtDigest: string, stmtLine: number): ExprScope {
  return {
    quantity: (name, range) => {
      const b = scope.get(name);
      if (!b) return undefined;
      if (b.kind === 'failed') fail(Code.DependsOnError, `\`${name}\` has no value: its definition on line ${b.line + 1} has an error`, range);
      return b.kind === 'quantity' ? b.value : undefined;
    },
    body: (name) => {
      const b = scope.get(name);
      if (b?.kind === 'body') return b.body;
      return isBuiltin(name) ? builtinBody(name) : undefined;
    },
    names: () => [...scope.keys(), ...BUILTIN_BODIES],
    inputId: (e) => `${stmtDigest}@${e.range.start.line - stmtLine}:${e.range.start.character}`,
  };
}

function builtinBody(id: BuiltinBody): ResolvedBody {
  const period = builtinPeriod(id);
  return period ? { kind: 'builtin', id, name: id, period } : { kind: 'builtin', id, name: id };
}

function resolveBody(e: Ident | Expr, scope: ReadonlyMap<string, Binding>): ResolvedBody {
  const name = 'name' in e && typeof e.name === 'string' ? e.name : undefined;
  if (name === undefined) fail(Code.UnexpectedToken, 'expected a body name here', e.range);
  const b = scope.get(name);
  if (b?.kind === 'body') return b.body;
  if (b?.kind === 'failed') fail(Code.DependsOnError, `\`${name}\` has no value: its definition on line ${b.line + 1} has an error`, e.range);
  if (b) fail(Code.UnknownBody, `\`${name}\` is ${b.kind === 'series' ? 'a series' : 'a quantity'}, not a body`, e.range);
  if (isBuiltin(name)) return builtinBody(name);
  const hint = suggest(name, [...BUILTIN_BODIES, ...[...scope.entries()].filter(([, v]) => v.kind === 'body').map(([k]) => k)]);
  return fail(Code.UnknownBody, `unknown body \`${name}\`${hint ? ` — did you mean \`${hint}\`?` : ''} (built in: ${BUILTIN_BODIES.join(', ')}; others need \`body NAME period …\`)`, e.range);
}

function resolveSeries(id: Ident, scope: ReadonlyMap<string, Binding>): Series {
  const b = scope.get(id.name);
  if (b?.kind === 'series') return b.series;
  if (b?.kind === 'failed') fail(Code.DependsOnError, `\`${id.name}\` has no data: its definition on line ${b.line + 1} has an error`, id.range);
  const hint = suggest(id.name, [...scope.entries()].filter(([, v]) => v.kind === 'series').map(([k]) => k));
  return fail(Code.UnknownName, `\`${id.name}\` is not a series${hint ? ` — did you mean \`${hint}\`?` : ''}; define it first with \`series ${id.name} from "file.csv" time COL value COL\``, id.range);
}

function userBody(stmt: Extract<Statement, { kind: 'body' }>, ctx: EvalContext): ResolvedBody {
  const p = ctx.value(stmt.period);
  let period: Quantity;
  if (p.dim === 'time') period = p;
  else if (p.dim === 'frequency') {
    if (!(p.value > 0)) fail(Code.OutOfRange, 'a frequency must be positive to give a period', stmt.period.range);
    period = reciprocal(p);
  }
  else if (p.dim === 'none') fail(Code.MissingUnit, 'a period needs a unit: write e.g. `7.3845 d`', stmt.period.range);
  else fail(Code.DimensionMismatch, `a period is a time (or a frequency), got ${describeDim(p.dim)}`, stmt.period.range);
  if (!(period.value > 0)) fail(Code.OutOfRange, 'a period must be positive', stmt.period.range);
  const mass = stmt.mass ? ctx.value(stmt.mass) : undefined;
  return { kind: 'user', name: stmt.name.name, period, ...(mass ? { mass } : {}) };
}

function letResult(name: string, value: Quantity, source: string): StatementResult {
  const contributions = [...value.contrib.entries()].filter(([, c]) => c !== 0);
  return {
    kind: 'let',
    summary: `${name} = ${formatQuantity(value)}`,
    details: [
      source.trim(),
      sigmaOf(value) > 0
        ? `Standard uncertainty from ${contributions.length} independent input${contributions.length === 1 ? '' : 's'}, first-order propagation (JCGM 100:2008, eq. 10).`
        : 'Exact: no input carries an uncertainty.',
    ],
    tables: [],
    provenance: { libraries: [`orbit-notes ${ORBIT_NOTES_VERSION}`] },
    cautions: [],
    value: toJson(value),
  };
}

function bodyResult(body: ResolvedBody): StatementResult {
  const p = body.period!;
  const n = reciprocal(p);
  const meanMotionRadPerDay = { value: n.value * 2 * Math.PI, dim: 'angular-rate' as const, contrib: new Map([...n.contrib].map(([k, c]) => [k, c * 2 * Math.PI])) };
  return {
    kind: 'body',
    summary: `${body.name}: period ${formatQuantity(p)}, mean motion ${formatQuantity(meanMotionRadPerDay)}`,
    details: ['A user body has a period (and optionally a mass) but no ephemeris: position searches need a built-in body.'],
    tables: [],
    provenance: { libraries: [`orbit-notes ${ORBIT_NOTES_VERSION}`] },
    cautions: [],
    value: toJson(p),
  };
}

function setResult(stmt: Extract<Statement, { kind: 'set' }>): StatementResult {
  return {
    kind: 'set',
    summary: stmt.key === 'seed' ? `seed ${stmt.value} for every Monte-Carlo figure of this note` : `calendar: ${stmt.value === 'gregorian' ? 'proleptic Gregorian throughout' : 'Julian before 1582-10-15, Gregorian after'}`,
    details: ['Settings hold for the whole note, wherever they are written.'],
    tables: [],
    provenance: { libraries: [] },
    cautions: [],
  };
}

/**
 * The statement's text as written: from its first to its last line, whole lines, taken
 * from the block's content (so a quote's `>` or a list's indentation is not part of it).
 */
function sourceOf(block: ExtractedBlock, range: Range): string {
  return block.content.split('\n').slice(range.start.line - block.contentStartLine, range.end.line - block.contentStartLine + 1).join('\n');
}

function lineRange(lines: readonly string[], line: number): Range {
  const l = Math.min(Math.max(0, line), Math.max(0, lines.length - 1));
  return { start: { line: l, character: 0 }, end: { line: l, character: (lines[l] ?? '').length } };
}

function shiftLines(d: Diagnostic, by: number): Diagnostic {
  return { ...d, range: { start: { line: d.range.start.line + by, character: d.range.start.character }, end: { line: d.range.end.line + by, character: d.range.end.character } } };
}
