/**
 * Conjunction searches against fixed-step scans measured in the same run (issue 2, item 10):
 *
 * - heliocentric Jupiter–Saturn and Uranus–Neptune over 10,000 years (−3000 … +7000):
 *   ephemeris evaluations per event (target ≤ 8), ≥ 1000× fewer than a 1-day scan, all
 *   events of one pair in < 100 ms. The scan's evaluation count over the full span is exact
 *   (two per step); its time is measured over the first 1,000 years and scaled by the span,
 *   since a fixed-step scan costs the same per step everywhere; its events are compared with
 *   the search's over that millennium.
 * - geocentric Venus–Mars over 200 years (1900–2100) against a 1-day scan (≥ 10× fewer
 *   evaluations) and a 0.25-day scan (no event it finds may be missed).
 *
 * One evaluation is one body at one instant, for the search and the scans alike.
 */
import { findConjunctions, wrapPi } from '../compute/conjunctions.js';
import { astronomyEngine, type PositionBody, type Viewpoint } from '../compute/ephemeris.js';
import { Budget, DEFAULT_LIMITS } from '../compute/limits.js';
import { instantFromUt, type Instant } from '../compute/time.js';
import { timeMs, type BenchRow } from './types.js';

const YEAR = 365.25;

function year(y: number): Instant {
  return instantFromUt((y - 2000) * YEAR);
}

function bigBudget(): Budget {
  return new Budget({ ...DEFAULT_LIMITS, maxEvaluations: 1e9, maxSpanDays: 1e9 });
}

/** Fixed-step scan for sign changes of λa − λb (not the ±180° wrap); returns the bracket midpoints. */
function scan(a: PositionBody, b: PositionBody, seenFrom: Viewpoint, startTt: number, endTt: number, stepDays: number, budget: Budget): number[] {
  const found: number[] = [];
  let prev = NaN;
  for (let t = startTt; t <= endTt; t += stepDays) {
    const [sa, sb] = astronomyEngine.states([a, b], seenFrom, t, false, budget);
    const f = wrapPi(sa!.lonRad - sb!.lonRad);
    if (!Number.isNaN(prev) && Math.abs(f - prev) < Math.PI && (f === 0 || Math.sign(f) !== Math.sign(prev))) found.push(t - 0.5 * stepDays);
    prev = f;
  }
  return found;
}

/** How many of `reference` have no event of `times` within `windowDays`. */
function missing(reference: readonly number[], times: readonly number[], windowDays: number): number {
  return reference.filter((s) => !times.some((t) => Math.abs(t - s) <= windowDays)).length;
}

async function heliocentric(a: PositionBody, b: PositionBody): Promise<BenchRow[]> {
  const start = year(-3000);
  const end = year(7000);
  let result = findConjunctions({ a, b, seenFrom: 'sun', start, end, budget: bigBudget() });
  const ms = await timeMs(() => { result = findConjunctions({ a, b, seenFrom: 'sun', start, end, budget: bigBudget() }); }, 5);
  const n = result.events.length;
  const perEvent = result.evaluations / n;
  const scanEvaluations = 2 * Math.floor((end.tt - start.tt) / 1) + 2;
  // Time the 1-day scan over the first millennium and compare its events there.
  const millenniumEnd = year(-2000);
  const scanBudget = bigBudget();
  const t0 = performance.now();
  const scanned = scan(a, b, 'sun', start.tt, millenniumEnd.tt, 1, scanBudget);
  const scanMsMillennium = performance.now() - t0;
  const scanMs = scanMsMillennium * ((end.tt - start.tt) / (millenniumEnd.tt - start.tt));
  const searchTimes = result.events.map((e) => e.instant.tt).filter((t) => t <= millenniumEnd.tt - 1);
  const missed = missing(scanned, searchTimes, 1) + missing(searchTimes, scanned, 1);
  const pair = `${a}–${b}`;
  return [
    { name: `heliocentric ${pair}, 10,000 yr: events`, value: n, unit: 'events' },
    { name: `heliocentric ${pair}: evaluations per event`, value: perEvent, unit: 'evals', target: '≤ 8 per event', pass: perEvent <= 8 },
    { name: `heliocentric ${pair}: evaluations, search vs 1-day scan`, value: result.evaluations, unit: 'evals', baseline: scanEvaluations, ratio: scanEvaluations / result.evaluations, target: '≥ 1000× fewer', pass: scanEvaluations / result.evaluations >= 1000 },
    { name: `heliocentric ${pair}: all events, wall time`, value: ms, unit: 'ms', baseline: scanMs, ratio: scanMs / ms, target: '< 100 ms', pass: ms < 100 },
    { name: `heliocentric ${pair}: time per event`, value: (ms * 1000) / n, unit: 'µs' },
    { name: `heliocentric ${pair}: events differing from the 1-day scan, first 1000 yr`, value: missed, unit: 'events', target: '0', pass: missed === 0 },
  ];
}

async function geocentric(): Promise<BenchRow[]> {
  const start = year(1900);
  const end = year(2100);
  let result = findConjunctions({ a: 'venus', b: 'mars', seenFrom: 'earth', start, end, budget: bigBudget() });
  const ms = await timeMs(() => { result = findConjunctions({ a: 'venus', b: 'mars', seenFrom: 'earth', start, end, budget: bigBudget() }); }, 3);
  const times = result.events.map((e) => e.instant.tt);
  const dayBudget = bigBudget();
  const t0 = performance.now();
  const dayScan = scan('venus', 'mars', 'earth', start.tt, end.tt, 1, dayBudget);
  const dayMs = performance.now() - t0;
  const quarterBudget = bigBudget();
  const quarterScan = scan('venus', 'mars', 'earth', start.tt, end.tt, 0.25, quarterBudget);
  const missedQuarter = missing(quarterScan, times, 0.25);
  const ratio = dayBudget.evaluations / result.evaluations;
  return [
    { name: 'geocentric venus–mars, 200 yr: events (search / 1-day scan / 0.25-day scan)', value: times.length, unit: `events (${dayScan.length} / ${quarterScan.length})` },
    { name: 'geocentric venus–mars: evaluations, search vs 1-day scan', value: result.evaluations, unit: 'evals', baseline: dayBudget.evaluations, ratio, target: '≥ 10× fewer', pass: ratio >= 10 },
    { name: 'geocentric venus–mars: evaluations per event (incl. least separation, elongation)', value: result.evaluations / times.length, unit: 'evals' },
    { name: 'geocentric venus–mars: wall time, search vs 1-day scan', value: ms, unit: 'ms', baseline: dayMs, ratio: dayMs / ms },
    { name: 'geocentric venus–mars: 0.25-day scan events the search missed', value: missedQuarter, unit: 'events', target: '0', pass: missedQuarter === 0 },
  ];
}

/** All rows of this benchmark. */
export async function run(): Promise<BenchRow[]> {
  return [
    ...(await heliocentric('jupiter', 'saturn')),
    ...(await heliocentric('uranus', 'neptune')),
    ...(await geocentric()),
  ];
}
