/** One measured figure of a benchmark. Targets are stated, not asserted: benchmarks never fail the tests. */
export interface BenchRow {
  readonly name: string;
  readonly value: number;
  readonly unit: string;
  /** The same quantity for the baseline measured in the same run. */
  readonly baseline?: number;
  /** baseline / value (how many times better), or value / baseline where stated in `name`. */
  readonly ratio?: number;
  /** The target in words, e.g. `≤ 8 per event`. */
  readonly target?: string;
  readonly pass?: boolean;
}

/** Median wall time of `fn` over `runs` runs after one warm-up, in milliseconds. */
export async function timeMs(fn: () => unknown | Promise<unknown>, runs = 5): Promise<number> {
  await fn();
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    await fn();
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)]!;
}
