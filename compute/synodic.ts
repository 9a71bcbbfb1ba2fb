/**
 * Synodic (beat) periods and the statistics of actual intervals between conjunctions.
 */
import { abs, add, reciprocal, type Quantity } from './quantity.js';

/**
 * Synodic period of two periods: 1/S = |1/Pa − 1/Pb| (the beat relation; e.g. Meeus, Astronomical Algorithms, 2nd ed., ch. 36).
 *
 * The uncertainty is first order, propagated through each input's contribution, so two
 * operands that share an input (say `p` and `2 * p`) are treated as fully correlated.
 *
 * @param pa period of A, time dimension (days), or a frequency (cycles/day)
 * @param pb period of B, same rules
 * @returns S in days, with propagated uncertainty
 * @throws RangeError when the periods are equal (S is infinite) or one of them is zero
 * @throws DimensionError when an operand is neither a time nor a frequency
 */
export function synodicPeriod(pa: Quantity, pb: Quantity): Quantity {
  const fa = pa.dim === 'frequency' ? pa : reciprocal(pa);
  const fb = pb.dim === 'frequency' ? pb : reciprocal(pb);
  const beat = abs(add(fa, fb, -1));
  if (beat.value === 0) throw new RangeError('the two periods are equal: their synodic period is infinite');
  return reciprocal(beat);
}

/** Summary of the intervals between successive events. All values in days. */
export interface IntervalStats {
  /** Number of events the intervals come from. */
  readonly events: number;
  /** Number of intervals (events − 1). */
  readonly intervals: number;
  readonly meanDays: number;
  /** Sample standard deviation (n − 1 in the denominator); 0 for one interval. */
  readonly spreadDays: number;
  readonly minDays: number;
  readonly maxDays: number;
}

/**
 * Mean, sample standard deviation, minimum and maximum of the intervals between successive
 * event times.
 * @param timesDays event times in days on any one scale (e.g. JD TT), ascending
 * @returns undefined when fewer than two events are given
 * @throws RangeError when the times are not finite or not ascending
 */
export function intervalStats(timesDays: readonly number[]): IntervalStats | undefined {
  if (timesDays.length < 2) return undefined;
  let sum = 0;
  let min = Infinity;
  let max = -Infinity;
  const gaps: number[] = [];
  for (let i = 1; i < timesDays.length; i++) {
    const g = timesDays[i]! - timesDays[i - 1]!;
    if (!Number.isFinite(g) || g <= 0) throw new RangeError(`event times must be finite and ascending (at index ${i})`);
    gaps.push(g);
    sum += g;
    if (g < min) min = g;
    if (g > max) max = g;
  }
  const mean = sum / gaps.length;
  let ss = 0;
  for (const g of gaps) ss += (g - mean) * (g - mean);
  const spread = gaps.length > 1 ? Math.sqrt(ss / (gaps.length - 1)) : 0;
  return { events: timesDays.length, intervals: gaps.length, meanDays: mean, spreadDays: spread, minDays: min, maxDays: max };
}
