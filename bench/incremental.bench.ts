/** Re-evaluation of a 40-block note after a one-line edit, against a full evaluation. */
import { createNoteEvaluator } from '../compute/note.js';
import { timeMs, type BenchRow } from './types.js';

/** A 40-block note of statements that do real work without ephemeris searches dominating. */
export function fortyBlockNote(edit = 0): string {
  const parts: string[] = ['# bench note', ''];
  for (let i = 0; i < 40; i++) {
    const p = (5 + i * 0.37 + (i === 0 ? edit * 1e-4 : 0)).toFixed(5);
    parts.push('```orbit', `body p${i} period ${p} d ± 0.0004 d`, `let f${i} = frequency(p${i})`,
      i > 0 ? `ratio p${i} p${i - 1} up-to 8` : 'date 2031-03-14', `date ${2000 + i}-06-01`, '```', '');
  }
  return parts.join('\n');
}

export async function run(): Promise<BenchRow[]> {
  const full = await timeMs(async () => {
    await createNoteEvaluator().evaluate(fortyBlockNote());
  });
  const ev = createNoteEvaluator();
  await ev.evaluate(fortyBlockNote());
  let k = 0;
  // Edit a line in the last block: only that block's statements (and nothing else) recompute.
  const edited = (n: number): string => fortyBlockNote().replace('date 2039-06-01', `date 2039-06-${String(1 + (n % 27)).padStart(2, '0')}`);
  const incr = await timeMs(async () => { k += 1; await ev.evaluate(edited(k)); }, 9);
  const counts = await ev.evaluate(edited(k + 1));
  return [
    { name: 'full evaluation of a 40-block note', value: full, unit: 'ms' },
    { name: 're-evaluation after a one-line edit', value: incr, unit: 'ms', baseline: full, ratio: full / incr, target: '< 30 ms', pass: incr < 30 },
    { name: 'statements recomputed after the edit (of all)', value: counts.evaluated, unit: `of ${counts.evaluated + counts.reused}` },
  ];
}
