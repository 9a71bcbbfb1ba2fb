/**
 * The statement handlers, by keyword. `let`, `body`, `set` and `series` define names
 * and are handled by the note evaluator itself; the rest are pure functions of their
 * statement and the evaluation context.
 */
import type { Statement, StatementKind } from '../../language/ast.js';
import type { EvalContext, Series } from '../context.js';
import type { StatementResult } from '../result.js';
import { evalAlignment } from './alignment.js';
import { evalBarycentre } from './barycentre.js';
import { evalConjunctions } from './conjunctions.js';
import { evalOppositions } from './oppositions.js';
import { evalDate } from './date.js';
import { evalPeriodogram } from './periodogram.js';
import { evalRatio } from './ratio.js';
import { evalRelation } from './relation.js';
import { loadSeries } from './series.js';
import { evalSynodic } from './synodic.js';

export type Handler<K extends StatementKind> =
  (stmt: Extract<Statement, { kind: K }>, ctx: EvalContext) => StatementResult | Promise<StatementResult>;

export type SeriesLoader =
  (stmt: Extract<Statement, { kind: 'series' }>, ctx: EvalContext) => Promise<{ series: Series; result: StatementResult }>;

export interface Handlers {
  readonly date?: Handler<'date'>;
  readonly synodic?: Handler<'synodic'>;
  readonly ratio?: Handler<'ratio'>;
  readonly relation?: Handler<'relation'>;
  readonly conjunctions?: Handler<'conjunctions'>;
  readonly oppositions?: Handler<'oppositions'>;
  readonly alignment?: Handler<'alignment'>;
  readonly barycentre?: Handler<'barycentre'>;
  readonly periodogram?: Handler<'periodogram'>;
  readonly series?: SeriesLoader;
}

export const HANDLERS: Handlers = {
  date: evalDate,
  synodic: evalSynodic,
  ratio: evalRatio,
  relation: evalRelation,
  series: loadSeries,
  periodogram: evalPeriodogram,
  conjunctions: evalConjunctions,
  oppositions: evalOppositions,
  alignment: evalAlignment,
  barycentre: evalBarycentre,
};
