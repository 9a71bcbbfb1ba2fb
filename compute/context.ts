/**
 * What a statement handler gets from the note evaluator. Handlers are pure functions
 * `(statement, ctx) => StatementResult`; they throw {@link EvalError} (with a range and
 * a stable code) for anything the user must fix.
 */
import type { DateLit, Expr, Ident, Range } from '../language/ast.js';
import { Code } from '../language/diagnostics.js';
import type { Budget } from './limits.js';
import type { Quantity } from './quantity.js';
import type { CalendarMode, Instant } from './time.js';

export type BuiltinBody =
  | 'sun' | 'moon' | 'mercury' | 'venus' | 'earth' | 'mars' | 'jupiter' | 'saturn'
  | 'uranus' | 'neptune' | 'pluto' | 'ssb';

export const BUILTIN_BODIES: readonly BuiltinBody[] = [
  'sun', 'moon', 'mercury', 'venus', 'earth', 'mars', 'jupiter', 'saturn', 'uranus', 'neptune', 'pluto', 'ssb',
];

export type ResolvedBody =
  | { readonly kind: 'builtin'; readonly id: BuiltinBody; readonly name: string; /** Mean sidereal period, when the body orbits the Sun. */ readonly period?: Quantity }
  | { readonly kind: 'user'; readonly name: string; readonly period: Quantity; readonly mass?: Quantity };

/** A loaded time series: times in days (JD TT when absolute, or days of the file's unit), sorted. */
export interface Series {
  readonly name: string;
  /** Times in days (a `yr` column is converted with the Julian year). */
  readonly tDays: readonly number[];
  readonly values: readonly number[];
  /** Where it came from, for provenance: path and content digest. */
  readonly source: string;
}

export class EvalError extends Error {
  constructor(readonly code: Code, message: string, readonly range: Range) {
    super(message);
    this.name = 'EvalError';
  }
}

export interface EvalContext {
  readonly calendar: CalendarMode;
  /** Seed for every Monte-Carlo figure in this note (`set seed N`, default 1). */
  readonly seed: number;
  readonly budget: Budget;
  /** The instant a date literal names (throws EvalError for impossible dates). */
  instant(d: DateLit): Instant;
  /** Evaluate an expression (throws EvalError for unknown names, dimension errors). */
  value(e: Expr): Quantity;
  /** A body by name (throws EvalError with a "did you mean" hint when unknown). */
  body(id: Ident | Expr): ResolvedBody;
  /** A series defined earlier in the note (throws EvalError when unknown). */
  series(id: Ident): Series;
  /** Read a text file relative to the note, confined to the workspace (throws EvalError). */
  readText(path: string, range: Range): Promise<string>;
}

/** Convenience: raise an error at a node. */
export function fail(code: Code, message: string, range: Range): never {
  throw new EvalError(code, message, range);
}
