/**
 * `relation A B C … [up-to K] [top M]`: integer relations Σ kᵢnᵢ ≈ 0 among the mean motions,
 * ranked by absolute residual |Σ kᵢnᵢ| (longest circulation period of the resonant angle first),
 * each with its residual frequency, the circulation period, the Σk = 0 flag, the pair-synodic
 * reading and a seeded Monte-Carlo chance probability.
 */
import type { Statement } from '../../language/ast.js';
import { Code } from '../../language/diagnostics.js';
import { fail, type EvalContext } from '../context.js';
import { ORBIT_NOTES_VERSION } from '../provenance.js';
import { defaultUnit, exact, formatQuantity, reciprocal, sigmaOf, type Quantity } from '../quantity.js';
import { RNG_LABEL } from '../random.js';
import { gcd } from '../ratio.js';
import {
  DEFAULT_RELATION_BOUND, MAX_RELATION_BODIES, MIN_RELATION_BODIES, planRelationSearch, readRelation,
  relationChance, searchRelations, type RelationPlan, type RelationReading,
} from '../relation.js';
import type { StatementResult, Table } from '../result.js';
import { formatChance, NOT_EVIDENCE, periodOperand, wholeOption } from './operands.js';

type RelationStmt = Extract<Statement, { kind: 'relation' }>;

/** Default number of relations listed, and the most. */
export const DEFAULT_RELATION_TOP = 5;
export const MAX_RELATION_TOP = 50;
/** Monte-Carlo trials per `relation` statement (checked against the trial limit). */
export const RELATION_TRIALS = 10_000;
/** Largest coefficient bound the statement accepts (the table-size limit may stop it earlier). */
export const MAX_RELATION_BOUND = 20;

/**
 * Evaluate a `relation` statement.
 * @throws EvalError: operand errors; OB302 for fewer than 2 or more than 8 motions, equal
 *   bodies, or options out of range. LimitError when the search tables or trials exceed their
 *   limits; CancelledError when cancelled.
 */
export function evalRelation(stmt: RelationStmt, ctx: EvalContext): StatementResult {
  const count = stmt.bodies.length;
  if (count < MIN_RELATION_BODIES || count > MAX_RELATION_BODIES) {
    fail(Code.OutOfRange, `\`relation\` takes ${MIN_RELATION_BODIES} to ${MAX_RELATION_BODIES} bodies or mean motions, got ${count}`, stmt.range);
  }
  const bound = wholeOption(stmt.upTo, DEFAULT_RELATION_BOUND, 1, MAX_RELATION_BOUND, 'up-to', stmt);
  const top = wholeOption(stmt.top, DEFAULT_RELATION_TOP, 1, MAX_RELATION_TOP, 'top', stmt);
  const ops = stmt.bodies.map((e, i) => periodOperand(e, ctx, `operand ${i + 1}`));
  const seen = new Map<string, number>();
  ops.forEach((o, i) => {
    const prev = seen.get(o.label);
    if (prev !== undefined) fail(Code.OutOfRange, `\`${o.label}\` is listed twice (operands ${prev + 1} and ${i + 1}); each mean motion once`, o.expr.range);
    seen.set(o.label, i);
  });
  const freqs: Quantity[] = ops.map((o) => reciprocal(o.period));
  let plan: RelationPlan;
  try {
    plan = planRelationSearch(count, bound);
  } catch (err) {
    if (err instanceof RangeError) fail(Code.OutOfRange, err.message, stmt.range);
    throw err;
  }
  const found = searchRelations(freqs.map((f) => f.value), bound, top, ctx.budget, plan);
  const chance = relationChance(ops.map((o) => o.period.value), bound, found.map((r) => r.score), RELATION_TRIALS, ctx.seed, ctx.budget, plan);
  const readings = found.map((r) => readRelation(r.k, freqs));
  const labels = ops.map((o) => o.label);

  const rows = readings.map((r, i) => {
    const p = chance.hits[i]! / chance.trials;
    return [
      String(i + 1),
      angleText(r.k, labels),
      formatQuantity(r.residual),
      circulationText(r),
      r.coefficientSum === 0 ? '0 (yes)' : String(r.coefficientSum),
      pairText(r, labels, freqs),
      formatChance(p, chance.trials),
    ];
  });
  const table: Table = {
    title: `Integer relations Σ kᵢnᵢ ≈ 0 with |kᵢ| ≤ ${bound}, best ${readings.length} of ${plan.combinations.toLocaleString('en-US')}`,
    columns: ['#', 'resonant angle', 'residual Σkn', 'circulation period', 'Σk = 0', 'as pair synodic frequencies', 'chance'],
    rows,
    align: ['r', 'l', 'r', 'r', 'l', 'l', 'r'],
  };
  const motionTable: Table = {
    title: 'Mean motions',
    columns: ['operand', 'period', 'mean motion n'],
    rows: ops.map((o, i) => [o.label, formatQuantity(o.period), formatQuantity(freqs[i]!)]),
    align: ['l', 'r', 'r'],
  };

  const best = readings[0];
  const bestP = chance.hits[0] !== undefined ? chance.hits[0] / chance.trials : 1;
  const summary = best
    ? `best: ${angleText(best.k, labels)} · residual ${formatQuantity(best.residual)} · circulation ${circulationText(best)}${best.coefficientSum === 0 ? ' · Σk = 0' : ''} · chance ${formatChance(bestP, chance.trials)}`
    : 'no relation found';
  const cautions = [NOT_EVIDENCE];
  if (readings.some((r) => r.coefficientSum !== 0)) {
    cautions.push('For a relation with Σk ≠ 0 the resonant angle must also contain pericentre longitudes (d\'Alembert rule); its true frequency then includes apsidal precession, which periods alone do not give.');
  }
  if (readings.some((r) => r.consistentWithZero)) {
    cautions.push('A residual within 2σ of zero: the periods are consistent with an exact commensurability, and the circulation period is only bounded from below.');
  }

  return {
    kind: 'relation',
    summary,
    details: [
      `Search: every integer vector k with |kᵢ| ≤ ${bound} over ${count} mean motions, ${plan.combinations.toLocaleString('en-US')} up to overall sign; listed only if primitive (gcd 1) with the first non-zero kᵢ positive.`,
      'Ranking: absolute residual |Σ kᵢnᵢ|, smallest first — the same as the circulation period 1/|Σ kᵢnᵢ| of the angle Σ kᵢλᵢ, longest first, so the slowest-circulating angle leads (ties: smaller Σ|kᵢ| first). A near-exact pair commensurability plus a three-body relation can still beat the three-body relation alone; read the Σk column with it.',
      'Residual Σ kᵢnᵢ with first-order uncertainty from the periods; circulation period of the angle Σ kᵢλᵢ = 1/|Σ kᵢnᵢ|.',
      'Σk = 0: the angle Σ kᵢλᵢ is a valid resonant angle without pericentre terms (d\'Alembert rule), as for Laplace-type relations.',
      'Pair reading: over the involved motions in listed order, Σ kᵢnᵢ = Σⱼ Cⱼ·f(j, j+1) + (Σk)·n(last), with f(x, y) = n(x) − n(y) the signed synodic frequency of a pair (1/f its synodic period) and Cⱼ the partial sums of k.',
      `Chance: ${chance.nullModel}; the fraction of ${chance.trials} trials whose best relation has an absolute residual at or below the listed one's.`,
      `Random numbers: seed ${chance.seed} (\`set seed N\`), ${RNG_LABEL}.`,
      'Method: meet in the middle over two half tables of coefficients; for each entry of one table, an interval query on the other, sorted by partial sum (Horowitz & Sahni 1974).',
    ],
    tables: [table, motionTable],
    provenance: {
      libraries: [`orbit-notes ${ORBIT_NOTES_VERSION}`, RNG_LABEL],
      random: `seed ${chance.seed}, ${chance.trials} trials`,
    },
    cautions,
  };
}

/** `λ(b) − 2λ(c) + λ(d)` */
export function angleText(k: readonly number[], labels: readonly string[]): string {
  return linear(k.map((c, i) => [c, `λ(${labels[i]!})`] as const));
}

function linear(terms: ReadonlyArray<readonly [number, string]>): string {
  let out = '';
  for (const [c, sym] of terms) {
    if (c === 0) continue;
    const mag = Math.abs(c) === 1 ? '' : `${Math.abs(c)}`;
    if (out === '') out = `${c < 0 ? '−' : ''}${mag}${sym}`;
    else out += ` ${c < 0 ? '−' : '+'} ${mag}${sym}`;
  }
  return out === '' ? '0' : out;
}

function circulationText(r: RelationReading): string {
  if (!r.circulation) return '∞ (exact)';
  if (r.consistentWithZero) {
    const lower = exact(1 / (Math.abs(r.residual.value) + 2 * sigmaOf(r.residual)), 'time');
    return `> ${formatQuantity(lower, defaultUnit(lower), 2)} (residual within 2σ of 0)`;
  }
  return formatQuantity(r.circulation);
}

/**
 * The relation as pair synodic frequencies, and when it has two terms, as a ratio of synodic
 * periods (or of a synodic period and an orbital period): c₁X₁ + c₂X₂ ≈ 0 with X = 1/Y gives
 * Y₁ : Y₂ = |c₁| : |c₂| when the two terms have opposite signs.
 */
function pairText(r: RelationReading, labels: readonly string[], freqs: readonly Quantity[]): string {
  const involved = r.k.map((c, i) => (c !== 0 ? i : -1)).filter((i) => i >= 0);
  const last = involved[involved.length - 1]!;
  const terms: Array<{ c: number; sym: string; period: string; value: number }> = r.pairs.map((p) => ({
    c: p.coefficient,
    sym: `f(${labels[p.from]!},${labels[p.to]!})`,
    period: `S(${labels[p.from]!},${labels[p.to]!})`,
    value: freqs[p.from]!.value - freqs[p.to]!.value,
  })).filter((t) => t.c !== 0);
  if (r.coefficientSum !== 0) terms.push({ c: r.coefficientSum, sym: `n(${labels[last]!})`, period: `P(${labels[last]!})`, value: freqs[last]!.value });
  const text = `${linear(terms.map((t) => [t.c, t.sym] as const))} ≈ 0`;
  if (terms.length === 2) {
    const [t1, t2] = terms as [typeof terms[0], typeof terms[0]];
    if (Math.sign(t1.c * t1.value) !== Math.sign(t2.c * t2.value)) {
      const g = gcd(Math.abs(t1.c), Math.abs(t2.c));
      return `${text}, i.e. ${t1.period} : ${t2.period} = ${Math.abs(t1.c) / g} : ${Math.abs(t2.c) / g}`;
    }
  }
  return text;
}
