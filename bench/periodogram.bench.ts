/**
 * Periodogram cost: the recurrence-driven grid against direct sin/cos per (sample, frequency),
 * both measured in this run on the same invented series, and how the cost grows with N.
 */
import { powerAt, powerOnGrid, prepare, type FrequencyGrid, type Prepared } from '../compute/periodogram.js';
import { createRng } from '../compute/random.js';
import { timeMs, type BenchRow } from './types.js';

/** Invented series: n uneven samples over n·1.3 days, a 47-day sinusoid in unit noise. */
function invented(n: number): Prepared {
  const rng = createRng(n);
  const t = Array.from({ length: n }, () => rng.uniformIn(0, 1.3 * n)).sort((a, b) => a - b);
  return prepare({ tDays: t, values: t.map((x) => Math.sin(2 * Math.PI * x / 47) + rng.normal()) });
}

/** The same powers computed with Math.sin/Math.cos for every sample and frequency. */
function direct(prep: Prepared, grid: FrequencyGrid): Float64Array {
  const out = new Float64Array(grid.count);
  for (let k = 0; k < grid.count; k++) out[k] = powerAt(prep, grid.f0PerDay + k * grid.dfPerDay);
  return out;
}

export async function run(): Promise<BenchRow[]> {
  const rows: BenchRow[] = [];
  const m = 10_000;
  const grid: FrequencyGrid = { f0PerDay: 1e-4, dfPerDay: 0.5 / m, count: m };

  const p4 = invented(10_000);
  const fast = await timeMs(() => powerOnGrid(p4, grid), 3);
  const slow = await timeMs(() => direct(p4, grid), 1);
  rows.push({
    name: 'periodogram 10⁴ samples × 10⁴ frequencies', value: fast, unit: 'ms',
    baseline: slow, ratio: slow / fast, target: '< 1000 ms', pass: fast < 1000,
  });
  // Agreement of the two in the same run (largest power difference).
  const a = powerOnGrid(p4, grid);
  const b = direct(p4, { ...grid, count: 2000 });
  let worst = 0;
  for (let k = 0; k < b.length; k++) worst = Math.max(worst, Math.abs(a[k]! - b[k]!));
  rows.push({ name: 'largest power difference, recurrence vs direct (first 2000 frequencies)', value: worst, unit: '' });

  // Growth with N at a fixed 10⁴ frequencies: the method is O(N·M), so ×10 samples should cost ≈ ×10.
  const times: Array<[number, number]> = [];
  for (const n of [1_000, 10_000, 100_000]) {
    const p = n === 10_000 ? p4 : invented(n);
    times.push([n, n === 10_000 ? fast : await timeMs(() => powerOnGrid(p, grid), n === 100_000 ? 1 : 3)]);
  }
  for (const [n, ms] of times) rows.push({ name: `periodogram N = ${n} × 10⁴ frequencies`, value: ms, unit: 'ms' });
  const [t3, t4, t5] = times.map((x) => x[1]);
  rows.push({ name: 'cost ratio N = 10⁴ / N = 10³ (value / baseline)', value: t4!, unit: 'ms', baseline: t3!, ratio: t4! / t3!, target: '≈ 10 (linear in N)' });
  rows.push({ name: 'cost ratio N = 10⁵ / N = 10⁴ (value / baseline)', value: t5!, unit: 'ms', baseline: t4!, ratio: t5! / t4!, target: '≈ 10 (linear in N)' });
  return rows;
}
