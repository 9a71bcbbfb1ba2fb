/** Operands of `synodic`, `ratio` and `relation`: bodies or period expressions. */
import type { Expr } from '../../language/ast.js';
import { Code } from '../../language/diagnostics.js';
import { EvalError, fail, type EvalContext, type ResolvedBody } from '../context.js';
import { bodyPeriod } from '../expr.js';
import { describeDim, formatQuantity, propagate, reciprocal, type Quantity } from '../quantity.js';
import { exprLabel } from './periodogram.js';

export interface PeriodOperand {
  /** Source-like text for tables and summaries (`jupiter`, `7.3845 d ± 0.0002`). */
  readonly label: string;
  /** Period in days (time dimension), > 0, with its uncertainty contributions. */
  readonly period: Quantity;
  /** The body, when the operand named one. */
  readonly body?: ResolvedBody;
  readonly expr: Expr;
}

/**
 * Read an operand as a period. A name of a body (built-in or `body`) stands for its period;
 * anything else is evaluated: a time is a period, a frequency (`/d`) or an angular rate
 * (`deg/d`) is a mean motion and is inverted.
 * @param what how the operand is called in messages (`the first operand`)
 * @throws EvalError: OB203 unknown body / OB201 unknown name (with hints, from the context),
 *   OB303 for a body without a period, OB106 for a plain number, OB301 for another dimension,
 *   OB302 for a period that is not positive
 */
export function periodOperand(e: Expr, ctx: EvalContext, what: string): PeriodOperand {
  const label = exprLabel(e);
  if (e.type === 'name') {
    let body: ResolvedBody | undefined;
    try {
      body = ctx.body(e);
    } catch (err) {
      // Not a body: fall through to a quantity defined by `let` (or the context's own error).
      if (!(err instanceof EvalError) || err.code !== Code.UnknownBody) throw err;
    }
    if (body) return { label, period: positive(bodyPeriod(body, e.range), e, what), body, expr: e };
  }
  const q = ctx.value(e);
  switch (q.dim) {
    case 'time': return { label, period: positive(q, e, what), expr: e };
    case 'frequency': return { label, period: reciprocal(positive(q, e, what)), expr: e };
    case 'angular-rate': {
      // n [rad/d] / 2π = cycles per day.
      const f = propagate(q.value / (2 * Math.PI), 'frequency', [[q, 1 / (2 * Math.PI)]]);
      return { label, period: reciprocal(positive(f, e, what)), expr: e };
    }
    case 'none':
      return fail(Code.MissingUnit, `${what} needs a unit: write a period such as \`7.3845 d\` or \`11.86 yr\`, or a mean motion such as \`0.135 /d\``, e.range);
    default:
      return fail(Code.DimensionMismatch, `${what} must be a body, a period or a mean motion, not ${describeDim(q.dim)}`, e.range);
  }
}

function positive(q: Quantity, e: Expr, what: string): Quantity {
  if (!(q.value > 0) || !Number.isFinite(q.value)) fail(Code.OutOfRange, `${what} must be positive and finite, got ${formatQuantity(q)}`, e.range);
  return q;
}

/** A whole-number option (`up-to N`, `top M`) within bounds, or its default. */
export function wholeOption(value: number | undefined, fallback: number, min: number, max: number, name: string, e: Expr | { readonly range: Expr['range'] }): number {
  const v = value ?? fallback;
  if (!(Number.isInteger(v) && v >= min && v <= max)) fail(Code.OutOfRange, `\`${name}\` must be a whole number from ${min} to ${max}, got ${v}`, e.range);
  return v;
}

/** The caution every commensurability result carries. */
export const NOT_EVIDENCE = 'A near-commensurability is not evidence of a physical resonance by itself: that needs a resonant angle that librates, shown by dynamics, not by periods alone.';

/** Probability for display: two decimals, or one significant digit when small, or "< 1/T". */
export function formatChance(p: number, trials?: number): string {
  if (trials !== undefined && p === 0) return `< ${formatSmall(1 / trials)}`;
  if (p >= 0.995) return '1.00';
  if (p >= 0.01) return p.toFixed(2);
  return formatSmall(p);
}

function formatSmall(p: number): string {
  return p === 0 ? '0' : p.toExponential(1);
}
