/**
 * Relation search over 7 mean motions with |k| ≤ 4 (9⁷ ≈ 4.8 million vectors) plus 10⁴
 * Monte-Carlo trials (ranked and tested by absolute residual), against brute force over the
 * whole box measured in the same run.
 */
import { planRelationSearch, relationChance, searchRelations, searchRelationsExhaustive, bestScoreExhaustive } from '../compute/relation.js';
import { createRng } from '../compute/random.js';
import { timeMs, type BenchRow } from './types.js';

/** An invented seven-planet system (days). */
const PERIODS = [2.91, 4.37, 6.62, 9.95, 15.1, 22.4, 34.0];
const BOUND = 4;
const TRIALS = 10_000;
const TOP = 5;

function fastRun(): number {
  const freqs = PERIODS.map((p) => 1 / p);
  const plan = planRelationSearch(PERIODS.length, BOUND);
  const found = searchRelations(freqs, BOUND, TOP, undefined, plan);
  const chance = relationChance(PERIODS, BOUND, found.map((r) => r.score), TRIALS, 1, undefined, plan);
  return chance.hits[0]!;
}

function cpuMs(fn: () => unknown): number {
  const c0 = process.cpuUsage();
  fn();
  const c = process.cpuUsage(c0);
  return (c.user + c.system) / 1000;
}

export async function run(): Promise<BenchRow[]> {
  const rows: BenchRow[] = [];
  const freqs = PERIODS.map((p) => 1 / p);

  // Brute force: the listing over the whole box once, then per trial the best score over the box.
  const naiveTrials = 5;
  const rng = createRng(1);
  const lo = Math.log(PERIODS[0]!);
  const span = Math.log(PERIODS[PERIODS.length - 1]!) - lo;
  const draws = Array.from({ length: naiveTrials }, () => PERIODS.map(() => Math.exp(-(lo + span * rng.uniform()))));
  const naiveListMs = await timeMs(() => searchRelationsExhaustive(freqs, BOUND, TOP), 1);
  const t0 = performance.now();
  for (const d of draws) bestScoreExhaustive(d, BOUND);
  const naivePerTrialMs = (performance.now() - t0) / naiveTrials;
  const naiveTotalMs = naiveListMs + TRIALS * naivePerTrialMs;

  const fastMs = await timeMs(fastRun, 3);
  const fastCpuMs = cpuMs(fastRun);
  rows.push({
    name: `relation 7 motions |k| ≤ ${BOUND} + ${TRIALS} trials (wall, median of 3)`, value: fastMs, unit: 'ms',
    baseline: naiveTotalMs, ratio: naiveTotalMs / fastMs, target: '< 2000 ms', pass: fastMs < 2000,
  });
  // CPU time of this process: the figure to judge when other work shares the machine.
  rows.push({ name: 'same run, CPU time of this process', value: fastCpuMs, unit: 'ms', target: '< 2000 ms', pass: fastCpuMs < 2000 });

  const plan = planRelationSearch(PERIODS.length, BOUND);
  const trialMs = await timeMs(() => relationChance(PERIODS, BOUND, [1e-6], 1000, 2, undefined, plan), 3) / 1000;
  rows.push({
    name: 'per trial: meet in the middle vs brute force over 9⁷ vectors', value: trialMs * 1000, unit: 'µs',
    baseline: naivePerTrialMs * 1000, ratio: naivePerTrialMs / trialMs,
  });

  const fast = searchRelations(freqs, BOUND, TOP);
  const slow = searchRelationsExhaustive(freqs, BOUND, TOP);
  const same = fast.every((r, i) => r.k.join() === slow[i]?.k.join());
  rows.push({
    name: 'top relations identical to brute force (1 = yes)', value: same ? 1 : 0, unit: '',
    target: '1', pass: same,
  });
  return rows;
}
