/** Evaluation of `let` expressions: numbers with units and uncertainties, names, calls. */
import type { Expr } from '../language/ast.js';
import { Code, suggest } from '../language/diagnostics.js';
import { fail, type ResolvedBody } from './context.js';
import { synodicPeriod } from './synodic.js';
import {
  abs, add, describeDim, DimensionError, div, lookupUnit, measured, mul, neg, reciprocal, exact, type Quantity,
} from './quantity.js';

export interface ExprScope {
  /** A quantity bound by `let`, or undefined. Throws EvalError for a name whose definition failed. */
  quantity(name: string, range: Expr['range']): Quantity | undefined;
  /** A body (built-in or user) by name, or undefined. */
  body(name: string): ResolvedBody | undefined;
  /** All names in scope, for "did you mean" hints. */
  names(): Iterable<string>;
  /** A stable input id for the literal at a range (so that equal re-evaluations produce equal ids). */
  inputId(e: Expr): string;
}

/** Period of a body as a time quantity (user bodies' periods may be written as frequencies). */
export function bodyPeriod(b: ResolvedBody, range: Expr['range']): Quantity {
  const p = b.period;
  if (!p) fail(Code.NotAvailable, `\`${b.name}\` has no orbital period about the Sun`, range);
  return p.dim === 'frequency' ? reciprocal(p) : p;
}

/** Evaluate an expression to a quantity. Throws EvalError with the failing node's range. */
export function evaluateExpr(e: Expr, scope: ExprScope): Quantity {
  switch (e.type) {
    case 'number': {
      let factor = 1;
      let dim: Quantity['dim'] = 'none';
      if (e.unit !== undefined) {
        const u = lookupUnit(e.unit);
        if (!u) fail(Code.UnknownUnit, `unknown unit \`${e.unit}\``, e.unitRange ?? e.range);
        factor = u.factor;
        dim = u.dim;
      }
      const value = e.value * factor;
      if (e.sigma === undefined) return exact(value, dim);
      let sFactor = factor;
      if (e.sigmaUnit !== undefined) {
        const su = lookupUnit(e.sigmaUnit);
        if (!su) fail(Code.UnknownUnit, `unknown unit \`${e.sigmaUnit}\` after ±`, e.range);
        if (su.dim !== dim) fail(Code.DimensionMismatch, `the uncertainty is ${describeDim(su.dim)} but the value is ${describeDim(dim)}`, e.range);
        sFactor = su.factor;
      }
      if (!(e.sigma >= 0)) fail(Code.BadNumber, 'an uncertainty must be zero or positive', e.range);
      return measured(value, e.sigma * sFactor, dim, scope.inputId(e));
    }
    case 'name': {
      const q = scope.quantity(e.name, e.range);
      if (q) return q;
      const b = scope.body(e.name);
      if (b) fail(Code.DimensionMismatch, `\`${e.name}\` is a body, not a quantity: write \`period(${e.name})\` or \`frequency(${e.name})\``, e.range);
      return unknownName(e.name, e.range, scope);
    }
    case 'neg': return neg(evaluateExpr(e.operand, scope));
    case 'binary': {
      const l = evaluateExpr(e.left, scope);
      const r = evaluateExpr(e.right, scope);
      try {
        switch (e.op) {
          case '+': return add(l, r, 1);
          case '-': return add(l, r, -1);
          case '*': return mul(l, r);
          case '/': return div(l, r);
        }
      } catch (err) {
        if (err instanceof DimensionError) {
          const hint = (l.dim === 'none' || r.dim === 'none') ? ' — a number without a unit is a plain number; add its unit, e.g. `11.86 yr`' : '';
          fail(Code.DimensionMismatch, `${err.message}${hint}`, e.range);
        }
        if (err instanceof RangeError) fail(Code.OutOfRange, err.message, e.range);
        throw err;
      }
    }
    // falls through: the inner switch returns on every operator
    case 'call': {
      const fn = e.fn.name;
      const bodyArg = (i: number): Quantity => {
        const a = e.args[i];
        if (!a) fail(Code.MissingArgument, `\`${fn}\` needs ${i + 1 === 1 ? 'an argument' : 'a second argument'}`, e.range);
        return periodOperand(a, scope);
      };
      if (fn === 'period' || fn === 'frequency') {
        if (e.args.length !== 1) fail(Code.MissingArgument, `\`${fn}(…)\` takes one body or period`, e.range);
        const p = bodyArg(0);
        return fn === 'period' ? p : reciprocal(p);
      }
      if (fn === 'synodic') {
        if (e.args.length !== 2) fail(Code.MissingArgument, '`synodic(a, b)` takes two bodies or periods', e.range);
        return synodicAt(bodyArg(0), bodyArg(1), e.range);
      }
      if (fn === 'abs') {
        if (e.args.length !== 1) fail(Code.MissingArgument, '`abs(…)` takes one argument', e.range);
        return abs(evaluateExpr(e.args[0]!, scope));
      }
      return fail(Code.UnknownName, `unknown function \`${fn}\`; the functions are period(b), frequency(b), synodic(a, b), abs(x)`, e.fn.range);
    }
  }
}

function unknownName(name: string, range: Expr['range'], scope: ExprScope, what: 'name' | 'body' = 'name'): never {
  const best = suggest(name, scope.names());
  fail(what === 'body' ? Code.UnknownBody : Code.UnknownName, `unknown ${what === 'body' ? 'body or name' : 'name'} \`${name}\`${best ? ` — did you mean \`${best}\`?` : ' (names must be defined by `let`, `body` or `series` above their use)'}`, range);
}

/** An operand that stands for a period: a body name, or an expression of time (or frequency) dimension. */
export function periodOperand(e: Expr, scope: ExprScope): Quantity {
  if (e.type === 'name') {
    const b = scope.body(e.name);
    const q = scope.quantity(e.name, e.range);
    if (b && !q) return bodyPeriod(b, e.range);
    if (!b && !q) unknownName(e.name, e.range, scope, 'body');
  }
  const q = evaluateExpr(e, scope);
  if (q.dim === 'time') return q;
  if (q.dim === 'frequency') return reciprocal(q);
  if (q.dim === 'none') fail(Code.MissingUnit, 'a period needs a unit: write e.g. `11.86 yr` or `224.7 d`', e.range);
  return fail(Code.DimensionMismatch, `expected a period (a time) or a frequency, got ${describeDim(q.dim)}`, e.range);
}

/** Synodic period (compute/synodic.ts), with equal periods reported at the expression. */
function synodicAt(pa: Quantity, pb: Quantity, range: Expr['range']): Quantity {
  try {
    return synodicPeriod(pa, pb);
  } catch (err) {
    if (err instanceof RangeError) fail(Code.OutOfRange, err.message, range);
    throw err;
  }
}

