/**
 * `npm run bench`: every benchmark, printed as a table of figures, baselines measured in
 * the same run, ratios and targets. Pass a name fragment to run only matching suites.
 * The script bundles this file with esbuild first, so the figures are those of the code
 * as shipped (not of a TypeScript loader).
 */
import * as alignment from './alignment.bench.js';
import * as conjunctions from './conjunctions.bench.js';
import * as incremental from './incremental.bench.js';
import * as periodogram from './periodogram.bench.js';
import * as relation from './relation.bench.js';
import type { BenchRow } from './types.js';

const SUITES: ReadonlyArray<readonly [string, () => Promise<BenchRow[]>]> = [
  ['alignment', alignment.run], ['conjunctions', conjunctions.run], ['incremental', incremental.run],
  ['periodogram', periodogram.run], ['relation', relation.run],
];

async function main(): Promise<void> {
  const filter = process.argv[2];
  let misses = 0;
  for (const [name, run] of SUITES) {
    if (filter && !name.includes(filter)) continue;
    process.stdout.write(`\n== ${name}\n`);
    const rows = await run();
    for (const r of rows) {
      const base = r.baseline !== undefined ? `  baseline ${fmt(r.baseline)} ${r.unit}` : '';
      const ratio = r.ratio !== undefined ? `  ratio ${fmt(r.ratio)}×` : '';
      const target = r.target ? `  target ${r.target}${r.pass === undefined ? '' : r.pass ? ' ✓' : ' ✗'}` : '';
      if (r.pass === false) misses += 1;
      process.stdout.write(`${r.name.padEnd(64)} ${fmt(r.value).padStart(12)} ${r.unit}${base}${ratio}${target}\n`);
    }
  }
  process.stdout.write(`\n${misses === 0 ? 'all targets met' : `${misses} target(s) missed`}\n`);
}

function fmt(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  const a = Math.abs(x);
  if (a >= 1000) return x.toFixed(0);
  if (a >= 10) return x.toFixed(1);
  if (a >= 0.01) return x.toFixed(3);
  return x.toExponential(2);
}

main().catch((err: unknown) => { console.error(err); process.exitCode = 1; });
