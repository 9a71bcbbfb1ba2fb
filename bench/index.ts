/**
 * `npm run bench`: every benchmark, printed as a table of figures, baselines measured in
 * the same run, ratios and targets. Pass a name fragment to run only matching suites.
 */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import type { BenchRow } from './types.js';

async function main(): Promise<void> {
  const filter = process.argv[2];
  const files = readdirSync(__dirname).filter((f) => f.endsWith('.bench.ts') && (!filter || f.includes(filter))).sort();
  let misses = 0;
  for (const f of files) {
    const mod = (await import(join(__dirname, f))) as { run?: () => Promise<BenchRow[]> };
    if (typeof mod.run !== 'function') continue;
    process.stdout.write(`\n== ${f.replace('.bench.ts', '')}\n`);
    const rows = await mod.run();
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
