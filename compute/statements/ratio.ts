/**
 * `ratio A B [up-to N]`: the period ratio (longer over shorter), its continued-fraction
 * convergents with denominators ≤ N, the nearest p:q, the offset from it, and the chance of
 * a random ratio landing as close under a stated null model.
 */
import type { Statement } from '../../language/ast.js';
import { Code } from '../../language/diagnostics.js';
import { fail, type EvalContext } from '../context.js';
import { ORBIT_NOTES_VERSION } from '../provenance.js';
import { div, formatQuantity, formatSig, sigmaOf, toJson } from '../quantity.js';
import { analyseRatio, MAX_RATIO_DENOMINATOR } from '../ratio.js';
import type { StatementResult, Table } from '../result.js';
import { formatChance, NOT_EVIDENCE, periodOperand, wholeOption } from './operands.js';

type RatioStmt = Extract<Statement, { kind: 'ratio' }>;

/** Default denominator bound N. */
export const DEFAULT_RATIO_DENOMINATOR = 10;

/**
 * Evaluate a `ratio` statement.
 * @throws EvalError: operand errors (see {@link periodOperand}); OB302 for N outside 1 … 1000.
 */
export function evalRatio(stmt: RatioStmt, ctx: EvalContext): StatementResult {
  const n = wholeOption(stmt.upTo, DEFAULT_RATIO_DENOMINATOR, 1, MAX_RATIO_DENOMINATOR, 'up-to', stmt);
  const a = periodOperand(stmt.a, ctx, 'the first operand');
  const b = periodOperand(stmt.b, ctx, 'the second operand');
  // Longer over shorter, the way commensurabilities are quoted (3:2, not 2:3).
  const [outer, inner] = a.period.value >= b.period.value ? [a, b] : [b, a];
  const ratio = div(outer.period, inner.period);
  if (!Number.isFinite(ratio.value)) fail(Code.OutOfRange, 'the period ratio is not a finite number', stmt.range);
  const an = analyseRatio(ratio, n);
  const { nearest } = an;
  const sigma = sigmaOf(ratio);
  const name = `P(${outer.label}) / P(${inner.label})`;
  const offsetPct = { ...an.offset, value: an.offset.value * 100, contrib: new Map([...an.offset.contrib].map(([k, c]) => [k, c * 100])) };
  const offsetText = `${formatQuantity(offsetPct, { name: '%', dim: 'none', factor: 1 })}`;
  const resolved = sigma > 0 && Math.abs(an.offset.value) <= sigmaOf(an.offset);

  const convergentTable: Table = {
    title: `Continued fraction ${formatTerms(an.terms)}: convergents with denominator ≤ ${n}`,
    columns: ['p:q', 'p/q', 'ratio − p/q', 'within 1σ'],
    rows: an.convergents.map((c) => [
      `${c.p}:${c.q}`,
      formatSig(c.p / c.q, 8),
      signed(ratio.value - c.p / c.q),
      sigma > 0 ? (c.withinSigma ? 'yes' : 'no') : '—',
    ]),
    align: ['l', 'r', 'r', 'l'],
  };
  const mainTable: Table = {
    columns: ['quantity', 'value'],
    rows: [
      [name, formatQuantity(ratio)],
      [`nearest p:q with q ≤ ${n}`, `${nearest.p}:${nearest.q}`],
      ['ratio − p/q', signed(ratio.value - nearest.p / nearest.q)],
      ['fractional offset ratio·q/p − 1', offsetText],
      ['chance under the null model', formatChance(an.chance)],
    ],
    align: ['l', 'r'],
  };

  return {
    kind: 'ratio',
    summary: `${name} = ${formatQuantity(ratio)} · nearest ${nearest.p}:${nearest.q} (offset ${offsetText}) · chance ${formatChance(an.chance)}`,
    details: [
      `Ratio of the longer to the shorter period: ${name}, uncertainty to first order.`,
      `P(${outer.label}) = ${formatQuantity(outer.period)}; P(${inner.label}) = ${formatQuantity(inner.period)}`,
      'Convergents pₙ/qₙ of the regular continued fraction (Hardy & Wright, ch. 10); every best approximation of the second kind is one of them.',
      `Nearest p:q: the fraction with q ≤ ${n} closest to the ratio (smallest q among ties).`,
      `Null model: ${an.nullModel}.`,
      `Chance: the probability that a ratio drawn under the null lies at least as close (${formatSig(nearest.distance, 3)}) to some p/q with q ≤ ${n}; exact, not simulated.`,
      ...(resolved ? [`The offset from ${nearest.p}:${nearest.q} is within one standard uncertainty: the data do not separate the ratio from exact ${nearest.p}:${nearest.q}.`] : []),
    ],
    tables: [mainTable, convergentTable],
    provenance: { libraries: [`orbit-notes ${ORBIT_NOTES_VERSION}`] },
    cautions: [NOT_EVIDENCE],
    value: toJson(ratio),
  };
}

function formatTerms(terms: readonly number[]): string {
  if (terms.length === 0) return '[]';
  const [a0, ...rest] = terms;
  return `[${a0}${rest.length ? `; ${rest.join(', ')}` : ''}]`;
}

function signed(x: number): string {
  if (x === 0) return '0';
  // ASCII minus, as formatQuantity prints it, so that one table reads alike.
  return `${x > 0 ? '+' : '-'}${formatSig(Math.abs(x), 3)}`;
}
