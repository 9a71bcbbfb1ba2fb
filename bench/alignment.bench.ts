/**
 * Alignment search of four planets over 2,000 years against a plain 1-day scan, both on the same
 * ephemeris in the same run: ephemeris evaluations, time, and whether the search misses any window
 * the scan sees (a window counts as found when a found window contains the scan's tightest sample).
 * A geocentric case (retrograde loops, Venus) runs over 200 years to keep the scan's time modest:
 * each scan is timed once, the search as the median of three runs.
 */
import { findAlignments, scanAlignments, type AlignmentWindow } from '../compute/alignment.js';
import type { PositionBody, Viewpoint } from '../compute/ephemeris.js';
import { Budget } from '../compute/limits.js';
import { ephemerisAlignmentBodies } from '../compute/statements/alignment.js';
import { instantFromCalendar } from '../compute/time.js';
import { timeMs, type BenchRow } from './types.js';

const DEG = Math.PI / 180;

interface Case {
  readonly label: string; readonly bodies: readonly PositionBody[]; readonly seenFrom: Viewpoint; readonly angleDeg: number;
  readonly fromYear: number; readonly toYear: number;
}

const CASES: readonly Case[] = [
  { label: 'jupiter saturn uranus neptune, heliocentric, 30°', bodies: ['jupiter', 'saturn', 'uranus', 'neptune'], seenFrom: 'sun', angleDeg: 30, fromYear: 1000, toYear: 3000 },
  { label: 'venus mars jupiter saturn, geocentric, 15°', bodies: ['venus', 'mars', 'jupiter', 'saturn'], seenFrom: 'earth', angleDeg: 15, fromYear: 1900, toYear: 2100 },
];

const jan1 = (year: number): number => instantFromCalendar({ year, month: 1, day: 1, hour: 0, minute: 0, second: 0 }, 'mixed').tt;

/** Scan windows that no found window covers (by the scan's tightest sample). */
function missed(scan: readonly AlignmentWindow[], found: readonly AlignmentWindow[]): number {
  return scan.filter((w) => !found.some((f) => f.startTt <= w.tightestTt && f.endTt >= w.tightestTt)).length;
}

export async function run(): Promise<BenchRow[]> {
  const rows: BenchRow[] = [];
  for (const c of CASES) {
    const opts = { angleRad: c.angleDeg * DEG, fromTt: jan1(c.fromYear), toTt: jan1(c.toYear) };
    const members = c.bodies.map((body) => ({ body, opposite: false }));
    const searchBudget = new Budget();
    const search = findAlignments(ephemerisAlignmentBodies(members, c.seenFrom, searchBudget), opts);
    const scanBudget = new Budget();
    const t0 = performance.now();
    const scan = scanAlignments(ephemerisAlignmentBodies(members, c.seenFrom, scanBudget), opts, 1);
    const scanMs = performance.now() - t0;
    const searchMs = await timeMs(() => findAlignments(ephemerisAlignmentBodies(members, c.seenFrom, new Budget()), opts), 3);
    const lost = missed(scan.windows, search.windows);
    rows.push(
      { name: `${c.label}: ephemeris evaluations, ${c.fromYear}–${c.toYear}`, value: searchBudget.evaluations, unit: 'evals', baseline: scanBudget.evaluations, ratio: scanBudget.evaluations / searchBudget.evaluations, target: 'fewer than a 1-day scan', pass: searchBudget.evaluations < scanBudget.evaluations },
      { name: `${c.label}: time`, value: searchMs, unit: 'ms', baseline: scanMs, ratio: scanMs / searchMs },
      { name: `${c.label}: windows found (1-day scan: ${scan.windows.length})`, value: search.windows.length, unit: 'windows' },
      { name: `${c.label}: scan windows missed by the search`, value: lost, unit: 'windows', target: '0', pass: lost === 0 },
    );
  }
  return rows;
}
